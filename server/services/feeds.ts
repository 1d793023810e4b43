// Feed versions as the API sees them: upload (one import at a time), list, detail with the
// report, delete, and the small read queries other screens need (routes, a shape).
import { rm } from 'node:fs/promises'
import { and, asc, count, desc, eq, inArray, sql } from 'drizzle-orm'
import type { User } from 'lucia'
import type { Db } from '../db'
import { feedVersions, gtfsFrequencyTrips, gtfsRoutes, gtfsShapes, gtfsTrips, jobs, users } from '../db/schema'
import { Conflict, NotFound } from '../errors'
import { activeJobs, createJob, runJob } from './jobs'
import { createFeedVersion, importFeedFromFile } from './gtfs/import'
import { dropFeed } from './gtfs/store'
import type { GtfsLimits } from './gtfs/limits'
import type { FeedDetailDto, FeedSummaryDto, FeedUploadedDto, RouteSummaryDto, ShapeDto } from '../../shared/schemas/gtfs'

export const IMPORT_JOB_KIND = 'gtfs-import'

/** The import running in this process, per database. One at a time: it is memory- and CPU-heavy. */
const running = new WeakMap<Db, string>()

export interface UploadedFile {
  path: string
  originalname: string
}

export async function startFeedImport(db: Db, user: User, file: UploadedFile, name: string | undefined, limits: Partial<GtfsLimits>): Promise<FeedUploadedDto> {
  const current = running.get(db)
  if (current) {
    await rm(file.path, { force: true })
    throw new Conflict('A feed is being imported; wait for it to finish before uploading another.', { jobId: current })
  }
  const placeholder = 'starting'
  running.set(db, placeholder)
  try {
    await failStaleImports(db)
    const jobId = await createJob(db, IMPORT_JOB_KIND, user.id)
    running.set(db, jobId)
    const feedId = await createFeedVersion(db, { organisationId: user.organisationId, userId: user.id, name: name ?? file.originalname, jobId })
    void runJob(db, jobId, (report) => importFeedFromFile(db, {
      feedId, jobId, organisationId: user.organisationId, userId: user.id, name: name ?? file.originalname, path: file.path, limits,
    }, report)).finally(async () => {
      running.delete(db)
      await rm(file.path, { force: true })
    })
    return { feedId, jobId }
  } catch (err) {
    running.delete(db)
    await rm(file.path, { force: true })
    throw err
  }
}

/** Jobs and feeds left running by a server that stopped mid-import: nothing of this process runs them. */
async function failStaleImports(db: Db) {
  const stale = (await activeJobs(db, IMPORT_JOB_KIND)).map((j) => j.id)
  if (stale.length) {
    await db.update(jobs).set({ state: 'failed', stage: 'failed', message: 'The import was interrupted when the server stopped.', updatedAt: new Date() })
      .where(inArray(jobs.id, stale))
  }
  await db.update(feedVersions).set({ state: 'failed' }).where(eq(feedVersions.state, 'importing'))
}

/** Admins see every organisation's feeds; others their own organisation's. */
function visibleTo(user: User) {
  return user.role === 'admin' ? undefined : eq(feedVersions.organisationId, user.organisationId)
}

const summaryColumns = {
  id: feedVersions.id, name: feedVersions.name, state: feedVersions.state, organisationId: feedVersions.organisationId,
  uploadedAt: feedVersions.uploadedAt, serviceStart: feedVersions.serviceStart, serviceEnd: feedVersions.serviceEnd,
  errorCount: feedVersions.errorCount, warningCount: feedVersions.warningCount, jobId: feedVersions.jobId,
  uploaderId: users.id, uploaderName: users.name,
}
type SummaryRow = { [K in keyof typeof summaryColumns]: (typeof summaryColumns)[K]['_']['data'] | null }

function toSummary(r: SummaryRow): FeedSummaryDto {
  return {
    id: r.id!, name: r.name!, state: r.state!, organisationId: r.organisationId!,
    uploadedBy: r.uploaderId ? { id: r.uploaderId, name: r.uploaderName! } : null,
    uploadedAt: r.uploadedAt!.toISOString(), serviceStart: r.serviceStart, serviceEnd: r.serviceEnd,
    errorCount: r.errorCount!, warningCount: r.warningCount!, jobId: r.jobId,
  }
}

export async function listFeeds(db: Db, user: User): Promise<FeedSummaryDto[]> {
  const rows = await db.select(summaryColumns).from(feedVersions).leftJoin(users, eq(users.id, feedVersions.uploadedBy))
    .where(visibleTo(user)).orderBy(desc(feedVersions.uploadedAt), desc(feedVersions.id))
  return rows.map(toSummary)
}

async function visibleFeed(db: Db, user: User, id: number) {
  const [row] = await db.select({ ...summaryColumns, counts: feedVersions.counts, derived: feedVersions.derived, report: feedVersions.report })
    .from(feedVersions).leftJoin(users, eq(users.id, feedVersions.uploadedBy))
    .where(and(eq(feedVersions.id, id), visibleTo(user)))
  if (!row) throw new NotFound('Feed')
  return row
}

