import { describe, expect, it } from 'vitest'
import { evaluateApproach, type EvaluateOptions } from '../../../shared/model'
import { approachBody, type ApproachBody, type ApproachResult } from '../../../shared/schemas/model'

// The exact cumulative-count solver and the Godunov scheme (CTM with this diagram) on the same
// triangular approach: queue, clearance, car delay, and the bus with and without priority.
const cases: [string, ApproachBody][] = [
  ['no bus stop', {}],
  ['near-side stop', { bus: { stop: { position: 'near-side', distanceM: 30, dwellS: 20 } } }],
  ['far-side stop, heavier arrivals', { bus: { stop: { position: 'far-side', distanceM: 40, dwellS: 15 } }, approach: { arrivalFlowVehPerHour: 750 } }],
]
const grids = [4, 2, 1]

const medianAbs = (a: number[], b: number[]) => {
  const d = a.map((x, i) => Math.abs(x - b[i])).sort((x, y) => x - y)
  return d[Math.floor(d.length / 2)]
}
const order = (errors: number[]) => Math.log2(errors[0] / errors[errors.length - 1]) / (errors.length - 1)

describe.each(cases)('exact and Godunov agree: %s', (_name, body) => {
  const input = approachBody.parse(body)
  const exact = evaluateApproach(input)
  const godunov: ApproachResult[] = grids.map((dxM) => evaluateApproach(input, { solver: 'godunov', dxM } satisfies EvaluateOptions))
  const fine = godunov[godunov.length - 1]

  it('uses the two solvers', () => {
    expect(exact.solver).toBe('exact-triangular')
    expect(fine.solver).toBe('godunov')
  })

  it('on the longest queue, converging as the cells shrink', () => {
    const errors = godunov.map((g) => Math.abs(g.traffic.maxQueueM - exact.traffic.maxQueueM))
    for (let i = 1; i < errors.length; i++) expect(errors[i]).toBeLessThan(errors[i - 1])
    expect(errors[errors.length - 1]).toBeLessThan(0.08 * exact.traffic.maxQueueM)
    expect(order(errors)).toBeGreaterThan(0.3)
  })

  it('on the queue clearance and the mean car delay', () => {
    expect(fine.traffic.queueClearS!).toBeCloseTo(exact.traffic.queueClearS!, 0)
    expect(Math.abs(fine.traffic.meanDelayS - exact.traffic.meanDelayS)).toBeLessThan(0.05)
  })

  it('on the bus delay by arrival phase, converging as the cells shrink', () => {
    const base = exact.delayByArrivalPhase.map((r) => r.baselineS)
    const errors = godunov.map((g) => medianAbs(g.delayByArrivalPhase.map((r) => r.baselineS), base))
    for (let i = 1; i < errors.length; i++) expect(errors[i]).toBeLessThanOrEqual(errors[i - 1] + 1e-9)
    expect(errors[errors.length - 1]).toBeLessThan(0.8)
    expect(Math.abs(fine.bus.baseline.meanDelayS - exact.bus.baseline.meanDelayS)).toBeLessThan(0.6)
    expect(Math.abs(fine.bus.baseline.stoppedShare - exact.bus.baseline.stoppedShare)).toBeLessThan(0.1)
  })

  it('on what priority saves the bus', () => {
    const prio = exact.delayByArrivalPhase.map((r) => r.priorityS)
    expect(medianAbs(fine.delayByArrivalPhase.map((r) => r.priorityS), prio)).toBeLessThan(0.8)
    expect(Math.abs(fine.bus.meanSavingS - exact.bus.meanSavingS)).toBeLessThan(0.6)
    const agree = fine.delayByArrivalPhase.filter((r, i) => r.action === exact.delayByArrivalPhase[i].action).length
    expect(agree / fine.delayByArrivalPhase.length).toBeGreaterThan(0.9)
  })
})
