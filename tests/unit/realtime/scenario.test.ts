import { describe, expect, it } from 'vitest'
import GtfsRealtimeBindings from 'gtfs-realtime-bindings'
import { positionAt, simulateRun } from '../../../server/services/realtime/bus-run'
import { readScenarioGtfs } from '../../../server/services/realtime/scenario-gtfs'
import { RealtimeScenario, type ScenarioOptions } from '../../../server/services/realtime/scenario'
import { decodeSnapshot } from '../../../server/services/realtime/decode'
import { corridorFeed, LAT, metresAlong, SHAPE_7E_START_LON } from '../../support/corridor-feed'
import { zipFeed } from '../../support/gtfs-fixtures'

const half = () => 0.5
const stops = [{ distM: 0, stopId: 'A', stopSequence: 1, departureS: 0 }, { distM: 1000, stopId: 'B', stopSequence: 2, departureS: 200 }]
const signal = { distM: 500, cycleS: 90, greenS: 40, offsetS: 0, priority: true }
const off = { enabled: false, maxExtensionS: 10, maxEarlyGreenS: 10 }

describe('simulateRun (hand computed with every random draw 0.5)', () => {
  // Speed 8.5 + 3.5 x 0.5 = 10.25 m/s; leaves A at 0 - 40 + 70 x 0.5 = -5 s; two cars queue (floor(2.5)).
  // Half the stopping loss v / (2 a) = 10.25 / 2.4 = 4.271 s.
  it('waits for green behind the queue', () => {
    const knots = simulateRun(stops, [signal], half, off)
    // Would reach the line at -5 + 500 / 10.25 = 43.78 s: 43.78 s into a 90 s cycle with 40 s of
    // green is red until 90 s. Stops at the queue tail 485 m at -5 + 485 / 10.25 = 42.32 s and
    // moves at 90 + 2 s start-up + 2 cars x 1.5 s = 95 s.
    expect(positionAt(knots, 60)).toEqual({ distM: 485, stop: null })
    expect(positionAt(knots, 94.9)!.distM).toBeCloseTo(485, 6)
    // Crosses the line at 95 + 4.271 + 15 / 10.25 = 100.73 s.
    const line = knots.find((k) => k.d === 500)!
    expect(line.t).toBeCloseTo(95 + 10.25 / 2.4 + 15 / 10.25, 6)
  })

  it('holds the green for a bus 3.8 s late for it, and dwells at the last stop', () => {
    const knots = simulateRun(stops, [signal], half, { ...off, enabled: true })
    expect(knots.find((k) => k.d === 500)!.t).toBeCloseTo(-5 + 500 / 10.25, 6)
    // Reaches B at 43.78 + 48.78 + 4.271 = 96.83 s and stands there (STOPPED_AT B, index 1).
    expect(positionAt(knots, 100)).toEqual({ distM: 1000, stop: 1 })
    expect(positionAt(knots, -10)).toEqual({ distM: 0, stop: 0 })
    expect(positionAt(knots, -60)).toBeNull()
  })
})

describe('RealtimeScenario on the corridor test feed', () => {
  const lonAt = (d: number) => SHAPE_7E_START_LON + d / metresAlong(1)
  const gtfs = readScenarioGtfs(zipFeed(corridorFeed()), ['7'])
  const options = (enabled: boolean, seed = 1): ScenarioOptions => ({
    seed,
    signals: [600, 1100].map((d, i) => ({ name: `S${i}`, lat: LAT, lon: lonAt(d), cycleS: 90, greenS: 40, offsetS: 25 * i, priority: true })),
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
