import { describe, expect, it } from 'vitest'
import {
  type BusModel, type BusSetup, type SignalPlan, askingShare, decidePriority, exactApproach, fixedTimePlan, freeTimeToLineS,
  kmhToMps, prepareApproach, queueField, runBusExact, stopPenaltyS, triangularFromWaveSpeed,
} from '../../../shared/model'
import { approachBody } from '../../../shared/schemas/model'

const tri = triangularFromWaveSpeed({ freeFlowSpeedKmh: 60, backwardWaveSpeedKmh: 20, jamDensityVehPerKmPerLane: 120 })
const v = kmhToMps(50)
const bus = (over: Partial<BusSetup> = {}): BusSetup => ({
  speed: v, lengthM: 400, downstreamLengthM: 150, nearSide: null, farSide: null, checkInDistanceM: 150,
  accelMps2: 1.2, decelMps2: 1.2, stopPenaltyS: stopPenaltyS(v, 1.2, 1.2), ...over,
})

/** A bus reaching the line running free at `arrival` (s; red [0, 30) of each 60 s cycle). */
function setup(arrival: number, flowVehPerHour = 600, b = bus(), plan = fixedTimePlan(60, 30, -2, 4)) {
  const ex = exactApproach(tri, flowVehPerHour / 3600)
  const start = arrival - freeTimeToLineS(b)
  const model: BusModel = { run: (p: SignalPlan, record) => runBusExact(ex, queueField(ex, p), b, start, record) }
  return { model, plan, base: model.run(plan, false), start }
}

describe('green extension', () => {
  it('holds the green until a late bus has passed', () => {
    // green of the previous cycle ends at 0; the bus would reach the line at 3 s
    const { model, plan, base } = setup(3)
    const o = decidePriority(model, plan, { strategy: 'green-extension', maxExtensionS: 10, maxEarlyGreenS: 0 }, base)
    expect(o.action).toBe('green-extension')
    expect(o.greenTakenS).toBeCloseTo(3, 4)
    expect(o.run.crossS).toBeCloseTo(3, 4)
    expect(o.run.held).toBe(false)
    expect(o.plan.redStart[o.redIndex]).toBeCloseTo(3, 4)
  })

  it('is not granted when even the longest extension cannot get the bus through', () => {
    const { model, plan, base } = setup(12)
    const o = decidePriority(model, plan, { strategy: 'green-extension', maxExtensionS: 10, maxEarlyGreenS: 0 }, base)
    expect(o.action).toBe('none')
    expect(o.run).toBe(base)
  })

  it('counts the queue ahead of the bus: a long residual queue refuses the extension that would help a free bus', () => {
    // an oversaturated approach (1000 veh/h against 900 veh/h of capacity) from an empty queue
    const plan = fixedTimePlan(60, 30, 0, 20)
    const heavy = setup(8 * 60 - 2, 1000, bus(), plan)
    const limits = { strategy: 'green-extension' as const, maxExtensionS: 10, maxEarlyGreenS: 0 }
    // running free it would be 2 s early; the residual queue makes it late by more than 10 s
    expect(heavy.base.crossS).toBeGreaterThan(8 * 60 + 10)
    expect(decidePriority(heavy.model, plan, limits, heavy.base).action).toBe('none')
    // the same bus on a light approach would not even need one; 3 s late, it gets one
    const light = setup(8 * 60 + 3, 100, bus(), plan)
    expect(decidePriority(light.model, plan, limits, light.base).action).toBe('green-extension')
  })

  it('needs the request before the green ends', () => {
    // check-in 10 m before the line: at 50 km/h the request comes 0.7 s before arrival, after the green ended
    const b = bus({ checkInDistanceM: 10 })
    const { model, plan, base } = setup(3, 600, b)
    expect(base.requestS).toBeGreaterThan(0)
    const o = decidePriority(model, plan, { strategy: 'green-extension', maxExtensionS: 10, maxEarlyGreenS: 0 }, base)
    expect(o.action).toBe('none')
  })
})

