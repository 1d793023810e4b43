import { describe, expect, it } from 'vitest'
import GtfsRealtimeBindings from 'gtfs-realtime-bindings'
import { decodeSnapshot } from '../../../server/services/realtime/decode'
import { resolveTripUpdate, type ScheduledStop } from '../../../server/services/realtime/stop-events'

// Rules checked here are those of the GTFS-realtime reference (StopTimeUpdate / StopTimeEvent):
// an absolute time wins over a delay; a delay holds for later stops until the next update;
// SKIPPED passes the delay on; NO_DATA leaves the rest unknown; CANCELED trips have no times.
const rt = GtfsRealtimeBindings.transit_realtime
const DAY = 1_714_953_600 // service day start, 2024-05-06T00:00:00Z (a UTC agency keeps the arithmetic plain)
const clock = { now: () => new Date((DAY + 86_400) * 1000) }

// Scheduled: stop 1 at 08:00:00, stop 2 at 08:02:00-08:02:30, stop 3 at 08:05:00, stop 4 at 08:08:00.
const H8 = 8 * 3600
const schedule: ScheduledStop[] = [
  { stopSequence: 1, stopId: 'A', arrivalS: H8, departureS: H8 },
  { stopSequence: 2, stopId: 'B', arrivalS: H8 + 120, departureS: H8 + 150 },
  { stopSequence: 3, stopId: 'C', arrivalS: H8 + 300, departureS: H8 + 300 },
  { stopSequence: 4, stopId: 'D', arrivalS: H8 + 480, departureS: H8 + 480 },
]

function update(stopTimeUpdate: Record<string, unknown>[], timestamp: number, trip: Record<string, unknown> = { tripId: 'T1' }) {
  const data = rt.FeedMessage.encode(rt.FeedMessage.fromObject({
    header: { gtfsRealtimeVersion: '2.0', timestamp },
    entity: [{ id: 'u', tripUpdate: { trip, timestamp, stopTimeUpdate } }],
  })).finish()
  return decodeSnapshot(data, clock).tripUpdates[0]
}

describe('resolveTripUpdate', () => {
  it('lets an absolute time win over a delay given beside it', () => {
    // arrival.time = 08:00:40 and delay = 999: the time wins, so the delay is 40 s.
    const u = update([{ stopSequence: 1, arrival: { time: DAY + H8 + 40, delay: 999 } }], DAY + H8 + 60)
    const [a] = resolveTripUpdate(u, schedule, DAY)
    expect(a).toEqual({ stopSequence: 1, stopId: 'A', arrivalS: DAY + H8 + 40, departureS: DAY + H8 + 40, delayS: 40 })
  })

  it('carries a delay to later stops until the next update', () => {
    // Stop 1 delay 60 -> arrives 08:01:00; stop 2 has no update: 08:02:00 + 60 = 08:03:00, departs
    // 08:02:30 + 60 = 08:03:30; stop 3 gives delay 30: 08:05:30; stop 4 carries 30: 08:08:30.
    const u = update([{ stopSequence: 1, arrival: { delay: 60 } }, { stopSequence: 3, arrival: { delay: 30 } }], DAY + H8 + 600)
    const got = resolveTripUpdate(u, schedule, DAY)
    expect(got.map((s) => [s.stopSequence, s.arrivalS! - DAY - H8, s.departureS! - DAY - H8, s.delayS])).toEqual([
      [1, 60, 60, 60],
      [2, 180, 210, 60],
      [3, 330, 330, 30],
      [4, 510, 510, 30],
    ])
  })

  it('gives the departure the arrival delay when it has none, and its own time when it has one', () => {
    // Stop 2 arrives at 08:02:50 (delay 50), departs 08:03:40 (absolute): delay 70 carried on,
    // so stop 3 is 08:05:00 + 70 = 08:06:10.
    const u = update([{ stopSequence: 2, arrival: { time: DAY + H8 + 170 }, departure: { time: DAY + H8 + 220 } }], DAY + H8 + 900)
    const got = resolveTripUpdate(u, schedule, DAY)
    expect(got[0]).toMatchObject({ stopSequence: 2, arrivalS: DAY + H8 + 170, departureS: DAY + H8 + 220, delayS: 50 })
    expect(got[1]).toMatchObject({ stopSequence: 3, arrivalS: DAY + H8 + 370, delayS: 70 })
    // Stops before the first update are not guessed (propagation runs downstream only).
    expect(got.find((s) => s.stopSequence === 1)).toBeUndefined()
  })

  it('keeps only what has happened by the update time (the rest are predictions)', () => {
    // Delay 60 everywhere; at 08:05:00 stops 1 (08:01) and 2 (08:03, departs 08:03:30) are past,
    // stop 3 (08:06) is still a prediction.
    const u = update([{ stopSequence: 1, arrival: { delay: 60 } }], DAY + H8 + 300)
    expect(resolveTripUpdate(u, schedule, DAY).map((s) => s.stopSequence)).toEqual([1, 2])
  })

  it('matches by stop_id in trip order when stop_sequence is absent', () => {
    const u = update([{ stopId: 'C', arrival: { delay: 12 } }], DAY + H8 + 900)
    expect(resolveTripUpdate(u, schedule, DAY)[0]).toMatchObject({ stopSequence: 3, delayS: 12 })
  })

  it('passes the delay over a SKIPPED stop and stops at NO_DATA', () => {
    // Stop 1 delay 20; stop 2 skipped (no time, delay carried); stop 3: 08:05:20; NO_DATA at 4.
    const u = update([
      { stopSequence: 1, arrival: { delay: 20 } },
      { stopSequence: 2, scheduleRelationship: 'SKIPPED' },
      { stopSequence: 4, scheduleRelationship: 'NO_DATA' },
    ], DAY + H8 + 900)
    const got = resolveTripUpdate(u, schedule, DAY)
    expect(got.map((s) => [s.stopSequence, s.arrivalS! - DAY - H8])).toEqual([[1, 20], [3, 320]])
  })

  it('has nothing for a cancelled trip or an update that matches no scheduled stop', () => {
    expect(resolveTripUpdate(update([{ stopSequence: 1, arrival: { delay: 5 } }], DAY + H8 + 900, { tripId: 'T1', scheduleRelationship: 'CANCELED' }), schedule, DAY)).toEqual([])
    expect(resolveTripUpdate(update([{ stopSequence: 77, arrival: { delay: 5 } }], DAY + H8 + 900), schedule, DAY)).toEqual([])
  })
})
