// Realtime snapshots for the corridor test feed (tests/support/corridor-feed.ts), encoded with the
// registry package gtfs-realtime-bindings: a bus of trip 7-1200 read at known distances along
// shape SH7E, so derived times can be checked by hand.
import GtfsRealtimeBindings from 'gtfs-realtime-bindings'
import { zipSync } from 'fflate'
import type { TestApp } from './test-app'
import { importCorridorFeed, LAT, metresAlong, SHAPE_7E_START_LON, STOP_LON } from './corridor-feed'

const rt = GtfsRealtimeBindings.transit_realtime

/** 2026-01-12, a Monday; Europe/London is on UTC in January, so the service day starts at 00:00Z. */
export const MONDAY = '20260112'
export const dayStartUtc = (date: string) => Date.UTC(Number(date.slice(0, 4)), Number(date.slice(4, 6)) - 1, Number(date.slice(6, 8))) / 1000
export const NOON = 12 * 3600

/** Longitude of the point `distM` along SH7E (a parallel of latitude 51.0). */
export const lonAt = (distM: number) => SHAPE_7E_START_LON + distM / metresAlong(1)

export type Reading = { t: number; d: number } | { t: number; stop: number }

/**
 * The reference run of trip 7-1200 (seconds after 12:00:00; d = metres along SH7E; stop = Sk with
 * STOPPED_AT). With approaches at 600 m and 1100 m, segment 1 is [200, 750] m and segment 2
 * [850, 1250] m (see tests/api/realtime.test.ts for the arithmetic).
 */
export const REFERENCE_RUN: Reading[] = [
  { t: 0, stop: 1 }, { t: 20, stop: 1 },
  { t: 45, d: 200 }, { t: 75, d: 420 },
  { t: 105, stop: 2 }, { t: 125, stop: 2 },
  { t: 155, d: 560 }, { t: 185, d: 560 },
  { t: 215, d: 750 }, { t: 245, d: 850 },
  { t: 275, stop: 3 }, { t: 295, stop: 3 },
  { t: 325, d: 1250 },
  { t: 355, stop: 4 }, { t: 375, stop: 4 },
  { t: 435, d: 1700 }, { t: 445, stop: 5 },
]

/** The same run with the wait at the 600 m signal changed by `extraS` (readings after it shift). */
export function runWithWait(extraS: number): Reading[] {
  return REFERENCE_RUN.map((r) => (r.t >= 185 ? { ...r, t: r.t + extraS } : r))
}

export function vehicleEntity(tripId: string, date: string | null, r: Reading, timeS: number, id = 'bus-701') {
  const at = 'stop' in r
    ? { latitude: 51.0001, longitude: STOP_LON[r.stop - 1], currentStatus: 'STOPPED_AT', stopId: `S${r.stop}`, currentStopSequence: r.stop }
    : { latitude: LAT, longitude: lonAt(r.d), currentStatus: 'IN_TRANSIT_TO' }
  return {
    id,
    vehicle: {
      trip: { tripId, ...(date ? { startDate: date } : {}) },
      vehicle: { id },
      position: { latitude: at.latitude, longitude: at.longitude },
      timestamp: timeS,
      currentStatus: at.currentStatus,
      ...('stopId' in at ? { stopId: at.stopId, currentStopSequence: at.currentStopSequence } : {}),
    },
  }
}

export function feedMessage(headerTimeS: number, entities: Record<string, unknown>[], version = '2.0'): Uint8Array {
  return rt.FeedMessage.encode(rt.FeedMessage.fromObject({
    header: { gtfsRealtimeVersion: version, incrementality: 'FULL_DATASET', timestamp: headerTimeS },
    entity: entities,
  })).finish()
}

/** One snapshot per reading of a run of trip 7-1200 on a date. */
export function runSnapshots(date: string, run: Reading[], tripId = '7-1200'): { name: string; data: Uint8Array }[] {
  const start = dayStartUtc(date) + NOON
  return run.map((r) => ({
    name: `${date}-${tripId}-${String(r.t).padStart(4, '0')}.pb`,
    data: feedMessage(start + r.t, [vehicleEntity(tripId, date, r, start + r.t)]),
  }))
}

export function zipOf(files: { name: string; data: Uint8Array }[]): Buffer {
  return Buffer.from(zipSync(Object.fromEntries(files.map((f) => [f.name, f.data]))))
}

/**
 * The corridor feed imported, two signalised intersections (timing plan: 90 s cycle, 46 s bus
 * green), and corridor "Main St eastbound" on route 7 with approaches at 600 m (near-side stop S2,
 * 20 s dwell) and 1100 m (no stop), 900 and 700 veh/h at midday.
 */
export async function realtimeCorridor(t: TestApp) {
  const feedId = await importCorridorFeed(t)
  const plan = {
    name: 'All day', dayTypes: ['weekday', 'saturday', 'sunday'], startTime: '00:00', endTime: '24:00', cycleS: 90, busGreenS: 46,
    yellowS: 4, redClearanceS: 2, crossMinGreenS: 8, pedWalkS: 7, pedClearanceS: 14, offsetS: 0,
  }
  const make = async (who: 'engineer' | 'engineer2', name: string, lon: number, jurisdictionId: string) =>
    (await (await t.as(who)).post('/api/intersections').send({ name, lat: 51.0, lon, jurisdictionId, crossingDistanceM: 14, plans: [plan] }).expect(201)).body
  const first = await make('engineer', 'Main St & First Ave', lonAt(600), 'org-brackenford')
  const second = await make('engineer2', 'Main St & Second Ave', lonAt(1100), 'org-osterfield')
  const planner = await t.as('planner')
  const corridor = (await planner.post('/api/corridors').send({ feedId, name: 'Main St eastbound', routeIds: ['7'], directionId: 0 }).expect(201)).body
  const midday = corridor.periods.find((p: { name: string }) => p.name === 'Midday')
  const approach = async (intersectionId: string, distanceM: number, extra: Record<string, unknown>, volume: number) =>
    (await planner.post(`/api/corridors/${corridor.id}/approaches`).send({
      intersectionId, distanceM, lanes: 2, speedLimitKmh: 50, crossLanes: 1, ...extra,
      volumes: [{ periodId: midday.id, volumeVehPerHour: volume, crossVolumeVehPerHour: 400 }],
    }).expect(201)).body
  const a1 = await approach(first.id, 600, { stopRelation: 'near-side', stopId: 'S2', dwellS: 20 }, 900)
  const a2 = await approach(second.id, 1100, { stopRelation: 'none' }, 700)
  const detail = (await planner.get(`/api/corridors/${corridor.id}`).expect(200)).body
  return { feedId, corridorId: corridor.id as string, midday, a1, a2, stops: detail.stops as { stopId: string; distanceM: number }[] }
}
