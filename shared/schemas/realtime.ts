// Requests and responses of the realtime API (/api/realtime): snapshot uploads, polled sources,
// and what is derived from the observations (stop and segment times, lateness, calibration,
// before/after run times). Times are Unix seconds or ISO strings as named; durations in seconds.
import { z } from 'zod'
import { DAY_TYPES } from '../signals/time-of-day'

export const REALTIME_FILE_STATUSES = ['stored', 'duplicate', 'error', 'skipped'] as const

export const realtimeFileResultDto = z.object({
  file: z.string(),
  status: z.enum(REALTIME_FILE_STATUSES),
  snapshotId: z.number().optional(),
  headerTime: z.string().optional(),
  entities: z.number().optional(),
  vehicles: z.number().optional(),
  tripUpdates: z.number().optional(),
  /** Vehicle and trip-update entities whose trip the feed version does not know. */
  unmatched: z.number().optional(),
  unmatchedSample: z.array(z.string()).optional(),
  vehicleRows: z.number().optional(),
  stopTimeRows: z.number().optional(),
  note: z.string().optional(),
  error: z.object({ code: z.string(), message: z.string(), field: z.string().optional() }).optional(),
})
export type RealtimeFileResultDto = z.infer<typeof realtimeFileResultDto>

export const realtimeIngestSummaryDto = z.object({
  files: z.number(),
  stored: z.number(),
  duplicates: z.number(),
  errors: z.number(),
  skipped: z.number(),
  unmatched: z.number(),
  vehicleRows: z.number(),
  stopTimeRows: z.number(),
})
export type RealtimeIngestSummaryDto = z.infer<typeof realtimeIngestSummaryDto>

/** The answer to an upload: the results at once, or a job to follow for a large batch. */
export const realtimeUploadResultDto = z.union([
  z.object({ feedVersionId: z.number(), summary: realtimeIngestSummaryDto, results: z.array(realtimeFileResultDto) }),
  z.object({ feedVersionId: z.number(), jobId: z.string(), files: z.number() }),
])
export type RealtimeUploadResultDto = z.infer<typeof realtimeUploadResultDto>

/** Multipart text fields of POST /api/realtime/snapshots. */
export const realtimeUploadFields = z.strictObject({
  feedVersionId: z.coerce.number().int().positive().optional(),
})

export const realtimeSourceBody = z.strictObject({
  name: z.string().trim().min(1).max(120),
  url: z.url({ protocol: /^https?$/ }).max(2000),
  /** Feeds usually refresh every 10-30 s; polling faster than every 10 s adds nothing. */
  intervalS: z.int().min(10).max(3600),
  feedVersionId: z.int().positive().optional(),
})
export type RealtimeSourceBody = z.infer<typeof realtimeSourceBody>

export const realtimeSourceDto = z.object({
  id: z.string(),
  organisationId: z.string(),
  organisationName: z.string(),
  feedVersionId: z.number(),
  name: z.string(),
  url: z.string(),
  intervalS: z.number(),
  active: z.boolean(),
  lastPolledAt: z.string().nullable(),
  lastOutcome: z.string().nullable(),
  lastMessage: z.string(),
  pollCount: z.number(),
  snapshots: z.number(),
})
export type RealtimeSourceDto = z.infer<typeof realtimeSourceDto>

export const realtimeSourceParams = z.object({ id: z.string().min(1).max(100) })

const isoDay = z.iso.date()

export const corridorQuery = z.strictObject({ corridorId: z.string().min(1).max(100) })

/** A date range of service days, both ends included. */
const range = { from: isoDay.optional(), to: isoDay.optional() }

export const observationsQuery = z.strictObject({ corridorId: z.string().min(1).max(100), ...range })

export const latenessQuery = z.strictObject({
  corridorId: z.string().min(1).max(100),
  ...range,
  /** A bus counts as late beyond this; 120 s matches the proposals' default. */
  lateThresholdS: z.coerce.number().min(0).max(1800).default(120),
})

export const calibrationQuery = z.strictObject({ corridorId: z.string().min(1).max(100), ...range })

export const beforeAfterQuery = z.strictObject({
  corridorId: z.string().min(1).max(100),
  beforeFrom: isoDay,
  beforeTo: isoDay,
  afterFrom: isoDay,
  afterTo: isoDay,
  dayType: z.enum(DAY_TYPES).optional(),
  periodId: z.string().max(100).optional(),
}).refine((q) => q.beforeFrom <= q.beforeTo, { path: ['beforeTo'], message: 'The before period ends before it starts.' })
  .refine((q) => q.afterFrom <= q.afterTo, { path: ['afterTo'], message: 'The after period ends before it starts.' })
export type BeforeAfterQuery = z.infer<typeof beforeAfterQuery>

// Derived observations

export const segmentDefinitionDto = z.object({
  approachId: z.string(),
  intersectionId: z.string(),
  intersectionName: z.string(),
  /** Stop line along the corridor shape. */
  stopLineM: z.number(),
  fromM: z.number(),
  toM: z.number(),
})
export type SegmentDefinitionDto = z.infer<typeof segmentDefinitionDto>

export const observedSegmentDto = z.object({
  approachId: z.string(),
  enterS: z.number(),
  exitS: z.number(),
  travelS: z.number(),
  /** Dwell observed at a stop inside the segment (stop events), null when not observed. */
  dwellS: z.number().nullable(),
  periodId: z.string().nullable(),
  /** Observed minus scheduled crossing of the stop line. */
  latenessS: z.number().nullable(),
})
export type ObservedSegmentDto = z.infer<typeof observedSegmentDto>

