// Observed run times before and after a change (priority going live): median and 85th
// percentile of the corridor run and of each intersection's segment, the change of each with a
// percentile-bootstrap 95% interval, and the trips behind every figure. The bootstrap is seeded,
// so the same data always give the same interval.
import type { Db } from '../../db'
import { observeCorridor } from './observations'
import { bootstrapChange, quantile, sortNumbers } from './statistics'
import type { BeforeAfterDto, BeforeAfterQuery, BeforeAfterRowDto, ObservedTripDto } from '../../../shared/schemas/realtime'

export const BOOTSTRAP_RESAMPLES = 2000
export const BOOTSTRAP_SEED = 20_260_101
const LEVEL = 0.95

function stats(values: number[]) {
  if (values.length === 0) return { trips: 0, medianS: null, p85S: null }
  const sorted = sortNumbers(values)
  return { trips: values.length, medianS: quantile(sorted, 0.5), p85S: quantile(sorted, 0.85) }
}

export function compareRow(key: string, label: string, approachId: string | null, before: number[], after: number[], seed: number): BeforeAfterRowDto {
  const opts = { resamples: BOOTSTRAP_RESAMPLES, seed, level: LEVEL }
  return {
    key, label, approachId,
    before: stats(before),
    after: stats(after),
    medianChange: bootstrapChange(before, after, 0.5, opts),
    p85Change: bootstrapChange(before, after, 0.85, { ...opts, seed: seed + 1 }),
  }
}

export async function corridorBeforeAfter(db: Db, q: BeforeAfterQuery): Promise<BeforeAfterDto> {
  const keep = (t: ObservedTripDto) => (!q.dayType || t.dayType === q.dayType)
  const [before, after] = await Promise.all([
    observeCorridor(db, q.corridorId, q.beforeFrom, q.beforeTo),
    observeCorridor(db, q.corridorId, q.afterFrom, q.afterTo),
  ])
  const b = before.derived.trips.filter(keep)
  const a = after.derived.trips.filter(keep)
  const inPeriod = (periodId: string | null) => !q.periodId || periodId === q.periodId
  const runs = (trips: ObservedTripDto[]) => trips.filter((t) => inPeriod(t.periodId) && t.runTimeS !== null).map((t) => t.runTimeS!)
  const segs = (trips: ObservedTripDto[], approachId: string) =>
    trips.flatMap((t) => t.segments.filter((s) => s.approachId === approachId && inPeriod(s.periodId)).map((s) => s.travelS))
  return {
    corridorId: q.corridorId,
    before: { from: q.beforeFrom, to: q.beforeTo },
    after: { from: q.afterFrom, to: q.afterTo },
    dayType: q.dayType ?? null,
    periodId: q.periodId ?? null,
    periods: before.corridor.periods,
    confidenceLevel: LEVEL,
    resamples: BOOTSTRAP_RESAMPLES,
    seed: BOOTSTRAP_SEED,
    corridor: compareRow('corridor', 'Corridor run', null, runs(b), runs(a), BOOTSTRAP_SEED),
    segments: before.derived.segments.map((s, i) =>
      compareRow(`segment:${s.approachId}`, s.intersectionName, s.approachId, segs(b, s.approachId), segs(a, s.approachId), BOOTSTRAP_SEED + 10 * (i + 1))),
  }
}
