// The one transaction of an import. Each table's rows go by COPY into a fresh table that is then
// attached as the feed's partition: PostgreSQL builds its indexes in bulk and checks its foreign
// key once, far faster than maintaining them row by row. Either every table of the feed is
// attached and the feed marked ready, or nothing is.
import { openAsBlob } from 'node:fs'
import type { PGlite, Transaction } from '@electric-sql/pglite'
import { GTFS_TABLES, type GtfsTable } from '../../db/tables/gtfs'
import type { FeedState } from './feed-state'
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
      if (w.chunks.length) {
        const cols = w.columns.map((c) => `"${c}"`).join(', ')
        const blob = await openAsBlob(w.file)
        for (const c of w.chunks) {
          await tx.query(`COPY "${part}" (${cols}) FROM '/dev/blob' WITH (FORMAT csv)`, [], { blob: blob.slice(c.start, c.end) })
        }
      }
      await tx.exec(`ALTER TABLE "${table}" ATTACH PARTITION "${part}" FOR VALUES IN (${st.feedId})`)
    }
    await markFeed(tx, st.feedId, 'ready', summary)
  })
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