export async function getFeed(db: Db, user: User, id: number): Promise<FeedDetailDto> {
  const row = await visibleFeed(db, user, id)
  return {
    ...toSummary(row),
    counts: row.counts ?? null,
    derived: row.derived ?? null,
    report: row.report ?? { errors: [], warnings: [], errorCount: 0, warningCount: 0, kinds: [] },
  }
}

export async function deleteFeed(db: Db, user: User, id: number): Promise<void> {
  const row = await visibleFeed(db, user, id)
  if (row.state === 'importing') throw new Conflict('The feed is still being imported; delete it once the import has finished.')
  try {
    await dropFeed(db.$client, id)
  } catch (err) {
    // Corridors (and what hangs off them) keep their feed version: no cascade on purpose.
    if ((err as { code?: string }).code === '23503') {
      throw new Conflict('Corridors use this feed version; delete them (or move them to another feed) first.')
    }
    throw err
  }
}

async function readyFeed(db: Db, user: User, id: number) {
  const row = await visibleFeed(db, user, id)
  if (row.state !== 'ready') throw new NotFound('Imported feed')
  return row
}

export async function feedRoutes(db: Db, user: User, id: number): Promise<RouteSummaryDto[]> {
  await readyFeed(db, user, id)
  const routes = await db.select().from(gtfsRoutes).where(eq(gtfsRoutes.feedVersionId, id))
    .orderBy(asc(gtfsRoutes.routeSortOrder), asc(gtfsRoutes.routeShortName), asc(gtfsRoutes.routeId))
  // Trips per route, direction, shape and headsign; frequency templates count once per run.
  const runs = db.select({ tripId: gtfsFrequencyTrips.tripId, runs: count().as('runs') }).from(gtfsFrequencyTrips)
    .where(eq(gtfsFrequencyTrips.feedVersionId, id)).groupBy(gtfsFrequencyTrips.tripId).as('runs')
  const groups = await db.select({
    routeId: gtfsTrips.routeId, directionId: gtfsTrips.directionId, shapeId: gtfsTrips.shapeId, headsign: gtfsTrips.tripHeadsign,
    trips: count(), expanded: sql<number>`sum(coalesce(${runs.runs}, 1))`.mapWith(Number),
  }).from(gtfsTrips)
    .leftJoin(runs, eq(runs.tripId, gtfsTrips.tripId))
    .where(eq(gtfsTrips.feedVersionId, id))
    .groupBy(gtfsTrips.routeId, gtfsTrips.directionId, gtfsTrips.shapeId, gtfsTrips.tripHeadsign)
  return routes.map((r) => {
    const mine = groups.filter((g) => g.routeId === r.routeId)
    const dirs = [...new Set(mine.map((g) => g.directionId))].sort((a, b) => (a ?? -1) - (b ?? -1))
    return {
      routeId: r.routeId, agencyId: r.agencyId || null, shortName: r.routeShortName, longName: r.routeLongName, type: r.routeType,
      color: r.routeColor, textColor: r.routeTextColor,
      tripCount: mine.reduce((s, g) => s + g.trips, 0),
      directions: dirs.map((d) => {
        const inDir = mine.filter((g) => g.directionId === d)
        const shapes = new Map<string, number>()
        for (const g of inDir) if (g.shapeId) shapes.set(g.shapeId, (shapes.get(g.shapeId) ?? 0) + g.trips)
        const headsigns = new Map<string, number>()
        for (const g of inDir) if (g.headsign) headsigns.set(g.headsign, (headsigns.get(g.headsign) ?? 0) + g.trips)
        return {
          directionId: d,
          tripCount: inDir.reduce((s, g) => s + g.trips, 0),
          expandedTripCount: inDir.reduce((s, g) => s + g.expanded, 0),
          headsigns: [...headsigns].sort((a, b) => b[1] - a[1]).map(([h]) => h),
          shapes: [...shapes].sort((a, b) => b[1] - a[1]).map(([shapeId, tripCount]) => ({ shapeId, tripCount })),
        }
      }),
    }
  })
}

export async function feedShape(db: Db, user: User, id: number, shapeId: string): Promise<ShapeDto> {
  await readyFeed(db, user, id)
  const points = await db.select({ sequence: gtfsShapes.shapePtSequence, lat: gtfsShapes.shapePtLat, lon: gtfsShapes.shapePtLon, distM: gtfsShapes.distM })
    .from(gtfsShapes).where(and(eq(gtfsShapes.feedVersionId, id), eq(gtfsShapes.shapeId, shapeId))).orderBy(asc(gtfsShapes.shapePtSequence))
  if (!points.length) throw new NotFound('Shape')
  return { shapeId, lengthM: points[points.length - 1].distM - points[0].distM, points }
}
