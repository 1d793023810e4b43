// Request bodies and response shapes of /api/corridors and /api/corridors/:id/approaches.
import { z } from 'zod'
import { DAY_TYPES, TIME_OF_DAY_PATTERN, type DayType } from '../signals/time-of-day'
import {
  DEFAULT_CHECK_IN_DISTANCE_M, DEFAULT_JAM_DENSITY_VEH_PER_KM_PER_LANE, DEFAULT_SATURATION_FLOW_VEH_PER_HOUR_PER_LANE,
  STOP_RELATIONS, type StopRelation,
} from '../corridors/approach-rules'
import { versionField } from './signals'

const timeOfDay = z.string().regex(TIME_OF_DAY_PATTERN, 'Use HH:MM between 00:00 and 24:00.')
const gtfsId = z.string().min(1).max(255)

export const corridorCreateBody = z.strictObject({
  feedId: z.number().int().positive(),
  name: z.string().trim().min(3).max(120),
  routeIds: z.array(gtfsId).min(1).max(12).refine((r) => new Set(r).size === r.length, 'Each route once.'),
  directionId: z.union([z.literal(0), z.literal(1)]),
  shapeId: gtfsId.optional(),
})
export type CorridorCreateBody = z.infer<typeof corridorCreateBody>

export const periodBody = z.strictObject({
  /** Keep the id of a period that stays (its volumes and results stay with it); omit for a new one. */
  id: z.string().min(1).max(100).optional(),
  name: z.string().trim().min(1).max(40),
  startTime: timeOfDay,
  endTime: timeOfDay,
})
export type PeriodBody = z.infer<typeof periodBody>

export const corridorPatchBody = z.strictObject({
  version: versionField,
  name: z.string().trim().min(3).max(120).optional(),
  /** The complete list, in display order: periods left out are deleted with their volumes. */
  periods: z.array(periodBody).min(1).max(12).optional(),
})
export type CorridorPatchBody = z.infer<typeof corridorPatchBody>

export const corridorParams = z.object({ id: z.string().min(1).max(100) })
export const approachParams = z.object({ id: z.string().min(1).max(100), aid: z.string().min(1).max(100) })
export const corridorListQuery = z.strictObject({ feedId: z.coerce.number().int().positive().optional() })

const volume = z.number().min(0).max(20000)
export const approachVolumeBody = z.strictObject({
  periodId: z.string().min(1).max(100),
  volumeVehPerHour: volume,
  crossVolumeVehPerHour: volume,
})

const approachFields = {
  intersectionId: z.string().min(1).max(100),
  /** Stop line position along the corridor; when absent, `snap` (or the intersection itself) is snapped to the shape. */
  distanceM: z.number().min(0).max(500_000),
  lanes: z.number().int().min(1).max(8),
  saturationFlowVehPerHourPerLane: z.number().min(300).max(2400),
  speedLimitKmh: z.number().min(10).max(130),
  jamDensityVehPerKmPerLane: z.number().min(60).max(250),
  crossLanes: z.number().int().min(1).max(8),
  crossSaturationFlowVehPerHourPerLane: z.number().min(300).max(2400),
  stopRelation: z.enum(STOP_RELATIONS),
  stopId: gtfsId.nullable(),
  dwellS: z.number().min(0).max(600).nullable(),
  checkInDistanceM: z.number().min(0).max(2000),
  volumes: z.array(approachVolumeBody).max(12)
    .refine((v) => new Set(v.map((x) => x.periodId)).size === v.length, 'Give each period once.'),
}

/** A point to snap to the corridor's shape instead of giving distanceM. */
const snapPoint = z.strictObject({ lat: z.number().min(-90).max(90), lon: z.number().min(-180).max(180) })

