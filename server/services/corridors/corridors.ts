// Corridors: built from an imported feed version (routes, a direction, a representative shape),
// listed, shown with their schedule figures, renamed, given periods, deleted.
import { randomUUID } from 'node:crypto'
import type { User } from 'lucia'
import { and, asc, count, desc, eq, inArray, sql } from 'drizzle-orm'
import type { DbOrTx } from '../signals/rows'
import { corridorApproaches, corridorPeriods, corridors, corridorStops, feedVersions, proposals } from '../../db/schema'
import { Conflict, NotFound, Unprocessable } from '../../errors'
import { feedRow, routesOf, shapePoints, stopsServedBy, tripsOf } from './gtfs-queries'
import { approachDtos, assertMayEditCorridor, corridorRow, periodsOf, stopsOf, type CorridorRow } from './rows'
import { corridorSchedule } from './corridor-runs'
import { DEFAULT_PERIODS, checkPeriods } from '../../../shared/corridors/periods'
import { shapeLine, snapToShape, STOP_MAX_OFFSET_M } from '../../../shared/corridors/shape-line'
import { hourlyTrips, runTimesBetweenStops, tripsByPeriod } from '../../../shared/corridors/schedule'
import { DAY_TYPES, windowMinutes } from '../../../shared/signals/time-of-day'
import type { CorridorCreateBody, CorridorDetailDto, CorridorPatchBody, CorridorSummaryDto } from '../../../shared/schemas/corridors'

const invalid = (path: (string | number)[], message: string) => new Unprocessable(message, [{ path, message }])

/** Picks the shape, finds the corridor's stops along it and stores the corridor with the default periods. */
export async function createCorridor(db: DbOrTx, actor: User, body: CorridorCreateBody): Promise<CorridorDetailDto> {
  const feed = await feedRow(db, body.feedId)
  if (!feed || feed.state !== 'ready') throw invalid(['feedId'], feed ? 'This feed version has not finished importing.' : 'No such feed version.')
  assertMayEditCorridor(actor, { agencyId: feed.organisationId })
  const routes = await routesOf(db, feed.id, body.routeIds)
  body.routeIds.forEach((r, i) => { if (!routes.some((x) => x.routeId === r)) throw invalid(['routeIds', i], `Route "${r}" is not in this feed.`) })
  const trips = await tripsOf(db, feed.id, body.routeIds, body.directionId)
  if (!trips.length) throw invalid(['directionId'], `The routes have no trips in direction ${body.directionId}.`)

  const shapeCounts = new Map<string, number>()
  for (const t of trips) if (t.shapeId) shapeCounts.set(t.shapeId, (shapeCounts.get(t.shapeId) ?? 0) + 1)
  let shapeId = body.shapeId
  if (shapeId && !shapeCounts.has(shapeId)) throw invalid(['shapeId'], `No trip of these routes in this direction follows shape "${shapeId}".`)
  // The representative shape by default: the one most trips follow.
  shapeId ??= [...shapeCounts].sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0]))[0]?.[0]
  if (!shapeId) throw invalid(['shapeId'], 'The trips have no shape; a corridor is measured along one.')
  const line = shapeLine(await shapePoints(db, feed.id, shapeId))
  if (line.lengthM <= 0) throw invalid(['shapeId'], `Shape "${shapeId}" has no length.`)

  const candidates = await stopsServedBy(db, feed.id, trips.map((t) => t.tripId))
  const stops = candidates
    .filter((s): s is typeof s & { lat: number; lon: number } => s.lat !== null && s.lon !== null)
    .map((s) => ({ ...s, ...snapToShape(line, s.lat, s.lon) }))
    .filter((s) => s.offsetM <= STOP_MAX_OFFSET_M)
    .sort((a, b) => a.distanceM - b.distanceM || a.stopId.localeCompare(b.stopId))
  if (stops.length < 2) throw invalid(['shapeId'], `Fewer than two stops of these trips lie within ${STOP_MAX_OFFSET_M} m of shape "${shapeId}".`)

  const id = randomUUID()
  await db.transaction(async (tx) => {
    await tx.insert(corridors).values({
      id, agencyId: feed.organisationId, feedVersionId: feed.id, name: body.name, routeIds: body.routeIds,
      directionId: body.directionId, shapeId, lengthM: line.lengthM, createdBy: actor.id,
    })
    await tx.insert(corridorStops).values(stops.map((s, seq) => ({
      corridorId: id, seq, stopId: s.stopId, name: s.name ?? s.stopId, lat: s.lat, lon: s.lon, distanceM: s.distanceM, offsetM: s.offsetM,
    })))
    await tx.insert(corridorPeriods).values(DEFAULT_PERIODS.map((p, i) => ({ id: randomUUID(), corridorId: id, ...p, sortOrder: i })))
  })
  return getCorridor(db, id)
}

