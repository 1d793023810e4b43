import { bigint, boolean, date, doublePrecision, index, integer, jsonb, pgTable, real, smallint, text, timestamp, uniqueIndex } from 'drizzle-orm/pg-core'
import { organisations, users } from './auth'
import { feedVersions } from './gtfs'

// GTFS-realtime as observed: each stored FeedMessage (a snapshot) and the rows read from it, all
// keyed to the GTFS feed version whose trips they were matched against. Observations hold what
// the feed said; stop and segment times are derived from them when asked (derive.ts), so a
// better derivation never needs a re-upload. Deleting a snapshot deletes its rows.

/** A feed URL polled at an interval for one agency. */
export const realtimeSources = pgTable('realtime_sources', {
  id: text('id').primaryKey(),
  organisationId: text('organisation_id').notNull().references(() => organisations.id),
  feedVersionId: integer('feed_version_id').notNull().references(() => feedVersions.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  url: text('url').notNull(),
  intervalS: integer('interval_s').notNull(),
  active: boolean('active').notNull().default(true),
  lastPolledAt: timestamp('last_polled_at', { withTimezone: true, mode: 'date' }),
  /** 'stored', 'duplicate' or 'error' for the last poll. */
  lastOutcome: text('last_outcome'),
  lastMessage: text('last_message').notNull().default(''),
  pollCount: integer('poll_count').notNull().default(0),
  createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
  createdAt: timestamp('created_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
}, (t) => [index('realtime_sources_organisation_idx').on(t.organisationId)])

export const realtimeSnapshots = pgTable('realtime_snapshots', {
  id: integer('id').primaryKey().generatedAlwaysAsIdentity(),
  feedVersionId: integer('feed_version_id').notNull().references(() => feedVersions.id, { onDelete: 'cascade' }),
  sourceId: text('source_id').references(() => realtimeSources.id, { onDelete: 'set null' }),
  fileName: text('file_name').notNull(),
  headerTime: timestamp('header_time', { withTimezone: true, mode: 'date' }).notNull(),
  /** SHA-256 of the file's bytes: with the header time, what makes a snapshot a duplicate. */
  contentHash: text('content_hash').notNull(),
  gtfsRealtimeVersion: text('gtfs_realtime_version').notNull(),
  bytes: integer('bytes').notNull(),
  entityCount: integer('entity_count').notNull(),
  vehicleCount: integer('vehicle_count').notNull(),
  tripUpdateCount: integer('trip_update_count').notNull(),
  /** Alerts and other entities that carry no run times. */
  otherCount: integer('other_count').notNull(),
  /** Vehicle and trip-update entities that match no trip of the feed version (not stored as rows). */
  unmatchedCount: integer('unmatched_count').notNull(),
  /** Up to 20 of the unmatched trip ids ('' for an entity without one), to show the planner. */
  unmatchedSample: jsonb('unmatched_sample').$type<string[]>().notNull(),
  uploadedBy: text('uploaded_by').references(() => users.id, { onDelete: 'set null' }),
  createdAt: timestamp('created_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
}, (t) => [
  uniqueIndex('realtime_snapshots_dedupe_uq').on(t.feedVersionId, t.headerTime, t.contentHash),
  index('realtime_snapshots_time_idx').on(t.feedVersionId, t.headerTime),
])

/** One VehiclePosition matched to a scheduled trip; loaded with COPY. */
export const realtimeVehicleObservations = pgTable('realtime_vehicle_observations', {
  snapshotId: integer('snapshot_id').notNull().references(() => realtimeSnapshots.id, { onDelete: 'cascade' }),
  feedVersionId: integer('feed_version_id').notNull(),
  tripId: text('trip_id').notNull(),
  /** The service day the trip instance runs on. */
  serviceDate: date('service_date', { mode: 'string' }).notNull(),
  /** TripDescriptor.start_time, for trips that frequencies.txt repeats. */
  startTime: text('start_time'),
  vehicleId: text('vehicle_id'),
  /** Unix seconds of the reading (the vehicle's timestamp, else the header's). */
  observedS: bigint('observed_s', { mode: 'number' }).notNull(),
  lat: doublePrecision('lat').notNull(),
  lon: doublePrecision('lon').notNull(),
  bearing: real('bearing'),
  speedMps: real('speed_mps'),
  /** VehicleStopStatus: INCOMING_AT 0, STOPPED_AT 1, IN_TRANSIT_TO 2. */
  status: smallint('status').notNull(),
  stopId: text('stop_id'),
  stopSequence: integer('stop_sequence'),
}, (t) => [
  index('realtime_vehicle_obs_trip_idx').on(t.feedVersionId, t.serviceDate, t.tripId, t.observedS),
  index('realtime_vehicle_obs_snapshot_idx').on(t.snapshotId),
])

/** A stop time a TripUpdate reports as past (not a prediction), resolved against the schedule. */
export const realtimeStopTimeObservations = pgTable('realtime_stop_time_observations', {
  snapshotId: integer('snapshot_id').notNull().references(() => realtimeSnapshots.id, { onDelete: 'cascade' }),
  feedVersionId: integer('feed_version_id').notNull(),
  tripId: text('trip_id').notNull(),
  serviceDate: date('service_date', { mode: 'string' }).notNull(),
  stopSequence: integer('stop_sequence').notNull(),
  stopId: text('stop_id').notNull(),
  /** Unix seconds; the later snapshot's value wins when several report the same stop. */
  reportedS: bigint('reported_s', { mode: 'number' }).notNull(),
  arrivalS: bigint('arrival_s', { mode: 'number' }),
  departureS: bigint('departure_s', { mode: 'number' }),
  delayS: integer('delay_s').notNull(),
}, (t) => [
  index('realtime_stop_obs_trip_idx').on(t.feedVersionId, t.serviceDate, t.tripId, t.stopSequence),
  index('realtime_stop_obs_snapshot_idx').on(t.snapshotId),
])