describe('early green', () => {
  it('ends the red up to the limit early for a bus waiting at it', () => {
    const { model, plan, base } = setup(15)
    const o = decidePriority(model, plan, { strategy: 'early-green', maxExtensionS: 0, maxEarlyGreenS: 10 }, base)
    expect(o.action).toBe('early-green')
    expect(o.greenTakenS).toBeCloseTo(10, 9)
    expect(o.plan.redEnd[o.redIndex]).toBeCloseTo(20, 9)
    expect(o.run.crossS).toBeLessThan(base.crossS - 5)
  })

  it('cannot end the red before the request arrives', () => {
    const b = bus({ checkInDistanceM: 40 })
    const { model, plan, base } = setup(26, 600, b)
    const o = decidePriority(model, plan, { strategy: 'early-green', maxExtensionS: 0, maxEarlyGreenS: 10 }, base)
    expect(o.action).toBe('early-green')
    expect(o.plan.redEnd[o.redIndex]).toBeCloseTo(base.requestS, 9)
    expect(o.greenTakenS).toBeCloseTo(30 - base.requestS, 9)
    expect(o.greenTakenS).toBeLessThan(10)
  })

  it('is not granted to a bus that the red does not hold', () => {
    const { model, plan, base } = setup(50)
    expect(decidePriority(model, plan, { strategy: 'early-green', maxExtensionS: 0, maxEarlyGreenS: 10 }, base).action).toBe('none')
  })
})

describe('both and none', () => {
  it('falls back to an early green when the extension would not get the bus through', () => {
    const { model, plan, base } = setup(12)
    const o = decidePriority(model, plan, { strategy: 'both', maxExtensionS: 10, maxEarlyGreenS: 10 }, base)
    expect(o.action).toBe('early-green')
  })

  it('prefers the extension when it works', () => {
    const { model, plan, base } = setup(4)
    expect(decidePriority(model, plan, { strategy: 'both', maxExtensionS: 10, maxEarlyGreenS: 10 }, base).action).toBe('green-extension')
  })

  it('grants nothing without a strategy', () => {
    const { model, plan, base } = setup(4)
    expect(decidePriority(model, plan, { strategy: 'none', maxExtensionS: 10, maxEarlyGreenS: 10 }, base).action).toBe('none')
  })
})

describe('lockout and lateness', () => {
  it('solves the lockout fixed point g = a exp(-b g)', () => {
    const s = askingShare({ grantShareWhenAsked: 0.6, lateOnly: false, lateShare: 0.3, busesPerHour: 20, cycleS: 90, lockoutCycles: 2 })
    const b = (20 / 3600) * 2 * 90
    expect(s.grantShare).toBeCloseTo(0.6 * Math.exp(-b * s.grantShare), 12)
    expect(s.lockedOutShare).toBeCloseTo(1 - Math.exp(-b * s.grantShare), 12)
    expect(s.grantShare).toBeLessThan(0.6)
  })

  it('locks nothing out without a lockout and asks only for late buses when conditional', () => {
    expect(askingShare({ grantShareWhenAsked: 0.6, lateOnly: false, lateShare: 0.3, busesPerHour: 20, cycleS: 90, lockoutCycles: 0 }))
      .toEqual({ askShare: 1, lockedOutShare: 0, grantShare: 0.6 })
    const late = askingShare({ grantShareWhenAsked: 0.6, lateOnly: true, lateShare: 0.25, busesPerHour: 20, cycleS: 90, lockoutCycles: 0 })
    expect(late.askShare).toBe(0.25)
    expect(late.grantShare).toBeCloseTo(0.15, 12)
  })

  it('caps the limits by what the cross street can give and says so', () => {
    const p = prepareApproach(approachBody.parse({ priority: { maxExtensionS: 20, maxEarlyGreenS: 5 } }))
    // cross street: 30 s of green, needs max(10, 7 + 12) = 19 s, so 11 s can be taken
    expect(p.cross.availableS).toBeCloseTo(11, 12)
    expect(p.limits.maxExtensionS).toBeCloseTo(11, 12)
    expect(p.limits.maxEarlyGreenS).toBeCloseTo(5, 12)
    expect(p.warnings.join(' ')).toMatch(/capped at 11\.0 s/)
  })
})
