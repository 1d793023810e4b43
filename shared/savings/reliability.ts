// Reliability: the distribution of the run time through the whole corridor in each period, with
// and without priority, and the 85th and 95th percentiles schedules are padded to. A trip's run
// time is the part the signals do not touch (the scheduled run time less the mean signal delay
// without priority) plus the sum of its delays at the signals, each drawn from that signal's
// delay over uniform arrival phases (distribution.ts); all signals take the period of entry.
import { DAY_TYPES } from '../signals/time-of-day'
import type { ReliabilityDto, RunTimeStats } from '../schemas/savings'
import type { CorridorModel } from './corridor-model'
import { convolveAll, mean, percentile, phaseDistributions, shift, type Distribution } from './distribution'

export interface ReliabilityOptions {
  /** Grid of the delay distributions (default 2 s: schedules are written in minutes, and the work falls with the square of the bins per signal). */
  binS?: number
}

/** Median of values with weights: the smallest value whose cumulative weight reaches half. */
export function weightedMedian(values: readonly number[], weights: readonly number[]): number {
  const order = values.map((_, i) => i).sort((a, b) => values[a] - values[b])
  const total = weights.reduce((s, w) => s + w, 0)
  let cum = 0
  for (const i of order) {
    cum += weights[i]
    if (cum >= total / 2 - 1e-12) return values[i]
  }
  return values[order[order.length - 1]] ?? 0
}

function stats(fixedS: number, delay: Distribution): RunTimeStats {
  const d = shift(delay, fixedS)
  return { meanS: mean(d), p85S: percentile(d, 0.85), p95S: percentile(d, 0.95) }
}

export function reliabilityFigures(m: CorridorModel, options: ReliabilityOptions = {}): ReliabilityDto[] {
  const binS = options.binS ?? 2
  const A = m.digest.approachIds.length
  const out: ReliabilityDto[] = []
  const signalDistributions = (a: number, p: number, d: number) => {
    const f = m.figure(a, p, d)
    return f && f.phases.length ? phaseDistributions(f.phases, f.priorityWeight, binS) : null
  }
  DAY_TYPES.forEach((dayType, d) => {
    m.digest.periods.forEach((period, p) => {
      const values: number[] = []
      const weights: number[] = []
      for (const run of m.runs) {
        const w = m.share[run.service * 3 + d]
        if (!w || !run.full || run.entryPeriod !== p) continue
        values.push(run.exitS - run.entryS)
        weights.push(w)
      }
      if (!values.length) return
      const without: Distribution[] = []
      const accepted: Distribution[] = []
      const proposed: Distribution[] = []
      let missing = 0
      for (let a = 0; a < A; a++) {
        const dist = signalDistributions(a, p, d)
        if (!dist) { missing++; continue }
        without.push(dist.without)
        proposed.push(dist.with)
        accepted.push(m.rowAt[a]?.status === 'accepted' ? dist.with : dist.without)
      }
      const base = convolveAll(without, binS)
      const prop = convolveAll(proposed, binS)
      const allAgreed = accepted.every((x, i) => x === proposed[i])
      const noneAgreed = accepted.every((x, i) => x === without[i])
      const acc = allAgreed ? prop : noneAgreed ? base : convolveAll(accepted, binS)
      const scheduledS = weightedMedian(values, weights)
      const fixedS = scheduledS - mean(base)
      out.push({
        periodId: period.id, periodName: period.name, dayType,
        trips: weights.reduce((s, w) => s + w, 0), scheduledS,
        without: stats(fixedS, base),
        accepted: stats(fixedS, acc),
        proposed: stats(fixedS, prop),
        intersectionsMissing: missing,
      })
    })
  })
  return out
}
