import { integer, pgTable, primaryKey, text, timestamp, unique } from 'drizzle-orm/pg-core'
import { corridors } from './corridors'
import { feedVersions } from './gtfs'
import { proposalEvaluations, proposalRows } from './proposals'

/**
 * The schedule digest of a corridor on a feed version (shared/savings/schedule-digest.ts), kept
 * because working it out reads every stop time of the corridor. `fingerprint` names what it was
 * built from (stops, approaches, periods); a digest whose fingerprint no longer matches is rebuilt.
 * Stored as json text: read back whole, never queried inside.
 */
export const savingsScheduleDigests = pgTable('savings_schedule_digests', {
  corridorId: text('corridor_id').notNull().references(() => corridors.id, { onDelete: 'cascade' }),
  feedVersionId: integer('feed_version_id').notNull().references(() => feedVersions.id, { onDelete: 'cascade' }),
  fingerprint: text('fingerprint').notNull(),
  digest: text('digest').notNull(),
  builtAt: timestamp('built_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
}, (t) => [unique('savings_schedule_digests_uq').on(t.corridorId, t.feedVersionId)])

/**
 * What the savings read of one row's stored results in one evaluation run (the figures of each
 * period and day type, the person-delay terms, the delay-by-phase table), taken out of the
 * model's stored output once: results of a run never change, and reading them out of the large
 * stored output costs more than the rest of the dashboard. Json text, read back whole.
 */
export const savingsResultDigests = pgTable('savings_result_digests', {
  evaluationId: text('evaluation_id').notNull().references(() => proposalEvaluations.id, { onDelete: 'cascade' }),
  rowId: text('row_id').notNull().references(() => proposalRows.id, { onDelete: 'cascade' }),
  digest: text('digest').notNull(),
}, (t) => [primaryKey({ columns: [t.evaluationId, t.rowId] })])