async function summaries(db: DbOrTx, rows: CorridorRow[]): Promise<CorridorSummaryDto[]> {
  if (!rows.length) return []
  const ids = rows.map((r) => r.id)
  const feeds = await db.select({ id: feedVersions.id, name: feedVersions.name }).from(feedVersions).where(inArray(feedVersions.id, [...new Set(rows.map((r) => r.feedVersionId))]))
  const stopCounts = await db.select({ id: corridorStops.corridorId, n: count() }).from(corridorStops).where(inArray(corridorStops.corridorId, ids)).groupBy(corridorStops.corridorId)
  const approachCounts = await db.select({ id: corridorApproaches.corridorId, n: count() }).from(corridorApproaches).where(inArray(corridorApproaches.corridorId, ids)).groupBy(corridorApproaches.corridorId)
  const out: CorridorSummaryDto[] = []
  for (const r of rows) {
    const routes = await routesOf(db, r.feedVersionId, r.routeIds)
    out.push({
      id: r.id, name: r.name, agencyId: r.agencyId, feedId: r.feedVersionId, feedName: feeds.find((f) => f.id === r.feedVersionId)?.name ?? '',
      routes: r.routeIds.map((routeId) => routes.find((x) => x.routeId === routeId) ?? { routeId, shortName: null, longName: null, color: null }),
      directionId: r.directionId, shapeId: r.shapeId, lengthM: r.lengthM,
      stopCount: stopCounts.find((c) => c.id === r.id)?.n ?? 0, approachCount: approachCounts.find((c) => c.id === r.id)?.n ?? 0,
      version: r.version, createdAt: r.createdAt.toISOString(),
    })
  }
  return out
}

export async function listCorridors(db: DbOrTx, filter: { feedId?: number } = {}): Promise<CorridorSummaryDto[]> {
  const rows = await db.select().from(corridors).where(filter.feedId ? eq(corridors.feedVersionId, filter.feedId) : undefined)
    .orderBy(asc(corridors.name), desc(corridors.createdAt))
  return summaries(db, rows)
}

export async function getCorridor(db: DbOrTx, id: string): Promise<CorridorDetailDto> {
  const row = await corridorRow(db, id)
  const [summary] = await summaries(db, [row])
  const [stops, periods, approaches, feed] = [await stopsOf(db, id), await periodsOf(db, id), await approachDtos(db, id), await feedRow(db, row.feedVersionId)]
  if (!feed) throw new NotFound('Feed version of the corridor')
  const schedule = await corridorSchedule(db, row, stops, feed)
  const runTimes = runTimesBetweenStops(schedule.runs, stops.length).map((rt) => ({
    fromStopId: stops[rt.fromStop].stopId, toStopId: stops[rt.toStop].stopId,
    fromDistanceM: stops[rt.fromStop].distanceM, toDistanceM: stops[rt.toStop].distanceM, medianS: rt.medianS, trips: rt.trips,
  }))
  const tripsPerDay = { weekday: 0, saturday: 0, sunday: 0 }
  for (const r of schedule.runs) { const s = schedule.share(r.serviceId); for (const d of DAY_TYPES) tripsPerDay[d] += s[d] }
  const shape = await shapePoints(db, row.feedVersionId, row.shapeId)
  const line = shapeLine(shape)
  return {
    ...summary,
    periods,
    stops: stops.map((s) => ({ seq: s.seq, stopId: s.stopId, name: s.name, lat: s.lat, lon: s.lon, distanceM: s.distanceM, offsetM: s.offsetM })),
    runTimes,
    serviceDays: schedule.serviceDays,
    tripsPerDay,
    tripsByPeriod: tripsByPeriod(schedule.runs, schedule.share, periods.map((p) => ({ ...p, minutes: windowMinutes(p) }))),
    hourlyTrips: hourlyTrips(schedule.runs, schedule.share),
    approaches,
    shape: shape.map((p, i) => ({ lat: p.lat, lon: p.lon, distM: line.cumM[i] })),
  }
}

