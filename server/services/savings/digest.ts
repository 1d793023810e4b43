// The corridor's schedule digest on a feed version (shared/savings/schedule-digest.ts): read
// from storage when it was built from the same stops, approaches and periods, else built from
// the GTFS tables and stored. Building reads every stop time of the corridor, which is why it
// is kept; everything else the dashboard reads is small.
import { createHash } from 'node:crypto'
import { and, asc, eq } from 'drizzle-orm'
import type { DbOrTx } from '../signals/rows'
import { corridorApproaches, corridorPeriods, savingsScheduleDigests } from '../../db/schema'
import { stopsOf, type CorridorRow } from '../corridors/rows'
import { corridorSchedule } from '../corridors/corridor-runs'
import { serviceDaysOf } from '../corridors/gtfs-queries'
import { routeTrips } from './schedule-queries'
import { buildDigest, type ScheduleDigest } from '../../../shared/savings/schedule-digest'
import { dayOfIso } from '../../../shared/gtfs/date'

/** Bump when the digest's shape or rules change: stored digests of another format are rebuilt. */
const DIGEST_FORMAT = 1

export interface FeedForDigest { id: number; serviceStart: string | null; serviceEnd: string | null }

async function sources(db: DbOrTx, corridor: CorridorRow) {
  const [stops, approaches, periods] = await Promise.all([
    stopsOf(db, corridor.id),
    db.select({ id: corridorApproaches.id, distanceM: corridorApproaches.distanceM }).from(corridorApproaches)
      .where(eq(corridorApproaches.corridorId, corridor.id)).orderBy(asc(corridorApproaches.distanceM), asc(corridorApproaches.id)),
    db.select({ id: corridorPeriods.id, name: corridorPeriods.name, startTime: corridorPeriods.startTime, endTime: corridorPeriods.endTime })
      .from(corridorPeriods).where(eq(corridorPeriods.corridorId, corridor.id)).orderBy(asc(corridorPeriods.sortOrder)),
  ])
  return { stops, approaches, periods }
}

function fingerprintOf(corridor: CorridorRow, feedId: number, s: Awaited<ReturnType<typeof sources>>): string {
  const basis = {
    format: DIGEST_FORMAT, feedId, routeIds: corridor.routeIds, directionId: corridor.directionId,
    stops: s.stops.map((x) => [x.stopId, x.distanceM]), approaches: s.approaches.map((a) => [a.id, a.distanceM]),
    periods: s.periods.map((p) => [p.id, p.name, p.startTime, p.endTime]),
  }
  return createHash('sha256').update(JSON.stringify(basis)).digest('hex')
}

export async function corridorDigest(db: DbOrTx, corridor: CorridorRow, feed: FeedForDigest): Promise<ScheduleDigest> {
  const s = await sources(db, corridor)
  const fingerprint = fingerprintOf(corridor, feed.id, s)
  const [stored] = await db.select({ fingerprint: savingsScheduleDigests.fingerprint, digest: savingsScheduleDigests.digest }).from(savingsScheduleDigests)
    .where(and(eq(savingsScheduleDigests.corridorId, corridor.id), eq(savingsScheduleDigests.feedVersionId, feed.id)))
  if (stored?.fingerprint === fingerprint) return JSON.parse(stored.digest) as ScheduleDigest

  // The corridor's runs on that feed: its routes and direction at its stops (by stop_id).
  const onFeed = { ...corridor, feedVersionId: feed.id }
  const schedule = await corridorSchedule(db, onFeed, s.stops, feed)
  const trips = await routeTrips(db, feed.id, corridor.routeIds)
  const serviceIds = [...new Set([...schedule.runs.map((r) => r.serviceId), ...trips.map((t) => t.serviceId)])]
  const digest = buildDigest({
    feedId: feed.id, directionId: corridor.directionId, runs: schedule.runs, stopDistancesM: s.stops.map((x) => x.distanceM),
    approaches: s.approaches, periods: s.periods, trips, serviceDates: await serviceDaysOf(db, feed.id, serviceIds),
    feedRange: feed.serviceStart && feed.serviceEnd ? { startDay: dayOfIso(feed.serviceStart), endDay: dayOfIso(feed.serviceEnd) } : null,
  })
  const text = JSON.stringify(digest)
  await db.insert(savingsScheduleDigests).values({ corridorId: corridor.id, feedVersionId: feed.id, fingerprint, digest: text, builtAt: new Date() })
    .onConflictDoUpdate({ target: [savingsScheduleDigests.corridorId, savingsScheduleDigests.feedVersionId], set: { fingerprint, digest: text, builtAt: new Date() } })
  return digest
}
