import { describe, expect, it } from 'vitest'
import GtfsRealtimeBindings from 'gtfs-realtime-bindings'
import { positionAt, simulateRun } from '../../../server/services/realtime/bus-run'
import { readScenarioGtfs } from '../../../server/services/realtime/scenario-gtfs'
import { allDayPlan, RealtimeScenario, type ScenarioOptions } from '../../../server/services/realtime/scenario'
import { decodeSnapshot } from '../../../server/services/realtime/decode'
import { corridorFeed, LAT, metresAlong, SHAPE_7E_START_LON } from '../../support/corridor-feed'
import { zipFeed } from '../../support/gtfs-fixtures'

const half = () => 0.5
const stops = [{ distM: 0, stopId: 'A', stopSequence: 1, departureS: 0 }, { distM: 1000, stopId: 'B', stopSequence: 2, departureS: 200 }]
const timing = (greenS: number) => () => ({ cycleS: 90, greenS, greenStartS: 60 })
const signal = { distM: 500, timingAt: timing(30), priority: true }
const off = { enabled: false, maxExtensionS: 10, maxEarlyGreenS: 10 }

describe('simulateRun (hand computed with every random draw 0.5)', () => {
  // Speed 8.5 + 2 x 0.5 = 9.5 m/s; leaves A at 0 - 20 + 140 x 0.5 = 50 s; two cars queue (floor(2.5)).
  // Half the stopping loss v / (2 a) = 9.5 / 2.4 = 3.958 s. Greens start at 60 s, every 90 s.
  // It would reach the line at 50 + 500 / 9.5 = 102.63 s, 42.63 s into the cycle.
  it('waits for green behind the queue', () => {
    const knots = simulateRun(stops, [signal], half, off)
    // 42.63 s into a cycle with 30 s of green: red until 150 s. Stops at the queue tail 485 m at
    // 50 + 485 / 9.5 = 101.05 s and moves at 150 + 2 s start-up + 2 cars x 1.5 s = 155 s.
    expect(positionAt(knots, 120)).toEqual({ distM: 485, stop: null })
    expect(positionAt(knots, 154.9)!.distM).toBeCloseTo(485, 6)
    // Crosses the line at 155 + 3.958 + 15 / 9.5 = 160.54 s.
    expect(knots.find((k) => k.d === 500)!.t).toBeCloseTo(155 + 9.5 / 2.4 + 15 / 9.5, 6)
  })

  it('ends the red early for a bus that finds it, and dwells at the last stop', () => {
    // 20 s of green: 22.63 s after its end, beyond the 10 s an extension covers; the red (to
    // 150 s) is cut by 10 s of early green: green at 140 s, moving at 145 s, line at 150.54 s.
    const knots = simulateRun(stops, [{ ...signal, timingAt: timing(20) }], half, { ...off, enabled: true })
    expect(knots.find((k) => k.d === 500)!.t).toBeCloseTo(145 + 9.5 / 2.4 + 15 / 9.5, 6)
    // Reaches B at 150.54 + 500 / 9.5 + 3.958 = 207.13 s and stands there 20 s (STOPPED_AT B, index 1).
    expect(positionAt(knots, 215)).toEqual({ distM: 1000, stop: 1 })
    expect(positionAt(knots, 230)).toBeNull()
    // At A from 25 s (STOPPED_AT, 25 s before it leaves); nothing before.
    expect(positionAt(knots, 40)).toEqual({ distM: 0, stop: 0 })
    expect(positionAt(knots, 20)).toBeNull()
  })

  it('holds the green for a bus a few seconds late for it', () => {
    // 35 s of green: the bus at 42.63 s is 7.63 s after its end, within the 10 s extension.
    const knots = simulateRun(stops, [{ ...signal, timingAt: timing(35) }], half, { ...off, enabled: true })
    expect(knots.find((k) => k.d === 500)!.t).toBeCloseTo(50 + 500 / 9.5, 6)
  })
})

describe('RealtimeScenario on the corridor test feed', () => {
  const lonAt = (d: number) => SHAPE_7E_START_LON + d / metresAlong(1)
  const gtfs = readScenarioGtfs(zipFeed(corridorFeed()), ['7'])
  const options = (enabled: boolean, seed = 1): ScenarioOptions => ({
    seed,
    signals: [600, 1100].map((d, i) => ({ name: `S${i}`, lat: LAT, lon: lonAt(d), plans: [allDayPlan(90, 40, 25 * i)], priority: true })),
    priority: { enabled, maxExtensionS: 10, maxEarlyGreenS: 10 },
  })
  const noon = Date.UTC(2026, 0, 13, 12, 3) / 1000

  it('reads the trips, frequency runs and service days of the feed', () => {
    expect(gtfs.timeZone).toBe('Europe/London')
    expect(gtfs.trips.find((t) => t.tripId === '7-AM')!.runStarts).toHaveLength(12)
    const scenario = new RealtimeScenario(gtfs, options(false))
    // A weekday: 12 runs of 7-AM, 7-1200, 7-1230 and the westbound 7-W.
    expect(scenario.runsOn('20260113')).toHaveLength(15)
    expect(scenario.runsOn('20260110')).toHaveLength(1) // Saturday: 7-SA
  })

  it('is reproducible with a seed and decodes as a valid FeedMessage', () => {
    const a = new RealtimeScenario(gtfs, options(false)).feedAt(noon)
    const b = new RealtimeScenario(gtfs, options(false)).feedAt(noon)
    const c = new RealtimeScenario(gtfs, options(false, 2)).feedAt(noon)
    expect(Buffer.from(a).equals(Buffer.from(b))).toBe(true)
    expect(Buffer.from(a).equals(Buffer.from(c))).toBe(false)
    const snap = decodeSnapshot(a, { now: () => new Date((noon + 60) * 1000) })
    expect(snap.vehicles.map((v) => v.tripId)).toEqual(['7-1200'])
    expect(snap.vehicles[0]).toMatchObject({ startDate: '20260113', timeS: noon })
    const msg = GtfsRealtimeBindings.transit_realtime.FeedMessage.decode(a)
    expect(msg.header.gtfsRealtimeVersion).toBe('2.0')
  })

  it('runs faster through the signals with priority', () => {
    const runTime = (enabled: boolean) => {
      const s = new RealtimeScenario(gtfs, options(enabled, 11))
      const days = ['20260105', '20260106', '20260107', '20260108', '20260109']
      const times = days.flatMap((d) => s.runsOn(d).filter((r) => r.trip.trip.directionId === 0).map((r) => r.knots[r.knots.length - 2].t - r.knots[1].t))
      return times.reduce((x, y) => x + y, 0) / times.length
    }
    // Same seed, same dwells and queues: only the signals change, and priority can only shorten waits.
    expect(runTime(true)).toBeLessThan(runTime(false))
  })
})
