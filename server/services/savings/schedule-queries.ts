// Read-only queries over the GTFS tables that the savings need beyond the corridor's own runs.
import { and, eq, inArray, max, min } from 'drizzle-orm'
import type { DbOrTx } from '../signals/rows'
import { gtfsStopTimes, gtfsTrips } from '../../db/schema'
import { frequencyRunsOf } from '../corridors/gtfs-queries'

export interface RouteTrip { routeId: string; directionId: number; serviceId: string; startS: number; endS: number }

/**
 * Every trip of the routes in both directions, from its first departure to its last arrival
 * (the whole trip, not only the corridor), one per run for trips described by frequencies.txt.
 * The first and last times are taken in the database: only one row per trip comes back.
 */
export async function routeTrips(db: DbOrTx, feedId: number, routeIds: readonly string[]): Promise<RouteTrip[]> {
  if (!routeIds.length) return []
  const rows = await db.select({
    tripId: gtfsTrips.tripId, routeId: gtfsTrips.routeId, directionId: gtfsTrips.directionId, serviceId: gtfsTrips.serviceId,
    startS: min(gtfsStopTimes.departureTime), endS: max(gtfsStopTimes.arrivalTime),
  }).from(gtfsTrips)
    .innerJoin(gtfsStopTimes, and(eq(gtfsStopTimes.feedVersionId, gtfsTrips.feedVersionId), eq(gtfsStopTimes.tripId, gtfsTrips.tripId)))
    .where(and(eq(gtfsTrips.feedVersionId, feedId), inArray(gtfsTrips.routeId, [...routeIds])))
    .groupBy(gtfsTrips.tripId, gtfsTrips.routeId, gtfsTrips.directionId, gtfsTrips.serviceId)
  const shifts = new Map<string, number[]>()
  for (const f of await frequencyRunsOf(db, feedId, rows.map((r) => r.tripId))) shifts.set(f.tripId, [...(shifts.get(f.tripId) ?? []), f.shiftS])
  return rows.flatMap((r) => (r.startS === null || r.endS === null ? [] : (shifts.get(r.tripId) ?? [0]).map((shift) => ({
    routeId: r.routeId, directionId: r.directionId ?? 0, serviceId: r.serviceId, startS: r.startS! + shift, endS: r.endS! + shift,
  }))))
}
