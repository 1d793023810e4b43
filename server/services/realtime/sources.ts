// Realtime feed URLs an agency has Fanlight poll, and one poll of a source. The timer that polls
// them is poller.ts, started by the server process (or a test), never by importing this file.
import { randomUUID } from 'node:crypto'
import { and, eq, sql } from 'drizzle-orm'
import type { User } from 'lucia'
import type { Db } from '../../db'
import type { Clock } from '../../clock'
import { organisations, realtimeSnapshots, realtimeSources } from '../../db/schema'
import { Forbidden, NotFound } from '../../errors'
import { resolveFeedVersion } from './feed-version'
import { ingestFile } from './ingest'
import { tripIndexFor } from './trip-index'
import type { RealtimeFileResultDto, RealtimeSourceBody, RealtimeSourceDto } from '../../../shared/schemas/realtime'

/** A feed larger than this is refused; a FULL_DATASET of a big city is a few MB. */
const MAX_FEED_BYTES = 32 * 1024 * 1024
const FETCH_TIMEOUT_MS = 15_000

type SourceRow = typeof realtimeSources.$inferSelect

async function toDto(db: Db, rows: SourceRow[]): Promise<RealtimeSourceDto[]> {
  if (rows.length === 0) return []
  const counts = await db.select({ sourceId: realtimeSnapshots.sourceId, n: sql<number>`count(*)::int` }).from(realtimeSnapshots)
    .where(sql`${realtimeSnapshots.sourceId} in ${rows.map((r) => r.id)}`).groupBy(realtimeSnapshots.sourceId)
  const orgs = await db.select({ id: organisations.id, name: organisations.name }).from(organisations)
  return rows.map((r) => ({
    id: r.id,
    organisationId: r.organisationId,
    organisationName: orgs.find((o) => o.id === r.organisationId)?.name ?? '',
    feedVersionId: r.feedVersionId,
    name: r.name,
    url: r.url,
    intervalS: r.intervalS,
    active: r.active,
    lastPolledAt: r.lastPolledAt?.toISOString() ?? null,
    lastOutcome: r.lastOutcome,
    lastMessage: r.lastMessage,
    pollCount: r.pollCount,
    snapshots: counts.find((c) => c.sourceId === r.id)?.n ?? 0,
  }))
}

/** Sources of the user's agency; an admin sees every agency's. */
export async function listSources(db: Db, user: User): Promise<RealtimeSourceDto[]> {
  const rows = user.role === 'admin'
    ? await db.select().from(realtimeSources).orderBy(realtimeSources.createdAt)
    : await db.select().from(realtimeSources).where(eq(realtimeSources.organisationId, user.organisationId)).orderBy(realtimeSources.createdAt)
  return toDto(db, rows)
}

export async function createSource(db: Db, user: User, body: RealtimeSourceBody): Promise<RealtimeSourceDto> {
  const feed = await resolveFeedVersion(db, user, body.feedVersionId)
  const [row] = await db.insert(realtimeSources).values({
    id: randomUUID(), organisationId: feed.organisationId, feedVersionId: feed.id, name: body.name, url: body.url,
    intervalS: body.intervalS, createdBy: user.id,
  }).returning()
  return (await toDto(db, [row]))[0]
}

async function ownSource(db: Db, user: User, id: string): Promise<SourceRow> {
  const [row] = await db.select().from(realtimeSources).where(eq(realtimeSources.id, id))
  if (!row) throw new NotFound('Realtime source')
  if (user.role !== 'admin' && row.organisationId !== user.organisationId) throw new Forbidden('That source belongs to another agency.')
  return row
}

/** Stops polling; the snapshots already taken stay (their source link is cleared). */
export async function deleteSource(db: Db, user: User, id: string): Promise<void> {
  await ownSource(db, user, id)
  await db.delete(realtimeSources).where(eq(realtimeSources.id, id))
}

async function fetchFeed(url: string): Promise<Uint8Array> {
  const res = await fetch(url, { signal: AbortSignal.timeout(FETCH_TIMEOUT_MS), headers: { accept: 'application/x-protobuf, application/octet-stream' } })
  if (!res.ok) throw new Error(`the feed answered HTTP ${res.status}`)
  const declared = Number(res.headers.get('content-length') ?? 0)
  if (declared > MAX_FEED_BYTES) throw new Error(`the feed is ${declared} bytes, more than ${MAX_FEED_BYTES}`)
  const data = new Uint8Array(await res.arrayBuffer())
  if (data.length > MAX_FEED_BYTES) throw new Error(`the feed is more than ${MAX_FEED_BYTES} bytes`)
  return data
}

/** Fetches the source once and stores the snapshot; the outcome is recorded on the source. */
export async function pollSource(db: Db, clock: Clock, source: SourceRow): Promise<RealtimeFileResultDto> {
  const describe = (err: unknown) =>
    err instanceof Error ? (err.cause instanceof Error ? `${err.message} (${err.cause.message})` : err.message) : String(err)
  let result: RealtimeFileResultDto
  let data: Uint8Array | null = null
  try {
    data = await fetchFeed(source.url)
  } catch (err) {
    result = { file: source.url, status: 'error', error: { code: 'fetch_failed', message: `Polling failed: ${describe(err)}.` } }
  }
  if (data) {
    try {
      const ix = await tripIndexFor(db, source.feedVersionId)
      result = await ingestFile({ db, clock, feedVersionId: source.feedVersionId, sourceId: source.id }, ix, `${source.name} ${clock.now().toISOString()}`, data)
    } catch (err) {
      result = { file: source.url, status: 'error', error: { code: 'poll_failed', message: `The snapshot could not be stored: ${describe(err)}.` } }
    }
  }
  result = result!
  const message = result.status === 'error'
    ? result.error!.message
    : result.status === 'duplicate' ? 'The feed had not changed since the last poll.' : `Stored ${result.vehicles ?? 0} vehicles, ${result.tripUpdates ?? 0} trip updates (${result.unmatched ?? 0} unmatched).`
  await db.update(realtimeSources)
    .set({ lastPolledAt: clock.now(), lastOutcome: result.status, lastMessage: message, pollCount: sql`${realtimeSources.pollCount} + 1` })
    .where(and(eq(realtimeSources.id, source.id)))
  return result
}

/** "Poll now" from the page: the same as a timed poll. */
export async function pollSourceNow(db: Db, clock: Clock, user: User, id: string): Promise<RealtimeFileResultDto> {
  return pollSource(db, clock, await ownSource(db, user, id))
}
