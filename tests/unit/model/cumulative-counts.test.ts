import { describe, expect, it } from 'vitest'
import { exactApproach, fixedTimePlan, queueBackM, queueField, redQueue, periodDelay, triangularFromWaveSpeed } from '../../../shared/model'

const tri = triangularFromWaveSpeed({ freeFlowSpeedKmh: 60, backwardWaveSpeedKmh: 20, jamDensityVehPerKmPerLane: 120 })

describe('the back of the queue (exact, triangular)', () => {
  const ex = exactApproach(tri, 600 / 3600)
  const field = queueField(ex, fixedTimePlan(60, 30, 0, 2))

  it('runs back at the shock speed in red, stops where the discharge wave meets it, and is gone after', () => {
    expect(queueBackM(ex, field, 0, 20)).toBeCloseTo(ex.u * 20, 12)
    expect(queueBackM(ex, field, 0, 35)).toBeCloseTo(ex.u * 35, 12)
    // farthest at 41.25 s, 62.5 m, as redQueue says
    const q = redQueue(ex, field, 0)
    expect(queueBackM(ex, field, 0, q.maxQueueTimeS - 1e-9)).toBeCloseTo(q.maxQueueM, 6)
    expect(queueBackM(ex, field, 0, q.maxQueueTimeS + 0.5)).toBe(0)
    expect(queueBackM(ex, field, 0, -1)).toBe(0)
  })
})

describe('oversaturated cycles', () => {
  // 1000 veh/h against 1800 veh/h x 30/60 = 900 veh/h: each cycle leaves 1000/60 - 15 = 1.67 veh more
  const ex = exactApproach(tri, 1000 / 3600)
  const field = queueField(ex, fixedTimePlan(60, 30, 0, 6))

  it('carries the residual into each red and pushes the queue farther back every cycle', () => {
    const perCycle = (1000 / 3600) * 60 - 0.5 * 30
    for (let i = 0; i < 6; i++) expect(field.queueAtRedStart[i]).toBeCloseTo(i * perCycle, 9)
    const lengths = [0, 1, 2, 3, 4].map((i) => redQueue(ex, field, i))
    for (let i = 1; i < lengths.length; i++) expect(lengths[i].maxQueueM).toBeGreaterThan(lengths[i - 1].maxQueueM)
    for (const l of lengths) expect(l.clearAfterGreenS).toBeNull()
    expect(lengths[2].residualVeh).toBeCloseTo(3 * perCycle, 9)
    // with a residual Q at the red start the polygon's t* lies Q / q_a before it
    expect(field.tStar[3]).toBeCloseTo(180 - (3 * perCycle) / ex.qa, 9)
    expect(lengths[3].maxQueueM).toBeCloseTo((30 + (3 * perCycle) / ex.qa) / (1 / ex.u - 1 / ex.w), 9)
  })

  it('counts the delay of the period\'s vehicles until they have all left', () => {
    const pd = periodDelay(ex.qa, ex.s, 60, 30, 900)
    expect(pd.cycles).toBe(15)
    expect(pd.residualVeh).toBeCloseTo(15 * ((1000 / 3600) * 60 - 15), 9)
    // at least the uniform delay of a saturated signal, 0.5 C (1 - g/C) = 15 s, plus the growing queue
    expect(pd.meanDelayS).toBeGreaterThan(15)
  })
})
