import { describe, expect, it } from 'vitest'
import { buildShapeLine, pointAt, project } from '../../../server/services/realtime/shape-line'
import { arrivalAt, buildTrajectory, departureAt, dwellAt } from '../../../server/services/realtime/trajectory'

// A straight east-west shape along the equator: 0.01 degree of longitude is
// 6 371 008.8 m x pi / 180 x 0.01 = 1111.95 m (mean Earth radius, IUGG), so distances are checkable by hand.
const M_PER_0_01_DEG = (6_371_008.8 * Math.PI) / 180 * 0.01
const straight = buildShapeLine([{ lat: 0, lon: 0 }, { lat: 0, lon: 0.01 }, { lat: 0, lon: 0.02 }])

describe('shape line', () => {
  it('measures and projects along the shape', () => {
    expect(straight.lengthM).toBeCloseTo(2 * M_PER_0_01_DEG, 6)
    // A point 0.0001 degree (11.1 m) north of the 0.005 mark: 556 m along, 11.1 m off.
    const p = project(straight, { lat: 0.0001, lon: 0.005 })
    expect(p.distM).toBeCloseTo(M_PER_0_01_DEG / 2, 1)
    expect(p.offsetM).toBeCloseTo(11.12, 1)
    const back = pointAt(straight, 1000)
    expect(project(straight, back).distM).toBeCloseTo(1000, 3)
  })

  it('snaps to the right leg of an out-and-back shape by searching forward only', () => {
    // Out 0 -> 0.01 then back along a street 30 m north (0.00027 deg).
    const outBack = buildShapeLine([{ lat: 0, lon: 0 }, { lat: 0, lon: 0.01 }, { lat: 0.00027, lon: 0.01 }, { lat: 0.00027, lon: 0 }])
    const nearReturn = { lat: 0.0002, lon: 0.004 }
    // From the start the outbound leg is searched first (equal or nearer wins: 22 m vs 7.8 m, so the return is nearer).
    expect(project(outBack, nearReturn, 0, 500).distM).toBeLessThan(500) // bounded window keeps it outbound
    expect(project(outBack, nearReturn, 1200).distM).toBeGreaterThan(1200) // already past the turn: the return leg
  })
})

describe('buildTrajectory and crossing times (hand computed)', () => {
  // Positions every 30 s (t, distance): (0, 0), (30, 300), (60, 450), (90, 450) STOPPED_AT a stop
  // at 450 m, (120, 700). Crossing 200 m: between (0,0) and (30,300): 0 + 200/300 x 30 = 20 s.
  // Crossing 600 m: between (90,450) and (120,700): 90 + 150/250 x 30 = 108 s.
  const pos = (timeS: number, distM: number, stoppedAt = false) => ({ timeS, ...pointAt(straight, distM), stoppedAtDistM: stoppedAt ? distM : null })
  const positions = [pos(0, 0), pos(30, 300), pos(60, 450), pos(90, 450, true), pos(120, 700)]

  it('interpolates arrival times between readings', () => {
    const { points, offRoute } = buildTrajectory(straight, positions, [])
    expect(offRoute).toBe(0)
    expect(arrivalAt(points, 200)).toBeCloseTo(20, 6)
    expect(arrivalAt(points, 600)).toBeCloseTo(108, 6)
    // The stop at 450 m: reached at 60 s, left at 90 s (STOPPED_AT), so 30 s of dwell.
    expect(arrivalAt(points, 450)).toBeCloseTo(60, 3)
    expect(departureAt(points, 450)).toBe(90)
    // Segment 200 m -> 600 m: 108 - 20 = 88 s.
    expect(arrivalAt(points, 600)! - arrivalAt(points, 200)!).toBeCloseTo(88, 6)
  })

  it('lets stop events pin the trajectory and give the dwell', () => {
    // A TripUpdate says the stop at 450 m was reached at 70 s and left at 95 s. The 60-s reading
    // puts the bus at 470 m by GPS, past the stop it has not yet left: it is clamped to 450 m, so
    // 450 m is first reached at 60 s; dwellAt sees stop events at 70, 90 (STOPPED_AT) and 95.
    const drifting = [pos(0, 0), pos(30, 300), pos(60, 470), pos(90, 450, true), pos(120, 700)]
    const { points } = buildTrajectory(straight, drifting, [{ distM: 450, arrivalS: 70, departureS: 95 }])
    expect(arrivalAt(points, 450)).toBe(60)
    expect(departureAt(points, 450)).toBe(95)
    expect(dwellAt(points, 450)).toBe(95 - 70)
    // After the departure at 95 s: 600 m is 95 + (600-450)/(700-450) x (120-95) = 95 + 15 = 110 s.
    expect(arrivalAt(points, 600)).toBeCloseTo(110, 6)
  })

  it('never runs a bus backwards on GPS jitter, drops off-route points and repeated readings', () => {
    const jitter = [pos(0, 100), pos(30, 400), pos(60, 380), pos(60, 380), { timeS: 75, lat: 0.01, lon: 0.004, stoppedAtDistM: null }, pos(90, 500)]
    const { points, offRoute } = buildTrajectory(straight, jitter, [])
    expect(offRoute).toBe(1) // 0.01 degree north is 1.1 km off the street
    expect(points.map((p) => p.timeS)).toEqual([0, 30, 60, 90])
    expect(points[2].distM).toBeCloseTo(400, 3) // 380 held at 400
  })

  it('gives no time before the first reading, after the last one, or across a long gap', () => {
    const { points } = buildTrajectory(straight, [pos(0, 100), pos(30, 300), pos(600, 900)], [])
    expect(arrivalAt(points, 50)).toBeNull()
    expect(arrivalAt(points, 1500)).toBeNull()
    expect(arrivalAt(points, 500)).toBeNull() // 570 s between readings > 300 s
    expect(arrivalAt(points, 100)).toBeCloseTo(0, 3)
    // First seen 10 m past a point (within the 15 m GPS tolerance): taken to be there.
    expect(arrivalAt(points, 90)).toBe(0)
  })

  it('times the departure from a terminal where the bus waits a few metres off the stop', () => {
    // Readings at 0, 30, 60 s all 4-9 m past a stop at 100 m (a bus at the kerb), then 400 m at 90 s.
    // Departure = last reading within 15 m of the stop: 60 s; arrival = the first: 0 s.
    const { points } = buildTrajectory(straight, [pos(0, 104), pos(30, 109), pos(60, 106), pos(90, 400)], [])
    expect(arrivalAt(points, 100)).toBe(0)
    expect(departureAt(points, 100)).toBe(60)
  })
})
