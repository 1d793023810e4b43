// Zod schemas of the GTFS Schedule files Fanlight imports (one per row, fields as trimmed text,
// an empty string for a blank or absent field) and the DTOs of the feeds API.
// Field rules follow the GTFS Schedule reference; a column whose schema refuses an empty value is
// a required column. The row schemas only check the text: the importer converts it afterwards
// (shared/gtfs), which keeps the check of a million stop_times cheap.
import { z } from 'zod'
import { parseGtfsTime } from '../gtfs/time'
import { parseGtfsDate } from '../gtfs/date'

const required = z.string().min(1, 'Required field is empty.')
const optional = z.string()
const id = required.max(255, 'Identifiers are at most 255 characters.')
const optionalId = z.string().max(255, 'Identifiers are at most 255 characters.')

const isNumber = (s: string) => s !== '' && Number.isFinite(Number(s))
const time = (opt: boolean) => z.string().refine((s) => (opt && s === '') || parseGtfsTime(s) !== null,
  { message: 'Expected a time H:MM:SS or HH:MM:SS (hours may pass 24).' })
const date = z.string().refine((s) => parseGtfsDate(s) !== null, { message: 'Expected a real date YYYYMMDD.' })
const optionalDate = z.string().refine((s) => s === '' || parseGtfsDate(s) !== null, { message: 'Expected a real date YYYYMMDD.' })
const choice = (values: string[], opt: boolean) => {
  const allowed = new Set(opt ? ['', ...values] : values)
  return z.string().refine((s) => allowed.has(s), { message: `Expected one of ${values.join(', ')}${opt ? ' or empty' : ''}.` })
}
const bit = choice(['0', '1'], false)
const nonNegativeInt = (opt: boolean) => z.string().refine((s) => (opt && s === '') || /^\d{1,9}$/.test(s),
  { message: 'Expected a whole number of 0 or more.' })
const positiveInt = z.string().refine((s) => /^\d{1,9}$/.test(s) && Number(s) > 0, { message: 'Expected a whole number above 0.' })
const nonNegative = z.string().refine((s) => s === '' || (isNumber(s) && Number(s) >= 0), { message: 'Expected a number of 0 or more.' })
const coordinate = (limit: number, name: string) => z.string().refine((s) => s === '' || (isNumber(s) && Math.abs(Number(s)) <= limit),
  { message: `Expected a ${name} between -${limit} and ${limit}.` })
const color = z.string().refine((s) => s === '' || /^[0-9A-Fa-f]{6}$/.test(s), { message: 'Expected a colour of six hex digits (RRGGBB).' })
// Basic route types and the extended ones (100-1799) that many feeds use.
const routeType = z.string().refine((s) => /^\d{1,4}$/.test(s) && ([0, 1, 2, 3, 4, 5, 6, 7, 11, 12].includes(Number(s)) || (Number(s) >= 100 && Number(s) < 1800)),
  { message: 'Expected a route type (0-7, 11, 12 or an extended type 100-1799).' })

export const agencyRow = z.object({
  agency_id: optionalId,
  agency_name: required,
  agency_url: required,
  agency_timezone: required,
  agency_lang: optional,
  agency_phone: optional,
  agency_fare_url: optional,
  agency_email: optional,
})

export const stopRow = z.object({
  stop_id: id,
  stop_code: optional,
  stop_name: optional,
  stop_desc: optional,
  stop_lat: coordinate(90, 'latitude'),
  stop_lon: coordinate(180, 'longitude'),
  zone_id: optional,
  stop_url: optional,
  location_type: choice(['0', '1', '2', '3', '4'], true),
  parent_station: optionalId,
  stop_timezone: optional,
  wheelchair_boarding: choice(['0', '1', '2'], true),
  platform_code: optional,
})

export const routeRow = z.object({
  route_id: id,
  agency_id: optionalId,
  route_short_name: optional,
  route_long_name: optional,
  route_desc: optional,
  route_type: routeType,
  route_url: optional,
  route_color: color,
  route_text_color: color,
  route_sort_order: nonNegativeInt(true),
})

export const tripRow = z.object({
  route_id: id,
  service_id: id,
  trip_id: id,
  trip_headsign: optional,
  trip_short_name: optional,
  direction_id: choice(['0', '1'], true),
  block_id: optional,
  shape_id: optionalId,
  wheelchair_accessible: choice(['0', '1', '2'], true),
  bikes_allowed: choice(['0', '1', '2'], true),
})

export const stopTimeRow = z.object({
  trip_id: id,
  arrival_time: time(true),
  departure_time: time(true),
  stop_id: id,
  stop_sequence: nonNegativeInt(false),
  stop_headsign: optional,
  pickup_type: choice(['0', '1', '2', '3'], true),
  drop_off_type: choice(['0', '1', '2', '3'], true),
  shape_dist_traveled: nonNegative,
  timepoint: choice(['0', '1'], true),
})

export const calendarRow = z.object({
  service_id: id,
  monday: bit,
  tuesday: bit,
  wednesday: bit,
  thursday: bit,
  friday: bit,
  saturday: bit,
  sunday: bit,
  start_date: date,
  end_date: date,
})

export const calendarDateRow = z.object({
  service_id: id,
  date,
  exception_type: choice(['1', '2'], false),
})

export const shapeRow = z.object({
  shape_id: id,
  shape_pt_lat: coordinate(90, 'latitude').refine((s) => s !== '', { message: 'Required field is empty.' }),
  shape_pt_lon: coordinate(180, 'longitude').refine((s) => s !== '', { message: 'Required field is empty.' }),
  shape_pt_sequence: nonNegativeInt(false),
  shape_dist_traveled: nonNegative,
})

