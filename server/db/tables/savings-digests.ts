import { integer, pgTable, text, timestamp, unique } from 'drizzle-orm/pg-core'
import { corridors } from './corridors'
import { feedVersions } from './gtfs'

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
