import { describe, expect, it } from 'vitest'
import {
  type BusSetup, exactApproach, fixedTimePlan, freeRunS, freeTimeToLineS, kmhToMps, queueField, queueStopPenaltyS,
  requestAtDoorClose, runBusExact, stopPenaltyS, triangularFromWaveSpeed,
} from '../../../shared/model'

const tri = triangularFromWaveSpeed({ freeFlowSpeedKmh: 60, backwardWaveSpeedKmh: 20, jamDensityVehPerKmPerLane: 120 })
const v = kmhToMps(50)

function bus(over: Partial<BusSetup> = {}): BusSetup {
  return {
    speed: v, lengthM: 400, downstreamLengthM: 150, nearSide: null, farSide: null, checkInDistanceM: 150,
    accelMps2: 1.2, decelMps2: 1.2, stopPenaltyS: stopPenaltyS(v, 1.2, 1.2), ...over,
  }
}

// red [0, 30), green [30, 60) in every cycle
const plan = fixedTimePlan(60, 30, -2, 3)
const empty = exactApproach(tri, 0)
const traffic = exactApproach(tri, 600 / 3600)
/** start time that brings the bus to the line at time t running free */
const startFor = (b: BusSetup, t: number) => t - freeTimeToLineS(b)

describe('the bus on an empty road', () => {
  const field = queueField(empty, plan)

  it('runs free through a green', () => {
    const b = bus()
    const run = runBusExact(empty, field, b, startFor(b, 40), false)
    expect(run.crossS).toBeCloseTo(40, 9)
    expect(run.exitS - run.startS).toBeCloseTo(freeRunS(b), 9)
    expect(run.held).toBe(false)
    expect(run.stops).toBe(0)
  })

  it('stops at the line in red and pays the acceleration it does not brake within the wait', () => {
    const b = bus()
    const run = runBusExact(empty, field, b, startFor(b, 10), false)
    // waits 20 s, longer than braking from cruise (v / 2d = 5.8 s), so the stop costs v / 2a more
    expect(run.crossS).toBeCloseTo(30 + v / 2.4, 6)
    expect(run.exitS - run.startS - freeRunS(b)).toBeCloseTo(20 + v / 2.4, 6)
    expect(run.stops).toBe(1)
  })

  it('only slows down for a red that ends within its braking time', () => {
    const b = bus()
    const run = runBusExact(empty, field, b, startFor(b, 28), false)
    // a 2 s wait, shorter than v / 2d: a slow-down costing 2 s x d/a more
    expect(run.exitS - run.startS - freeRunS(b)).toBeCloseTo(2 + 2 * (1.2 / 1.2), 6)
    expect(run.stops).toBe(0)
    expect(run.held).toBe(true)
    expect(queueStopPenaltyS(b, 2)).toBeCloseTo(2, 12)
    expect(queueStopPenaltyS(b, 100)).toBeCloseTo(v / 2.4, 12)
  })

  it('passes when it reaches the line as the red starts', () => {
    const b = bus()
    const run = runBusExact(empty, field, b, startFor(b, 60), false)
    expect(run.held).toBe(false)
  })
})