export const approachCreateBody = z.strictObject({
  ...approachFields,
  distanceM: approachFields.distanceM.optional(),
  snap: snapPoint.optional(),
  saturationFlowVehPerHourPerLane: approachFields.saturationFlowVehPerHourPerLane.default(DEFAULT_SATURATION_FLOW_VEH_PER_HOUR_PER_LANE),
  jamDensityVehPerKmPerLane: approachFields.jamDensityVehPerKmPerLane.default(DEFAULT_JAM_DENSITY_VEH_PER_KM_PER_LANE),
  crossSaturationFlowVehPerHourPerLane: approachFields.crossSaturationFlowVehPerHourPerLane.default(DEFAULT_SATURATION_FLOW_VEH_PER_HOUR_PER_LANE),
  stopRelation: approachFields.stopRelation.default('none'),
  stopId: approachFields.stopId.default(null),
  dwellS: approachFields.dwellS.default(null),
  checkInDistanceM: approachFields.checkInDistanceM.default(DEFAULT_CHECK_IN_DISTANCE_M),
  volumes: approachFields.volumes.default([]),
}).refine((b) => !(b.distanceM !== undefined && b.snap), { message: 'Give distanceM or snap, not both.', path: ['snap'] })
export type ApproachCreateBody = z.input<typeof approachCreateBody>

export const approachPatchBody = z.strictObject({
  ...z.object(approachFields).partial().shape,
  snap: snapPoint.optional(),
  /** Snap the intersection's own location to the shape again. */
  snapIntersection: z.literal(true).optional(),
  version: versionField,
}).refine((b) => [b.distanceM !== undefined, !!b.snap, !!b.snapIntersection].filter(Boolean).length <= 1,
  { message: 'Give one of distanceM, snap or snapIntersection.', path: ['snap'] })
export type ApproachPatchBody = z.infer<typeof approachPatchBody>

export interface PeriodDto { id: string; name: string; startTime: string; endTime: string }

export interface CorridorStopDto {
  /** Index along the corridor from 0. */
  seq: number
  stopId: string
  name: string
  lat: number
  lon: number
  distanceM: number
  offsetM: number
}

export interface ApproachVolumeDto { periodId: string; volumeVehPerHour: number; crossVolumeVehPerHour: number }

export interface ApproachDto {
  id: string
  corridorId: string
  intersectionId: string
  intersectionName: string
  jurisdictionId: string
  jurisdictionName: string
  lat: number
  lon: number
  distanceM: number
  snapOffsetM: number | null
  lanes: number
  saturationFlowVehPerHourPerLane: number
  speedLimitKmh: number
  jamDensityVehPerKmPerLane: number
  crossLanes: number
  crossSaturationFlowVehPerHourPerLane: number
  stopRelation: StopRelation
  stopId: string | null
  stopName: string | null
  dwellS: number | null
  checkInDistanceM: number
  volumes: ApproachVolumeDto[]
  version: number
  updatedAt: string
}

export interface CorridorRouteDto { routeId: string; shortName: string | null; longName: string | null; color: string | null }

export interface CorridorSummaryDto {
  id: string
  name: string
  agencyId: string
  feedId: number
  feedName: string
  routes: CorridorRouteDto[]
  directionId: number
  shapeId: string
  lengthM: number
  stopCount: number
  approachCount: number
  version: number
  createdAt: string
}

export interface RunTimeDto {
  fromStopId: string
  toStopId: string
  fromDistanceM: number
  toDistanceM: number
  /** Median scheduled time from departure at the first stop to arrival at the second; null when no trip serves both. */
  medianS: number | null
  trips: number
}

export interface PeriodTripsDto { periodId: string; dayType: DayType; tripsPerDay: number; tripsPerHour: number }

export interface CorridorDetailDto extends CorridorSummaryDto {
  periods: PeriodDto[]
  stops: CorridorStopDto[]
  runTimes: RunTimeDto[]
  /** Days of each type in the feed's service range, over which the averages are taken. */
  serviceDays: Record<DayType, number>
  tripsPerDay: Record<DayType, number>
  tripsByPeriod: PeriodTripsDto[]
  /** Average trips entering the corridor in each clock hour 0-23. */
  hourlyTrips: Record<DayType, number[]>
  approaches: ApproachDto[]
  shape: { lat: number; lon: number; distM: number }[]
}

export { DAY_TYPES }

export interface ApproachesImportResult { created: number; updated: number }