export const frequencyRow = z.object({
  trip_id: id,
  start_time: time(false),
  end_time: time(false),
  headway_secs: positiveInt,
  exact_times: choice(['0', '1'], true),
})

export const feedInfoRow = z.object({
  feed_publisher_name: required,
  feed_publisher_url: required,
  feed_lang: required,
  default_lang: optional,
  feed_start_date: optionalDate,
  feed_end_date: optionalDate,
  feed_version: optional,
  feed_contact_email: optional,
  feed_contact_url: optional,
})

export const GTFS_ROW_SCHEMAS = {
  'agency.txt': agencyRow,
  'stops.txt': stopRow,
  'routes.txt': routeRow,
  'trips.txt': tripRow,
  'stop_times.txt': stopTimeRow,
  'calendar.txt': calendarRow,
  'calendar_dates.txt': calendarDateRow,
  'shapes.txt': shapeRow,
  'frequencies.txt': frequencyRow,
  'feed_info.txt': feedInfoRow,
} as const
export type GtfsFileName = keyof typeof GTFS_ROW_SCHEMAS
export const GTFS_FILE_NAMES = Object.keys(GTFS_ROW_SCHEMAS) as GtfsFileName[]

/** Columns every row must fill, hence the header must name: those whose schema refuses ''. */
export function requiredColumns(file: GtfsFileName): string[] {
  const shape = GTFS_ROW_SCHEMAS[file].shape as Record<string, z.ZodType>
  return Object.keys(shape).filter((k) => !shape[k].safeParse('').success)
}

// ---- API ----

export const FEED_STATES = ['importing', 'ready', 'failed'] as const
export type FeedState = (typeof FEED_STATES)[number]

export const findingDto = z.object({
  kind: z.string(),
  severity: z.enum(['error', 'warning']),
  file: z.string(),
  line: z.number().nullable(),
  field: z.string().nullable(),
  value: z.string().nullable(),
  message: z.string(),
})
export type FindingDto = z.infer<typeof findingDto>

export const feedReportDto = z.object({
  errors: z.array(findingDto),
  warnings: z.array(findingDto),
  errorCount: z.number(),
  warningCount: z.number(),
  /** Totals per kind of finding; the lists above keep only the first few of each kind. */
  kinds: z.array(z.object({ kind: z.string(), severity: z.enum(['error', 'warning']), count: z.number(), kept: z.number() })),
})
export type FeedReportDto = z.infer<typeof feedReportDto>

export const feedCountsDto = z.object({
  agency: z.number(),
  routes: z.number(),
  trips: z.number(),
  stops: z.number(),
  stop_times: z.number(),
  /** Shape points. */
  shapes: z.number(),
  calendar: z.number(),
  calendar_dates: z.number(),
  frequencies: z.number(),
})
export type FeedCountsDto = z.infer<typeof feedCountsDto>

export const feedDerivedDto = z.object({
  serviceDates: z.number(),
  frequencyTrips: z.number(),
  interpolatedStopTimes: z.number(),
})
export type FeedDerivedDto = z.infer<typeof feedDerivedDto>

export const feedSummaryDto = z.object({
  id: z.number(),
  name: z.string(),
  state: z.enum(FEED_STATES),
  organisationId: z.string(),
  uploadedBy: z.object({ id: z.string(), name: z.string() }).nullable(),
  uploadedAt: z.string(),
  serviceStart: z.string().nullable(),
  serviceEnd: z.string().nullable(),
  errorCount: z.number(),
  warningCount: z.number(),
  jobId: z.string().nullable(),
})
export type FeedSummaryDto = z.infer<typeof feedSummaryDto>

export const feedDetailDto = feedSummaryDto.extend({
  counts: feedCountsDto.nullable(),
  derived: feedDerivedDto.nullable(),
  report: feedReportDto,
})
export type FeedDetailDto = z.infer<typeof feedDetailDto>

export const feedUploadedDto = z.object({ feedId: z.number(), jobId: z.string() })
export type FeedUploadedDto = z.infer<typeof feedUploadedDto>

export const routeDirectionDto = z.object({
  directionId: z.number().nullable(),
  /** Rows of trips.txt. */
  tripCount: z.number(),
  /** Trips that run: a frequencies.txt template counts once per start it describes. */
  expandedTripCount: z.number(),
  headsigns: z.array(z.string()),
  shapes: z.array(z.object({ shapeId: z.string(), tripCount: z.number() })),
})
export const routeSummaryDto = z.object({
  routeId: z.string(),
  agencyId: z.string().nullable(),
  shortName: z.string().nullable(),
  longName: z.string().nullable(),
  type: z.number(),
  color: z.string().nullable(),
  textColor: z.string().nullable(),
  tripCount: z.number(),
  directions: z.array(routeDirectionDto),
})
export type RouteSummaryDto = z.infer<typeof routeSummaryDto>

export const shapeDto = z.object({
  shapeId: z.string(),
  lengthM: z.number(),
  points: z.array(z.object({ sequence: z.number(), lat: z.number(), lon: z.number(), distM: z.number() })),
})
export type ShapeDto = z.infer<typeof shapeDto>

export const feedIdParams = z.object({ id: z.coerce.number().int().positive().max(2_147_483_647) })
export const feedShapeParams = feedIdParams.extend({ shapeId: z.string().min(1).max(255) })
export const feedUploadBody = z.strictObject({ name: z.string().trim().min(1).max(200).optional() })
