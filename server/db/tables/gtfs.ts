import { boolean, date, doublePrecision, index, integer, jsonb, pgTable, primaryKey, smallint, text, timestamp } from 'drizzle-orm/pg-core'
import { organisations, users } from './auth'
import { jobs } from './jobs'
import type { FeedCountsDto, FeedDerivedDto, FeedReportDto } from '../../../shared/schemas/gtfs'

// One uploaded GTFS Schedule zip. The report stays even when the import failed: it is what the
// planner needs to fix the feed. GTFS rows exist only for feeds whose import committed.
export const feedVersions = pgTable('feed_versions', {
  id: integer('id').primaryKey().generatedAlwaysAsIdentity(),
  organisationId: text('organisation_id').notNull().references(() => organisations.id),
  name: text('name').notNull(),
  uploadedBy: text('uploaded_by').references(() => users.id, { onDelete: 'set null' }),
  uploadedAt: timestamp('uploaded_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
  state: text('state', { enum: ['importing', 'ready', 'failed'] }).notNull().default('importing'),
  jobId: text('job_id').references(() => jobs.id, { onDelete: 'set null' }),
  counts: jsonb('counts').$type<FeedCountsDto>(),
  derived: jsonb('derived').$type<FeedDerivedDto>(),
  serviceStart: date('service_start', { mode: 'string' }),
  serviceEnd: date('service_end', { mode: 'string' }),
  report: jsonb('report').$type<FeedReportDto>(),
  errorCount: integer('error_count').notNull().default(0),
  warningCount: integer('warning_count').notNull().default(0),
}, (t) => [index('feed_versions_organisation_idx').on(t.organisationId)])

// Every GTFS table below is keyed by its feed version and, in the migration, partitioned by it
// (LIST on feed_version_id; drizzle-kit cannot declare partitions). The importer loads each feed
// into fresh partitions and attaches them in one transaction, which builds the indexes in bulk;
// deleting a feed drops its partitions (the cascade covers any row left elsewhere).
// Times are whole seconds since "noon minus 12 h" of the service day (may pass 86 400);
// dates are service days.
const feed = () => integer('feed_version_id').notNull().references(() => feedVersions.id, { onDelete: 'cascade' })

export const gtfsAgency = pgTable('gtfs_agency', {
  feedVersionId: feed(),
  // '' when the feed has a single agency and leaves agency_id blank.
  agencyId: text('agency_id').notNull(),
  agencyName: text('agency_name').notNull(),
  agencyUrl: text('agency_url').notNull(),
  agencyTimezone: text('agency_timezone').notNull(),
  agencyLang: text('agency_lang'),
  agencyPhone: text('agency_phone'),
  agencyFareUrl: text('agency_fare_url'),
  agencyEmail: text('agency_email'),
}, (t) => [primaryKey({ columns: [t.feedVersionId, t.agencyId] })])

export const gtfsStops = pgTable('gtfs_stops', {
  feedVersionId: feed(),
  stopId: text('stop_id').notNull(),
  stopCode: text('stop_code'),
  stopName: text('stop_name'),
  stopDesc: text('stop_desc'),
  stopLat: doublePrecision('stop_lat'),
  stopLon: doublePrecision('stop_lon'),
  zoneId: text('zone_id'),
  stopUrl: text('stop_url'),
  locationType: smallint('location_type').notNull().default(0),
  parentStation: text('parent_station'),
  stopTimezone: text('stop_timezone'),
  wheelchairBoarding: smallint('wheelchair_boarding'),
  platformCode: text('platform_code'),
}, (t) => [primaryKey({ columns: [t.feedVersionId, t.stopId] })])

export const gtfsRoutes = pgTable('gtfs_routes', {
  feedVersionId: feed(),
  routeId: text('route_id').notNull(),
  agencyId: text('agency_id').notNull(),
  routeShortName: text('route_short_name'),
  routeLongName: text('route_long_name'),
  routeDesc: text('route_desc'),
  routeType: integer('route_type').notNull(),
  routeUrl: text('route_url'),
  routeColor: text('route_color'),
  routeTextColor: text('route_text_color'),
  routeSortOrder: integer('route_sort_order'),
}, (t) => [primaryKey({ columns: [t.feedVersionId, t.routeId] })])

export const gtfsTrips = pgTable('gtfs_trips', {
  feedVersionId: feed(),
  tripId: text('trip_id').notNull(),
  routeId: text('route_id').notNull(),
  serviceId: text('service_id').notNull(),
  tripHeadsign: text('trip_headsign'),
  tripShortName: text('trip_short_name'),
  directionId: smallint('direction_id'),
  blockId: text('block_id'),
  shapeId: text('shape_id'),
  wheelchairAccessible: smallint('wheelchair_accessible'),
  bikesAllowed: smallint('bikes_allowed'),
}, (t) => [
  primaryKey({ columns: [t.feedVersionId, t.tripId] }),
  index('gtfs_trips_route_direction_idx').on(t.feedVersionId, t.routeId, t.directionId),
])

export const gtfsStopTimes = pgTable('gtfs_stop_times', {
  feedVersionId: feed(),
  tripId: text('trip_id').notNull(),
  stopSequence: integer('stop_sequence').notNull(),
  stopId: text('stop_id').notNull(),
  // As given, or interpolated when the feed leaves both blank (see `interpolated`); a stop with
  // only one of the two gets the other copied.
  arrivalTime: integer('arrival_time').notNull(),
  departureTime: integer('departure_time').notNull(),
  interpolated: boolean('interpolated').notNull(),
  stopHeadsign: text('stop_headsign'),
  pickupType: smallint('pickup_type'),
  dropOffType: smallint('drop_off_type'),
  timepoint: smallint('timepoint'),
  // In the feed's own unit, as given.
  shapeDistTraveled: doublePrecision('shape_dist_traveled'),
  // Metres along the trip's shape (from shape_dist_traveled when given, else the stop projected
  // on the shape); along straight lines between stops when the trip has no shape.
  distM: doublePrecision('dist_m').notNull(),
}, (t) => [
  primaryKey({ columns: [t.feedVersionId, t.tripId, t.stopSequence] }),
  index('gtfs_stop_times_stop_idx').on(t.feedVersionId, t.stopId),
])

export const gtfsCalendar = pgTable('gtfs_calendar', {
  feedVersionId: feed(),
  serviceId: text('service_id').notNull(),
  monday: boolean('monday').notNull(),
  tuesday: boolean('tuesday').notNull(),
  wednesday: boolean('wednesday').notNull(),
  thursday: boolean('thursday').notNull(),
  friday: boolean('friday').notNull(),
  saturday: boolean('saturday').notNull(),
  sunday: boolean('sunday').notNull(),
  startDate: date('start_date', { mode: 'string' }).notNull(),
  endDate: date('end_date', { mode: 'string' }).notNull(),
}, (t) => [primaryKey({ columns: [t.feedVersionId, t.serviceId] })])

export const gtfsCalendarDates = pgTable('gtfs_calendar_dates', {
  feedVersionId: feed(),
  serviceId: text('service_id').notNull(),
  date: date('date', { mode: 'string' }).notNull(),
  // 1 = service added on that date, 2 = removed.
  exceptionType: smallint('exception_type').notNull(),
}, (t) => [primaryKey({ columns: [t.feedVersionId, t.serviceId, t.date] })])

export const gtfsShapes = pgTable('gtfs_shapes', {
  feedVersionId: feed(),
  shapeId: text('shape_id').notNull(),
  shapePtSequence: integer('shape_pt_sequence').notNull(),
  shapePtLat: doublePrecision('shape_pt_lat').notNull(),
  shapePtLon: doublePrecision('shape_pt_lon').notNull(),
  shapeDistTraveled: doublePrecision('shape_dist_traveled'),
  distM: doublePrecision('dist_m').notNull(),
}, (t) => [primaryKey({ columns: [t.feedVersionId, t.shapeId, t.shapePtSequence] })])

export const gtfsFrequencies = pgTable('gtfs_frequencies', {
  feedVersionId: feed(),
  tripId: text('trip_id').notNull(),
  startTime: integer('start_time').notNull(),
  endTime: integer('end_time').notNull(),
  headwaySecs: integer('headway_secs').notNull(),
  // 0 = frequency-based (blank in the feed), 1 = schedule-based.
  exactTimes: smallint('exact_times').notNull(),
}, (t) => [primaryKey({ columns: [t.feedVersionId, t.tripId, t.startTime] })])

export const gtfsFeedInfo = pgTable('gtfs_feed_info', {
  feedVersionId: feed().primaryKey(),
  feedPublisherName: text('feed_publisher_name').notNull(),
  feedPublisherUrl: text('feed_publisher_url').notNull(),
  feedLang: text('feed_lang').notNull(),
  defaultLang: text('default_lang'),
  feedStartDate: date('feed_start_date', { mode: 'string' }),
  feedEndDate: date('feed_end_date', { mode: 'string' }),
  feedVersion: text('feed_version'),
  feedContactEmail: text('feed_contact_email'),
  feedContactUrl: text('feed_contact_url'),
})

// Derived on import.

/** Every date a service_id runs: calendar.txt's weekly pattern plus calendar_dates.txt. */
export const gtfsServiceDates = pgTable('gtfs_service_dates', {
  feedVersionId: feed(),
  serviceId: text('service_id').notNull(),
  date: date('date', { mode: 'string' }).notNull(),
}, (t) => [
  primaryKey({ columns: [t.feedVersionId, t.serviceId, t.date] }),
  index('gtfs_service_dates_date_idx').on(t.feedVersionId, t.date),
])

/**
 * One row per trip that frequencies.txt describes: the template trip_id and the start of this run.
 * Its stop times are the template's plus shift_s.
 */
export const gtfsFrequencyTrips = pgTable('gtfs_frequency_trips', {
  feedVersionId: feed(),
  tripId: text('trip_id').notNull(),
  startTime: integer('start_time').notNull(),
  shiftS: integer('shift_s').notNull(),
  headwaySecs: integer('headway_secs').notNull(),
  exactTimes: boolean('exact_times').notNull(),
}, (t) => [primaryKey({ columns: [t.feedVersionId, t.tripId, t.startTime] })])

/** The GTFS tables of a feed, in the order the importer loads them. */
export const GTFS_TABLES = [
  'gtfs_agency', 'gtfs_stops', 'gtfs_routes', 'gtfs_calendar', 'gtfs_calendar_dates', 'gtfs_shapes',
  'gtfs_trips', 'gtfs_stop_times', 'gtfs_frequencies', 'gtfs_feed_info', 'gtfs_service_dates', 'gtfs_frequency_trips',
] as const
export type GtfsTable = (typeof GTFS_TABLES)[number]
