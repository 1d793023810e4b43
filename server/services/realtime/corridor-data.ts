// Reads, for one corridor and a range of service days, everything the derivation needs: the
// corridor's shape, stops, approaches and periods, the schedule of its trips at its stops, and
// the stored vehicle positions and stop-time observations of those trips.
import { sql } from 'drizzle-orm'
import type { Db } from '../../db'
import { NotFound } from '../../errors'
import { tripIndexFor } from './trip-index'
import type { PositionRow, ScheduledPass, StopEventRow } from './derive'

export interface CorridorApproachInfo {
  id: string
  intersectionId: string
  intersectionName: string
  distanceM: number
  stopRelation: 'near-side' | 'far-side' | 'none'
  stopId: string | null
  dwellS: number | null
  speedLimitKmh: number
  checkInDistanceM: number
}

export interface CorridorInfo {
  id: string
  agencyId: string
  feedVersionId: number
  shapeId: string
  routeIds: string[]
  directionId: number
  timeZone: string
  shape: { lat: number; lon: number }[]
  stops: { seq: number; stopId: string; name: string; distanceM: number }[]
  approaches: CorridorApproachInfo[]
  periods: { id: string; name: string; startTime: string; endTime: string }[]
}

export async function loadCorridor(db: Db, corridorId: string): Promise<CorridorInfo> {
  const [c] = (await db.execute<{ id: string; agency_id: string; feed_version_id: number; shape_id: string; route_ids: string[]; direction_id: number }>(sql`
    select id, agency_id, feed_version_id, shape_id, route_ids, direction_id from corridors where id = ${corridorId}`)).rows
  if (!c) throw new NotFound('Corridor')
  const fv = Number(c.feed_version_id)
  const ix = await tripIndexFor(db, fv)
  const shape = (await db.execute<{ lat: number; lon: number }>(sql`
    select shape_pt_lat as lat, shape_pt_lon as lon from gtfs_shapes
    where feed_version_id = ${fv} and shape_id = ${c.shape_id} order by shape_pt_sequence`)).rows
  const stops = (await db.execute<{ seq: number; stop_id: string; name: string; distance_m: number }>(sql`
    select seq, stop_id, name, distance_m from corridor_stops where corridor_id = ${corridorId} order by seq`)).rows
  const approaches = (await db.execute<{
    id: string; intersection_id: string; name: string; distance_m: number; stop_relation: 'near-side' | 'far-side' | 'none'
    stop_id: string | null; dwell_s: number | null; speed_limit_kmh: number; check_in_distance_m: number
  }>(sql`
    select a.id, a.intersection_id, i.name, a.distance_m, a.stop_relation, a.stop_id, a.dwell_s, a.speed_limit_kmh, a.check_in_distance_m
    from corridor_approaches a join intersections i on i.id = a.intersection_id
    where a.corridor_id = ${corridorId} order by a.distance_m`)).rows
  const periods = (await db.execute<{ id: string; name: string; start_time: string; end_time: string }>(sql`
    select id, name, start_time, end_time from corridor_periods where corridor_id = ${corridorId} order by sort_order`)).rows
  return {
    id: c.id,
    agencyId: c.agency_id,
    feedVersionId: fv,
    shapeId: c.shape_id,
    routeIds: c.route_ids,
    directionId: Number(c.direction_id),
    timeZone: ix.timeZone,
    shape: shape.map((p) => ({ lat: Number(p.lat), lon: Number(p.lon) })),
    stops: stops.map((s) => ({ seq: Number(s.seq), stopId: s.stop_id, name: s.name, distanceM: Number(s.distance_m) })),
    approaches: approaches.map((a) => ({
      id: a.id, intersectionId: a.intersection_id, intersectionName: a.name, distanceM: Number(a.distance_m), stopRelation: a.stop_relation,
      stopId: a.stop_id, dwellS: a.dwell_s === null ? null : Number(a.dwell_s), speedLimitKmh: Number(a.speed_limit_kmh),
      checkInDistanceM: Number(a.check_in_distance_m),
    })),
    periods: periods.map((p) => ({ id: p.id, name: p.name, startTime: p.start_time, endTime: p.end_time })),
  }
}

