import { doublePrecision, index, integer, pgTable, primaryKey, smallint, text, timestamp, uniqueIndex } from 'drizzle-orm/pg-core'
import { organisations, users } from './auth'
import { feedVersions } from './gtfs'
import { intersections } from './signals'
import { STOP_RELATIONS } from '../../../shared/corridors/approach-rules'

// A corridor: one or more routes of an imported feed version that share a street, in one
// direction, measured along one representative shape. Feed versions never change once imported,
// so the stops along the shape are computed once (at creation) and kept in corridor_stops; the
// schedule figures are computed from the GTFS tables when asked. A feed version with corridors
// cannot be deleted (no cascade: proposals and decisions hang off the corridor).
export const corridors = pgTable('corridors', {
  id: text('id').primaryKey(),
  /** The agency (organisation) that owns the feed; its planners edit the corridor. */
  agencyId: text('agency_id').notNull().references(() => organisations.id),
  feedVersionId: integer('feed_version_id').notNull().references(() => feedVersions.id),
  name: text('name').notNull(),
  routeIds: text('route_ids').array().notNull(),
  directionId: smallint('direction_id').notNull(),
  shapeId: text('shape_id').notNull(),
  lengthM: doublePrecision('length_m').notNull(),
  version: integer('version').notNull().default(1),
  createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
  createdAt: timestamp('created_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
}, (t) => [index('corridors_feed_idx').on(t.feedVersionId)])

/** The corridor's stops in order along its shape (index `seq` from 0). */
export const corridorStops = pgTable('corridor_stops', {
  corridorId: text('corridor_id').notNull().references(() => corridors.id, { onDelete: 'cascade' }),
  seq: integer('seq').notNull(),
  stopId: text('stop_id').notNull(),
  name: text('name').notNull(),
  lat: doublePrecision('lat').notNull(),
  lon: doublePrecision('lon').notNull(),
  /** Along the representative shape, from its first point. */
  distanceM: doublePrecision('distance_m').notNull(),
  /** From the stop to the shape. */
  offsetM: doublePrecision('offset_m').notNull(),
}, (t) => [primaryKey({ columns: [t.corridorId, t.seq] })])

/** Periods of the day (volumes, plans and results are given per period). Edited with the corridor. */
export const corridorPeriods = pgTable('corridor_periods', {
  id: text('id').primaryKey(),
  corridorId: text('corridor_id').notNull().references(() => corridors.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  /** "HH:MM"; an end before the start runs past midnight. */
  startTime: text('start_time').notNull(),
  endTime: text('end_time').notNull(),
  sortOrder: integer('sort_order').notNull(),
}, (t) => [index('corridor_periods_corridor_idx').on(t.corridorId)])

/**
 * The corridor's approach at one intersection: where it is along the corridor, the traffic data
 * of the approach and its cross street, and the stop next to it.
 */
export const corridorApproaches = pgTable('corridor_approaches', {
  id: text('id').primaryKey(),
  corridorId: text('corridor_id').notNull().references(() => corridors.id, { onDelete: 'cascade' }),
  intersectionId: text('intersection_id').notNull().references(() => intersections.id),
  /** Stop line position along the corridor's shape. */
  distanceM: doublePrecision('distance_m').notNull(),
  /** From the snapped point to the shape, when the position came from a snap; null when given by hand. */
  snapOffsetM: doublePrecision('snap_offset_m'),
  lanes: integer('lanes').notNull(),
  saturationFlowVehPerHourPerLane: doublePrecision('saturation_flow_veh_per_hour_per_lane').notNull().default(1800),
  speedLimitKmh: doublePrecision('speed_limit_kmh').notNull(),
  jamDensityVehPerKmPerLane: doublePrecision('jam_density_veh_per_km_per_lane').notNull().default(133),
  /** Lanes of the cross-street approach the model weighs (the busier of the two directions). */
  crossLanes: integer('cross_lanes').notNull(),
  crossSaturationFlowVehPerHourPerLane: doublePrecision('cross_saturation_flow_veh_per_hour_per_lane').notNull().default(1800),
  stopRelation: text('stop_relation', { enum: STOP_RELATIONS }).notNull().default('none'),
  /** GTFS stop_id of a corridor stop; null when stopRelation is 'none'. */
  stopId: text('stop_id'),
  /** Mean dwell at that stop; null when stopRelation is 'none'. */
  dwellS: doublePrecision('dwell_s'),
  /** Upstream of the stop line, where a bus sends its priority request. */
  checkInDistanceM: doublePrecision('check_in_distance_m').notNull().default(150),
  version: integer('version').notNull().default(1),
  updatedBy: text('updated_by').references(() => users.id, { onDelete: 'set null' }),
  createdAt: timestamp('created_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
}, (t) => [
  uniqueIndex('corridor_approaches_corridor_intersection_uq').on(t.corridorId, t.intersectionId),
  index('corridor_approaches_intersection_idx').on(t.intersectionId),
])

/** Volumes of an approach and of its cross street in one period of the corridor. */
export const approachVolumes = pgTable('approach_volumes', {
  approachId: text('approach_id').notNull().references(() => corridorApproaches.id, { onDelete: 'cascade' }),
  periodId: text('period_id').notNull().references(() => corridorPeriods.id, { onDelete: 'cascade' }),
  /** All lanes of the corridor approach together. */
  volumeVehPerHour: doublePrecision('volume_veh_per_hour').notNull(),
  /** The busier cross-street approach, all its lanes (see crossLanes). */
  crossVolumeVehPerHour: doublePrecision('cross_volume_veh_per_hour').notNull(),
}, (t) => [primaryKey({ columns: [t.approachId, t.periodId] })])
