import { describe, expect, it } from 'vitest'
import { convolve, convolveAll, fromWeighted, mean, percentile, phaseDistributions, pointMass, shift } from '../../../shared/savings/distribution'
import { evaluateApproach } from '../../../shared/model'
import { approachBody } from '../../../shared/schemas/model'

const asMap = (d: ReturnType<typeof fromWeighted>) => {
  const out: Record<number, number> = {}
  d.p.forEach((p, k) => { if (p > 0) out[(d.offset + k) * d.binS] = Number(p.toFixed(12)) })
  return out
}

// A small corridor worked by hand. Signal A delays a bus 0 s or 20 s, each half the time; B
// 0 s (0.6), 10 s (0.3) or 30 s (0.1). The sum, every pair of outcomes:
//   0: .5 x .6 = .30    10: .5 x .3 = .15    20: .5 x .6 = .30
//   30: .5 x .1 + .5 x .3 = .20    50: .5 x .1 = .05
// cumulative .30, .45, .75, .95, 1: the 85th percentile is 30 s (.75 < .85 <= .95), the 95th
// 30 s (it reaches .95 exactly), the mean 10 + 6 = 16 s.
// With priority A delays 0 s nine times in ten and 20 s once:
//   0: .9 x .6 = .54    10: .9 x .3 = .27    20: .1 x .6 = .06
//   30: .9 x .1 + .1 x .3 = .12    50: .1 x .1 = .01
// cumulative .54, .81, .87, .99, 1: the 85th percentile drops to 20 s, the 95th stays at 30 s;
// the mean is 2 + 6 = 8 s.
const A = fromWeighted([0, 20], [0.5, 0.5])
const B = fromWeighted([0, 10, 30], [0.6, 0.3, 0.1])
const Aprio = fromWeighted([0, 20], [0.9, 0.1])

describe('corridor run time from per-signal delay distributions', () => {
  it('convolves independent delays as worked by hand', () => {
    const sum = convolve(A, B)
    expect(asMap(sum)).toEqual({ 0: 0.3, 10: 0.15, 20: 0.3, 30: 0.2, 50: 0.05 })
    expect(mean(sum)).toBeCloseTo(16, 12)
    expect(percentile(sum, 0.85)).toBe(30)
    expect(percentile(sum, 0.95)).toBe(30)
    expect(percentile(sum, 0.5)).toBe(20)
  })

  it('lowers the 85th percentile by 10 s with priority at A and leaves the 95th', () => {
    const sum = convolve(Aprio, B)
    expect(asMap(sum)).toEqual({ 0: 0.54, 10: 0.27, 20: 0.06, 30: 0.12, 50: 0.01 })
    expect(mean(sum)).toBeCloseTo(8, 12)
    expect(percentile(sum, 0.85)).toBe(20)
    expect(percentile(sum, 0.95)).toBe(30)
    // On a 300 s run through the rest of the corridor.
    expect(percentile(shift(sum, 300), 0.85) - percentile(shift(convolve(A, B), 300), 0.85)).toBe(-10)
  })

  it('does not depend on the order of the signals, and the empty sum is no delay', () => {
    expect(asMap(convolveAll([B, A]))).toEqual(asMap(convolveAll([A, B])))
    expect(asMap(convolveAll([]))).toEqual({ 0: 1 })
    expect(asMap(convolve(pointMass(12), B))).toEqual({ 12: 0.6, 22: 0.3, 42: 0.1 })
  })

  it('builds the with-priority mixture from a delay-by-phase table', () => {
    // 10 phases: five green arrivals (no delay either way), five red ones of 20 s, four of which
    // priority clears; every bus asks and none is locked out.
    const phases = [
      ...Array.from({ length: 5 }, () => ({ baselineS: 0, priorityS: 0 })),
      ...Array.from({ length: 4 }, () => ({ baselineS: 20, priorityS: 0 })),
      { baselineS: 20, priorityS: 20 },
    ]
    const d = phaseDistributions(phases, 1)
    expect(asMap(d.without)).toEqual(asMap(A))
    expect(asMap(d.with)).toEqual(asMap(Aprio))
    // Half the buses get priority: the other half keep the baseline delay.
    expect(asMap(phaseDistributions(phases, 0.5).with)).toEqual({ 0: 0.7, 20: 0.3 })
  })

  it('gives back the model’s own mean and 90th percentile of bus delay for an approach', () => {
    // Cross-check with shared/model: the model mixes the priority and baseline runs with the
    // share of buses that ask and are not locked out; binning to 1 s moves a value by 0.5 s at most.
    const input = approachBody.parse({ priority: { strategy: 'both', lockoutCycles: 1 }, bus: { busesPerHour: 12 } })
    const r = evaluateApproach(input)
    const w = (input.priority.lateOnly ? input.priority.lateShare : 1) * (1 - r.bus.priority.lockedOutShare)
    const d = phaseDistributions(r.delayByArrivalPhase, w)
    expect(Math.abs(mean(d.without) - r.bus.baseline.meanDelayS)).toBeLessThan(0.5)
    expect(Math.abs(mean(d.with) - r.bus.priority.meanDelayS)).toBeLessThan(0.5)
    expect(Math.abs(percentile(d.without, 0.9) - r.bus.baseline.p90DelayS)).toBeLessThanOrEqual(0.5)
    expect(Math.abs(percentile(d.with, 0.9) - r.bus.priority.p90DelayS)).toBeLessThanOrEqual(0.5)
    expect(r.bus.meanSavingS).toBeGreaterThan(1)
  })
})
