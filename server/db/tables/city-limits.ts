import { doublePrecision, integer, pgTable, text, timestamp } from 'drizzle-orm/pg-core'
import { organisations, users } from './auth'
import { LOS_GRADES } from '../../../shared/schemas/model'

// What each city accepts from priority at its signals (shared/schemas/city-limits.ts): one row per
// city, written by its engineers. A null limit is no limit. `version` guards concurrent edits.
export const cityLimits = pgTable('city_limits', {
  orgId: text('org_id').primaryKey().references(() => organisations.id, { onDelete: 'cascade' }),
  maxCrossVc: doublePrecision('max_cross_vc'),
  worstLos: text('worst_los', { enum: LOS_GRADES }),
  maxExtensionS: doublePrecision('max_extension_s'),
  maxEarlyGreenS: doublePrecision('max_early_green_s'),
  minLockoutCycles: integer('min_lockout_cycles').notNull().default(0),
  version: integer('version').notNull().default(1),
  updatedAt: timestamp('updated_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
  updatedBy: text('updated_by').references(() => users.id, { onDelete: 'set null' }),
})
