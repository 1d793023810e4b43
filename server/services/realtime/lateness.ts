// Observed lateness against the schedule where it matters for conditional priority: when the bus
// crosses each corridor intersection's stop line, against the scheduled time there (interpolated
// between the scheduled stops around it). The late share is the model's `lateShare` input: the
// share of buses later than the threshold it is paired with (`lateThresholdS`).
import type { Db } from '../../db'
import { DAY_TYPE_LABELS, type DayType } from '../../../shared/signals/time-of-day'
import { observeCorridor } from './observations'
import { quantile, sortNumbers } from './statistics'
import type { LatenessDto } from '../../../shared/schemas/realtime'

const BIN_S = 60
const HIST_MIN_S = -600
const HIST_MAX_S = 1800

interface Sample { approachId: string; periodId: string | null; dayType: DayType; latenessS: number }

function describe(values: number[], thresholdS: number) {
  if (values.length === 0) return { count: 0, medianS: null, p85S: null, lateShare: null }
  const sorted = sortNumbers(values)
  return {
    count: values.length,
    medianS: quantile(sorted, 0.5),
    p85S: quantile(sorted, 0.85),
    lateShare: values.filter((v) => v > thresholdS).length / values.length,
  }
}

/** One-minute bins; values beyond -10 min or +30 min fall into the end bins. */
export function histogram(values: number[]): LatenessDto['histogram'] {
  if (values.length === 0) return []
  const clamp = (v: number) => Math.min(HIST_MAX_S - 1, Math.max(HIST_MIN_S, v))
  const lo = Math.floor(clamp(Math.min(...values)) / BIN_S) * BIN_S
  const hi = Math.floor(clamp(Math.max(...values)) / BIN_S) * BIN_S
  const bins = Array.from({ length: (hi - lo) / BIN_S + 1 }, (_, i) => ({ fromS: lo + i * BIN_S, toS: lo + (i + 1) * BIN_S, count: 0 }))
  for (const v of values) bins[Math.floor((Math.floor(clamp(v) / BIN_S) * BIN_S - lo) / BIN_S)].count++
  return bins
}

export async function corridorLateness(db: Db, corridorId: string, from: string | undefined, to: string | undefined, lateThresholdS: number): Promise<LatenessDto> {
  const { corridor, derived } = await observeCorridor(db, corridorId, from, to)
  const samples: Sample[] = derived.trips.flatMap((t) => t.segments.flatMap((s) =>
    s.latenessS === null ? [] : [{ approachId: s.approachId, periodId: s.periodId, dayType: t.dayType, latenessS: s.latenessS }]))
  const all = samples.map((s) => s.latenessS)
  const groups: LatenessDto['groups'] = []
  for (const seg of derived.segments) {
    const values = samples.filter((s) => s.approachId === seg.approachId).map((s) => s.latenessS)
    if (values.length) groups.push({ key: `approach:${seg.approachId}`, label: seg.intersectionName, approachId: seg.approachId, periodId: null, dayType: null, ...describe(values, lateThresholdS) })
  }
  for (const dayType of Object.keys(DAY_TYPE_LABELS) as DayType[]) {
    for (const p of corridor.periods) {
      const values = samples.filter((s) => s.periodId === p.id && s.dayType === dayType).map((s) => s.latenessS)
      if (values.length) {
        groups.push({ key: `period:${p.id}:${dayType}`, label: `${p.name}, ${DAY_TYPE_LABELS[dayType].toLowerCase()}`, approachId: null, periodId: p.id, dayType, ...describe(values, lateThresholdS) })
      }
    }
  }
  return { corridorId, lateThresholdS, ...describe(all, lateThresholdS), histogram: histogram(all), groups }
}