export const observedStopDto = z.object({
  stopId: z.string(),
  distanceM: z.number(),
  arrivalS: z.number().nullable(),
  departureS: z.number().nullable(),
  scheduledS: z.number().nullable(),
  latenessS: z.number().nullable(),
})

export const observedTripDto = z.object({
  tripId: z.string(),
  serviceDate: z.string(),
  dayType: z.enum(DAY_TYPES),
  /** Period of the corridor at the corridor entry time. */
  periodId: z.string().nullable(),
  startS: z.number().nullable(),
  runTimeS: z.number().nullable(),
  stops: z.array(observedStopDto),
  segments: z.array(observedSegmentDto),
  positions: z.number(),
  stopEvents: z.number(),
  offRoute: z.number(),
})
export type ObservedTripDto = z.infer<typeof observedTripDto>

export const periodDto = z.object({ id: z.string(), name: z.string(), startTime: z.string(), endTime: z.string() })

export const observationsDto = z.object({
  corridorId: z.string(),
  feedVersionId: z.number(),
  timeZone: z.string(),
  from: z.string().nullable(),
  to: z.string().nullable(),
  /** The corridor run is measured from the first to the last corridor stop. */
  runFromM: z.number(),
  runToM: z.number(),
  periods: z.array(periodDto),
  segments: z.array(segmentDefinitionDto),
  trips: z.array(observedTripDto),
})
export type ObservationsDto = z.infer<typeof observationsDto>

export const latenessBinDto = z.object({ fromS: z.number(), toS: z.number(), count: z.number() })

export const latenessGroupDto = z.object({
  key: z.string(),
  label: z.string(),
  approachId: z.string().nullable(),
  periodId: z.string().nullable(),
  dayType: z.enum(DAY_TYPES).nullable(),
  count: z.number(),
  medianS: z.number().nullable(),
  p85S: z.number().nullable(),
  lateShare: z.number().nullable(),
})

export const latenessDto = z.object({
  corridorId: z.string(),
  lateThresholdS: z.number(),
  /** Lateness at every observed stop-line crossing of every corridor intersection. */
  count: z.number(),
  medianS: z.number().nullable(),
  p85S: z.number().nullable(),
  lateShare: z.number().nullable(),
  histogram: z.array(latenessBinDto),
  groups: z.array(latenessGroupDto),
})
export type LatenessDto = z.infer<typeof latenessDto>

export const calibrationRowDto = z.object({
  approachId: z.string(),
  intersectionId: z.string(),
  intersectionName: z.string(),
  periodId: z.string(),
  periodName: z.string(),
  dayType: z.enum(DAY_TYPES),
  trips: z.number(),
  segmentLengthM: z.number(),
  observedTravelS: z.number(),
  freeRunS: z.number(),
  dwellS: z.number(),
  /** 'observed' when stop events gave the dwell, 'input' when the approach's dwell was used. */
  dwellFrom: z.enum(['observed', 'input', 'none']),
  /** Mean of segment time minus free run and dwell over the trips. */
  observedDelayS: z.number(),
  observedMedianDelayS: z.number(),
  /** The model's mean baseline bus delay for the same approach and period; null without a timing plan. */
  modelDelayS: z.number().nullable(),
  differenceS: z.number().nullable(),
  agrees: z.boolean().nullable(),
  suggestion: z.object({
    field: z.string(),
    current: z.number(),
    suggested: z.number(),
    modelDelayS: z.number(),
    note: z.string(),
  }).nullable(),
  note: z.string(),
})
export type CalibrationRowDto = z.infer<typeof calibrationRowDto>

export const calibrationDto = z.object({
  corridorId: z.string(),
  /** |observed - model| within this many seconds, or this share of the model's value, agrees. */
  toleranceS: z.number(),
  toleranceShare: z.number(),
  rows: z.array(calibrationRowDto),
})
export type CalibrationDto = z.infer<typeof calibrationDto>

const changeDto = z.object({ change: z.number(), low: z.number(), high: z.number() }).nullable()

export const runTimeStatsDto = z.object({
  trips: z.number(),
  medianS: z.number().nullable(),
  p85S: z.number().nullable(),
})

export const beforeAfterRowDto = z.object({
  key: z.string(),
  label: z.string(),
  approachId: z.string().nullable(),
  before: runTimeStatsDto,
  after: runTimeStatsDto,
  medianChange: changeDto,
  p85Change: changeDto,
})
export type BeforeAfterRowDto = z.infer<typeof beforeAfterRowDto>

export const beforeAfterDto = z.object({
  corridorId: z.string(),
  before: z.object({ from: z.string(), to: z.string() }),
  after: z.object({ from: z.string(), to: z.string() }),
  dayType: z.enum(DAY_TYPES).nullable(),
  periodId: z.string().nullable(),
  periods: z.array(periodDto),
  confidenceLevel: z.number(),
  resamples: z.number(),
  seed: z.number(),
  corridor: beforeAfterRowDto,
  segments: z.array(beforeAfterRowDto),
})
export type BeforeAfterDto = z.infer<typeof beforeAfterDto>

/** Service days with observations of the corridor's trips, for picking before and after ranges. */
export const coverageDto = z.object({
  corridorId: z.string(),
  days: z.array(z.object({ date: z.string(), trips: z.number(), dayType: z.enum(DAY_TYPES) })),
})
export type CoverageDto = z.infer<typeof coverageDto>
