// Read-only queries over the imported GTFS tables that corridors need. Feed versions never change
// after import, so nothing here has to guard against concurrent edits.
import { and, asc, eq, inArray } from 'drizzle-orm'
import type { DbOrTx } from '../signals/rows'
import {
  feedVersions, gtfsFrequencyTrips, gtfsRoutes, gtfsServiceDates, gtfsShapes, gtfsStopTimes, gtfsStops, gtfsTrips,
} from '../../db/schema'
import { dayOfIso } from '../../../shared/gtfs/date'

export async function feedRow(db: DbOrTx, feedId: number) {
  const [row] = await db.select().from(feedVersions).where(eq(feedVersions.id, feedId))
  return row
}

export async function routesOf(db: DbOrTx, feedId: number, routeIds: readonly string[]) {
  if (!routeIds.length) return []
  return db.select({ routeId: gtfsRoutes.routeId, shortName: gtfsRoutes.routeShortName, longName: gtfsRoutes.routeLongName, color: gtfsRoutes.routeColor })
    .from(gtfsRoutes).where(and(eq(gtfsRoutes.feedVersionId, feedId), inArray(gtfsRoutes.routeId, [...routeIds])))
}

export async function tripsOf(db: DbOrTx, feedId: number, routeIds: readonly string[], directionId: number) {
  return db.select({ tripId: gtfsTrips.tripId, routeId: gtfsTrips.routeId, serviceId: gtfsTrips.serviceId, shapeId: gtfsTrips.shapeId })
    .from(gtfsTrips)
    .where(and(eq(gtfsTrips.feedVersionId, feedId), inArray(gtfsTrips.routeId, [...routeIds]), eq(gtfsTrips.directionId, directionId)))
}

export async function shapePoints(db: DbOrTx, feedId: number, shapeId: string) {
  return db.select({ lat: gtfsShapes.shapePtLat, lon: gtfsShapes.shapePtLon }).from(gtfsShapes)
    .where(and(eq(gtfsShapes.feedVersionId, feedId), eq(gtfsShapes.shapeId, shapeId))).orderBy(asc(gtfsShapes.shapePtSequence))
}

/** Distinct stops served by the trips, with their location. */
export async function stopsServedBy(db: DbOrTx, feedId: number, tripIds: readonly string[]) {
  if (!tripIds.length) return []
  const served = db.selectDistinct({ stopId: gtfsStopTimes.stopId }).from(gtfsStopTimes)
    .where(and(eq(gtfsStopTimes.feedVersionId, feedId), inArray(gtfsStopTimes.tripId, [...tripIds])))
  return db.select({ stopId: gtfsStops.stopId, name: gtfsStops.stopName, lat: gtfsStops.stopLat, lon: gtfsStops.stopLon })
    .from(gtfsStops).where(and(eq(gtfsStops.feedVersionId, feedId), inArray(gtfsStops.stopId, served)))
}

/** Stop times of the trips at the given stops, by trip and sequence. */
export async function stopTimesAt(db: DbOrTx, feedId: number, tripIds: readonly string[], stopIds: readonly string[]) {
  if (!tripIds.length || !stopIds.length) return []
  return db.select({
    tripId: gtfsStopTimes.tripId, stopSequence: gtfsStopTimes.stopSequence, stopId: gtfsStopTimes.stopId,
    arrivalS: gtfsStopTimes.arrivalTime, departureS: gtfsStopTimes.departureTime,
  }).from(gtfsStopTimes)
    .where(and(eq(gtfsStopTimes.feedVersionId, feedId), inArray(gtfsStopTimes.tripId, [...tripIds]), inArray(gtfsStopTimes.stopId, [...stopIds])))
    .orderBy(asc(gtfsStopTimes.tripId), asc(gtfsStopTimes.stopSequence))
}

/** Runs described by frequencies.txt: the template trip and the shift of each run. */
export async function frequencyRunsOf(db: DbOrTx, feedId: number, tripIds: readonly string[]) {
  if (!tripIds.length) return []
  return db.select({ tripId: gtfsFrequencyTrips.tripId, shiftS: gtfsFrequencyTrips.shiftS }).from(gtfsFrequencyTrips)
    .where(and(eq(gtfsFrequencyTrips.feedVersionId, feedId), inArray(gtfsFrequencyTrips.tripId, [...tripIds])))
}

/** Active day numbers of each service. */
export async function serviceDaysOf(db: DbOrTx, feedId: number, serviceIds: readonly string[]): Promise<Map<string, number[]>> {
  const out = new Map<string, number[]>()
  if (!serviceIds.length) return out
  const rows = await db.select({ serviceId: gtfsServiceDates.serviceId, date: gtfsServiceDates.date }).from(gtfsServiceDates)
    .where(and(eq(gtfsServiceDates.feedVersionId, feedId), inArray(gtfsServiceDates.serviceId, [...serviceIds])))
  for (const r of rows) {
    const list = out.get(r.serviceId) ?? []
    list.push(dayOfIso(r.date))
    out.set(r.serviceId, list)
  }
  return out
}