export interface CorridorObservationRows {
  positions: PositionRow[]
  stopEvents: StopEventRow[]
  schedule: ScheduledPass[]
}

/** Positions and stop events of the corridor's trips on service days from..to (ISO dates, both included). */
export async function loadObservationRows(db: Db, c: CorridorInfo, from: string | undefined, to: string | undefined): Promise<CorridorObservationRows> {
  const fv = c.feedVersionId
  const tripIds = (await db.execute<{ trip_id: string }>(sql`
    select trip_id from gtfs_trips where feed_version_id = ${fv} and route_id = any(${sql.param(c.routeIds)}) and direction_id = ${c.directionId}`)).rows
    .map((r) => r.trip_id)
  if (tripIds.length === 0) return { positions: [], stopEvents: [], schedule: [] }
  const lo = from ?? '0001-01-01'
  const hi = to ?? '9999-12-31'
  // A reading repeated by later snapshots (same trip, day and time) is one reading.
  const positions = (await db.execute<{
    trip_id: string; service_date: string; start_time: string | null; observed_s: number; lat: number; lon: number
    status: number; stop_id: string | null; stop_sequence: number | null
  }>(sql`
    select distinct on (service_date, trip_id, observed_s)
      trip_id, service_date::text, start_time, observed_s, lat, lon, status, stop_id, stop_sequence
    from realtime_vehicle_observations
    where feed_version_id = ${fv} and service_date between ${lo} and ${hi} and trip_id = any(${sql.param(tripIds)})
    order by service_date, trip_id, observed_s`)).rows
  // The latest report of each stop wins: later snapshots correct earlier ones.
  const stopEvents = (await db.execute<{
    trip_id: string; service_date: string; stop_sequence: number; stop_id: string; arrival_s: number | null; departure_s: number | null
  }>(sql`
    select distinct on (service_date, trip_id, stop_sequence)
      trip_id, service_date::text, stop_sequence, stop_id, arrival_s, departure_s
    from realtime_stop_time_observations
    where feed_version_id = ${fv} and service_date between ${lo} and ${hi} and trip_id = any(${sql.param(tripIds)})
    order by service_date, trip_id, stop_sequence, reported_s desc`)).rows
  const observedTrips = [...new Set([...positions.map((p) => p.trip_id), ...stopEvents.map((e) => e.trip_id)])]
  const stopIds = c.stops.map((s) => s.stopId)
  const schedule = observedTrips.length === 0 ? [] : (await db.execute<{
    trip_id: string; stop_sequence: number; stop_id: string; arrival_time: number; departure_time: number
  }>(sql`
    select trip_id, stop_sequence, stop_id, arrival_time, departure_time from gtfs_stop_times
    where feed_version_id = ${fv} and trip_id = any(${sql.param(observedTrips)}) and stop_id = any(${sql.param(stopIds)})
    order by trip_id, stop_sequence`)).rows
  const num = (v: number | null) => (v === null ? null : Number(v))
  return {
    positions: positions.map((p) => ({
      tripId: p.trip_id, serviceDate: p.service_date, startTime: p.start_time, timeS: Number(p.observed_s), lat: Number(p.lat), lon: Number(p.lon),
      status: Number(p.status), stopId: p.stop_id, stopSequence: num(p.stop_sequence),
    })),
    stopEvents: stopEvents.map((e) => ({
      tripId: e.trip_id, serviceDate: e.service_date, stopSequence: Number(e.stop_sequence), stopId: e.stop_id,
      arrivalS: num(e.arrival_s), departureS: num(e.departure_s),
    })),
    schedule: schedule.map((s) => ({
      tripId: s.trip_id, stopSequence: Number(s.stop_sequence), stopId: s.stop_id, arrivalS: Number(s.arrival_time), departureS: Number(s.departure_time),
    })),
  }
}
