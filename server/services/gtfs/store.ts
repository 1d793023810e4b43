// The one transaction of an import. Each table's rows go by COPY into a fresh table that is then
// attached as the feed's partition: PostgreSQL builds its indexes in bulk and checks its foreign
// key once, far faster than maintaining them row by row. Either every table of the feed is
// attached and the feed marked ready, or nothing is.
import type { PGlite, Transaction } from '@electric-sql/pglite'
import { GTFS_TABLES, type GtfsTable } from '../../db/tables/gtfs'
import type { FeedState } from './feed-state'
import { COPY_HEADER, COPY_TRAILER, type TableWriter } from './writer'
import type { FeedCountsDto, FeedDerivedDto, FeedReportDto } from '../../../shared/schemas/gtfs'

export const partitionName = (table: GtfsTable, feedId: number) => `${table}_f${feedId}`

export interface FeedSummary {
  counts: FeedCountsDto
  derived: FeedDerivedDto
  report: FeedReportDto
  serviceStart: string | null
  serviceEnd: string | null
}

export async function storeFeed(client: PGlite, st: FeedState, summary: FeedSummary): Promise<void> {
  await client.transaction(async (tx) => {
    // Index builds sort in memory up to this much; the default is sized for many connections.
    await tx.exec(`SET LOCAL maintenance_work_mem = '128MB'`)
    for (const table of GTFS_TABLES) {
      const w = st.writers[table]
      const part = partitionName(table, st.feedId)
      // A partition of this id can only be left over from a database whose ids were reset.
      await tx.exec(`DROP TABLE IF EXISTS "${part}"; CREATE TABLE "${part}" (LIKE "${table}" INCLUDING DEFAULTS)`)
      const cols = w.columns.map((c) => `"${c}"`).join(', ')
      for (const chunk of table === 'gtfs_stop_times' ? stopTimesInTripOrder(st) : inFileOrder(w)) {
        await tx.query(`COPY "${part}" (${cols}) FROM '/dev/blob' WITH (FORMAT binary)`, [], { blob: new Blob([COPY_HEADER, chunk, COPY_TRAILER] as Uint8Array<ArrayBuffer>[]) })
      }
      await tx.exec(`ALTER TABLE "${table}" ATTACH PARTITION "${part}" FOR VALUES IN (${st.feedId})`)
    }
    await markFeed(tx, st.feedId, 'ready', summary)
  })
}

function* inFileOrder(w: TableWriter): Generator<Buffer> {
  for (const c of w.chunks) {
    const buf = Buffer.allocUnsafe(c.end - c.start)
    w.read(buf, 0, c.start, c.end)
    yield buf
  }
}

/**
 * Stop times in trip_id order (byte order, as the "C" collation sorts), each trip's rows already
 * in stop_sequence order: the primary key index then builds from presorted rows, several times
 * faster than from the order of the file.
 */
function* stopTimesInTripOrder(st: FeedState): Generator<Buffer> {
  const w = st.writers.gtfs_stop_times
  const seg = st.tripSegment
  const trips = Array.from({ length: st.tripIds.length }, (_, t) => t).filter((t) => seg[2 * t + 1] > seg[2 * t])
  trips.sort((a, b) => Buffer.compare(st.tripBytes[a], st.tripBytes[b]))
  const CHUNK = 16 * 1024 * 1024
  for (let i = 0; i < trips.length;) {
    let size = 0, j = i
    while (j < trips.length && (size === 0 || size < CHUNK)) { size += seg[2 * trips[j] + 1] - seg[2 * trips[j]]; j++ }
    const buf = Buffer.allocUnsafe(size)
    let at = 0
    for (let k = i; k < j; k++) {
      const t = trips[k]
      w.read(buf, at, seg[2 * t], seg[2 * t + 1])
      at += seg[2 * t + 1] - seg[2 * t]
    }
    yield buf
    i = j
  }
}

export async function markFeed(q: PGlite | Transaction, feedId: number, state: 'ready' | 'failed', s: FeedSummary): Promise<void> {
  await q.query(
    `UPDATE feed_versions SET state = $1, counts = $2::jsonb, derived = $3::jsonb, report = $4::jsonb,
       service_start = $5, service_end = $6, error_count = $7, warning_count = $8 WHERE id = $9`,
    [state, JSON.stringify(s.counts), JSON.stringify(s.derived), JSON.stringify(s.report), s.serviceStart, s.serviceEnd,
      s.report.errorCount, s.report.warningCount, feedId],
  )
}

/** Removes a feed version and everything of it: its partitions, then the row (cascading). */
export async function dropFeed(client: PGlite, feedId: number): Promise<void> {
  await client.transaction(async (tx) => {
    for (const table of GTFS_TABLES) await tx.exec(`DROP TABLE IF EXISTS "${partitionName(table, feedId)}"`)
    await tx.query('DELETE FROM feed_versions WHERE id = $1', [feedId])
  })
}