describe('the bus behind the queue', () => {
  const field = queueField(traffic, plan)

  it('stops where its path meets the back of the queue and leaves with the discharge wave', () => {
    const b = bus()
    const phase = 10
    const run = runBusExact(traffic, field, b, startFor(b, phase), true)
    // the back of the queue runs upstream at u from (0, 0); the bus meets it at d = u t
    const u = traffic.u
    const tMeet = (v * phase) / (u + v)
    const dMeet = u * tMeet
    const restart = 30 + dMeet / traffic.w
    const wait = restart - tMeet
    expect(run.exitS - run.startS - freeRunS(b)).toBeCloseTo(wait + v / 2.4, 6)
    expect(run.points).not.toBeNull()
    const pts = run.points!
    // it stands at -dMeet from tMeet to the restart
    const i = pts.findIndex((_x, j) => j % 2 === 0 && Math.abs(pts[j] - tMeet) < 1e-6)
    expect(i).toBeGreaterThan(0)
    expect(pts[i + 1]).toBeCloseTo(-dMeet, 6)
    expect(pts[i + 2]).toBeCloseTo(restart, 6)
    expect(pts[i + 3]).toBeCloseTo(-dMeet, 6)
  })

  it('is not delayed after the queue has cleared', () => {
    const b = bus()
    // the queue clears the line 15 s into green (45 s)
    const run = runBusExact(traffic, field, b, startFor(b, 46), false)
    expect(run.exitS - run.startS - freeRunS(b)).toBeCloseTo(0, 9)
  })

  it('loses nothing when it only touches the tip of the queue as it dissolves', () => {
    // at the free-flow speed the last queued car's path runs through the tip of the polygon
    const fast = bus({ speed: tri.vf, stopPenaltyS: stopPenaltyS(tri.vf, 1.2, 1.2) })
    const run = runBusExact(traffic, field, fast, startFor(fast, 45 - 1e-7), false)
    expect(run.exitS - run.startS - freeRunS(fast)).toBeLessThan(1e-3)
    // a slower bus on the same free arrival cuts through the end of the queue and waits briefly
    const slow = bus()
    const late = runBusExact(traffic, field, slow, startFor(slow, 45 - 1e-7), false)
    const delay = late.exitS - late.startS - freeRunS(slow)
    expect(delay).toBeGreaterThan(0.5)
    expect(delay).toBeLessThan(1.5)
  })
})

describe('bus stops', () => {
  it('counts the dwell and the stop penalty in the free run', () => {
    const near = bus({ nearSide: { distanceM: 30, dwellS: 20 } })
    const far = bus({ farSide: { distanceM: 40, dwellS: 20 } })
    expect(freeRunS(near)).toBeCloseTo(550 / v + 20 + stopPenaltyS(v, 1.2, 1.2), 9)
    expect(freeRunS(far)).toBeCloseTo(freeRunS(near), 9)
    expect(freeTimeToLineS(far)).toBeCloseTo(400 / v, 9)
  })

  it('sends the request when the doors close at a near-side stop between the check-in point and the line', () => {
    const near = bus({ nearSide: { distanceM: 30, dwellS: 20 } })
    expect(requestAtDoorClose(near)).toBe(true)
    const field = queueField(empty, plan)
    const start = startFor(near, 40)
    const run = runBusExact(empty, field, near, start, false)
    expect(run.requestS).toBeCloseTo(start + 370 / v + 20 + stopPenaltyS(v, 1.2, 1.2), 9)
    expect(run.crossS - run.requestS).toBeCloseTo(30 / v, 9)
    // a stop upstream of the check-in point leaves the check-in as it is
    const upstream = bus({ nearSide: { distanceM: 200, dwellS: 20 } })
    expect(requestAtDoorClose(upstream)).toBe(false)
    const r2 = runBusExact(empty, field, upstream, startFor(upstream, 40), false)
    expect(r2.crossS - r2.requestS).toBeCloseTo(150 / v, 9)
  })

  it('is not penalised again when the queue holds it right after the doors close', () => {
    const near = bus({ nearSide: { distanceM: 5, dwellS: 20 } })
    const field = queueField(traffic, plan)
    // doors close at 12 s, inside the red and inside the queue (which passes 5 m at about 3 s)
    const start = startFor(near, 12 + 5 / v)
    const run = runBusExact(traffic, field, near, start, false)
    expect(run.held).toBe(true)
    expect(run.stops).toBe(0)
    expect(run.crossS).toBeCloseTo(30 + 5 / traffic.w + 5 / v, 6)
  })

  it('dwells at a far-side stop after the line', () => {
    const far = bus({ farSide: { distanceM: 40, dwellS: 20 } })
    const field = queueField(empty, plan)
    const run = runBusExact(empty, field, far, startFor(far, 40), true)
    expect(run.crossS).toBeCloseTo(40, 9)
    expect(run.exitS - run.startS).toBeCloseTo(freeRunS(far), 9)
    expect(run.points!.slice(-6)).toEqual([expect.closeTo(40 + 40 / v, 6), 40, expect.closeTo(40 + 40 / v + 20 + stopPenaltyS(v, 1.2, 1.2), 6), 40, expect.any(Number), 150])
  })
})
