import { boolean, doublePrecision, index, integer, pgTable, text, timestamp, uniqueIndex } from 'drizzle-orm/pg-core'
import { organisations, users } from './auth'
import { DAY_TYPES } from '../../../shared/signals/time-of-day'

// Signalised intersections are city assets shared by every corridor that crosses them. Timing
// conventions (two phases, derived cross-street green) are in shared/signals/timing-plan.ts.
// Rows several people edit carry `version`: a write must name the version it read (else 409).
export const intersections = pgTable('intersections', {
  id: text('id').primaryKey(),
  /** The two streets, e.g. "Kestrel Ave & Mill Rd". Unique within a jurisdiction (CSV import key). */
  name: text('name').notNull(),
  lat: doublePrecision('lat').notNull(),
  lon: doublePrecision('lon').notNull(),
  /** The city (organisation of kind 'city') whose engineers keep this signal. */
  jurisdictionId: text('jurisdiction_id').notNull().references(() => organisations.id),
  /** Length of the crosswalk across the bus street, for the pedestrian clearance check. */
  crossingDistanceM: doublePrecision('crossing_distance_m').notNull(),
  /** Shortest walk interval allowed here: 7 s, or as low as 4 s where the city allows it. */
  minPedWalkS: doublePrecision('min_ped_walk_s').notNull().default(7),
  version: integer('version').notNull().default(1),
  createdAt: timestamp('created_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
  updatedBy: text('updated_by').references(() => users.id, { onDelete: 'set null' }),
}, (t) => [
  uniqueIndex('intersections_jurisdiction_name_uq').on(t.jurisdictionId, t.name),
  index('intersections_jurisdiction_idx').on(t.jurisdictionId),
])

/** One timing plan per period of the day; at most one plan is in force per day type and minute. */
export const timingPlans = pgTable('timing_plans', {
  id: text('id').primaryKey(),
  intersectionId: text('intersection_id').notNull().references(() => intersections.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  dayTypes: text('day_types', { enum: DAY_TYPES }).array().notNull(),
  /** "HH:MM"; an end before the start runs past midnight. */
  startTime: text('start_time').notNull(),
  endTime: text('end_time').notNull(),
  cycleS: doublePrecision('cycle_s').notNull(),
  busGreenS: doublePrecision('bus_green_s').notNull(),
  yellowS: doublePrecision('yellow_s').notNull(),
  redClearanceS: doublePrecision('red_clearance_s').notNull(),
  crossMinGreenS: doublePrecision('cross_min_green_s').notNull(),
  pedWalkS: doublePrecision('ped_walk_s').notNull(),
  pedClearanceS: doublePrecision('ped_clearance_s').notNull(),
  offsetS: doublePrecision('offset_s').notNull(),
  pedConcurrent: boolean('ped_concurrent').notNull().default(true),
  version: integer('version').notNull().default(1),
  createdAt: timestamp('created_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
  updatedBy: text('updated_by').references(() => users.id, { onDelete: 'set null' }),
}, (t) => [uniqueIndex('timing_plans_intersection_name_uq').on(t.intersectionId, t.name)])