async function staleCorridor(db: DbOrTx, id: string) {
  return new Conflict('Someone else changed this corridor since you opened it. Here is the current version.', { current: await getCorridor(db, id) })
}

/** Renames the corridor and/or replaces its periods (ids kept for periods that stay). */
export async function patchCorridor(db: DbOrTx, actor: User, id: string, body: CorridorPatchBody): Promise<CorridorDetailDto> {
  const row = await corridorRow(db, id)
  assertMayEditCorridor(actor, row)
  if (body.version !== row.version) throw await staleCorridor(db, id)
  const current = await periodsOf(db, id)
  if (body.periods) {
    const issues = checkPeriods(body.periods).map((i) => ({ path: ['periods', ...i.path], message: i.message }))
    body.periods.forEach((p, i) => {
      if (p.id && !current.some((c) => c.id === p.id)) issues.push({ path: ['periods', i, 'id'], message: 'Not a period of this corridor.' })
    })
    if (new Set(body.periods.filter((p) => p.id).map((p) => p.id)).size !== body.periods.filter((p) => p.id).length) {
      issues.push({ path: ['periods'], message: 'A period id appears twice.' })
    }
    if (issues.length) throw new Unprocessable('The periods are not valid.', issues)
  }
  await db.transaction(async (tx) => {
    const [updated] = await tx.update(corridors)
      .set({ ...(body.name ? { name: body.name } : {}), version: sql`${corridors.version} + 1`, updatedAt: sql`now()` })
      .where(and(eq(corridors.id, id), eq(corridors.version, body.version))).returning({ id: corridors.id })
    if (!updated) throw await staleCorridor(tx, id)
    if (!body.periods) return
    const keep = body.periods.filter((p) => p.id).map((p) => p.id as string)
    for (const c of current) if (!keep.includes(c.id)) await tx.delete(corridorPeriods).where(eq(corridorPeriods.id, c.id))
    for (const [i, p] of body.periods.entries()) {
      const values = { name: p.name, startTime: p.startTime, endTime: p.endTime, sortOrder: i }
      if (p.id) await tx.update(corridorPeriods).set(values).where(eq(corridorPeriods.id, p.id))
      else await tx.insert(corridorPeriods).values({ id: randomUUID(), corridorId: id, ...values })
    }
  })
  return getCorridor(db, id)
}

export async function deleteCorridor(db: DbOrTx, actor: User, id: string, version?: number): Promise<void> {
  const row = await corridorRow(db, id)
  assertMayEditCorridor(actor, row)
  if (version !== undefined && version !== row.version) throw await staleCorridor(db, id)
  // Proposals and their decisions hang off the corridor (no cascade): refuse rather than fail.
  const [used] = await db.select({ n: count() }).from(proposals).where(eq(proposals.corridorId, id))
  if (used.n > 0) throw new Conflict(`This corridor has ${used.n} priority proposal${used.n === 1 ? '' : 's'}; it cannot be deleted.`)
  await db.delete(corridors).where(eq(corridors.id, id))
}
