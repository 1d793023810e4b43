import { doublePrecision, integer, jsonb, pgTable, text, timestamp, unique } from 'drizzle-orm/pg-core'
import { organisations, users } from './auth'
import { corridors } from './corridors'
import type { LoadInput } from '../../../shared/schemas/savings'

// The agency's figures the savings need (shared/schemas/savings.ts): one row of defaults per
// agency (corridor_id null) and, where a corridor differs, one row for that corridor. Planners
// and admins write them; `version` guards concurrent edits.
export const savingsInputs = pgTable('savings_inputs', {
  id: text('id').primaryKey(),
  agencyId: text('agency_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  corridorId: text('corridor_id').references(() => corridors.id, { onDelete: 'cascade' }),
  defaultLoad: doublePrecision('default_load').notNull(),
  loads: jsonb('loads').$type<LoadInput[]>().notNull().default([]),
  costPerRevenueHour: doublePrecision('cost_per_revenue_hour'),
  currency: text('currency').notNull(),
  costYear: integer('cost_year').notNull(),
  layoverShare: doublePrecision('layover_share').notNull(),
  version: integer('version').notNull().default(1),
  updatedAt: timestamp('updated_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
  updatedBy: text('updated_by').references(() => users.id, { onDelete: 'set null' }),
}, (t) => [unique('savings_inputs_scope_uq').on(t.agencyId, t.corridorId).nullsNotDistinct()])
