// Request bodies and response shapes of /api/intersections (signal assets and timing plans).
import { z } from 'zod'
import { DAY_TYPES, TIME_OF_DAY_PATTERN, type DayType } from '../signals/time-of-day'
import { PED_WALK_DEFAULT_MIN_S, PED_WALK_LOWEST_MIN_S } from '../signals/limits'

const timeOfDay = z.string().regex(TIME_OF_DAY_PATTERN, 'Use HH:MM between 00:00 and 24:00.')
const seconds = (max: number) => z.number().min(0).max(max)
export const versionField = z.number().int().positive()

export const timingPlanFields = {
  name: z.string().trim().min(1).max(60),
  dayTypes: z.array(z.enum(DAY_TYPES)).min(1, 'Give at least one day type.')
    .refine((d) => new Set(d).size === d.length, 'Each day type once.'),
  startTime: timeOfDay,
  endTime: timeOfDay,
  cycleS: z.number().positive().max(300),
  busGreenS: z.number().positive().max(300),
  yellowS: seconds(20),
  redClearanceS: seconds(20),
  crossMinGreenS: seconds(300),
  pedWalkS: seconds(120),
  pedClearanceS: seconds(120),
  offsetS: seconds(300),
  /** Pedestrians crossing the bus street walk with the cross-street green. */
  pedConcurrent: z.boolean(),
}

export const timingPlanBody = z.strictObject({ ...timingPlanFields, pedConcurrent: timingPlanFields.pedConcurrent.default(true) })
export type TimingPlanBody = z.infer<typeof timingPlanBody>

export const timingPlanPatchBody = z.strictObject({
  ...z.object(timingPlanFields).partial().shape,
  version: versionField,
})
export type TimingPlanPatchBody = z.infer<typeof timingPlanPatchBody>

const intersectionFields = {
  name: z.string().trim().min(3).max(120),
  lat: z.number().min(-90).max(90),
  lon: z.number().min(-180).max(180),
  jurisdictionId: z.string().min(1).max(100),
  crossingDistanceM: z.number().positive().max(150),
  minPedWalkS: z.number().min(PED_WALK_LOWEST_MIN_S, `No walk interval may be set below ${PED_WALK_LOWEST_MIN_S} s.`).max(PED_WALK_DEFAULT_MIN_S),
}

export const intersectionBody = z.strictObject({
  ...intersectionFields,
  minPedWalkS: intersectionFields.minPedWalkS.default(PED_WALK_DEFAULT_MIN_S),
  plans: z.array(timingPlanBody).max(24).default([]),
})
export type IntersectionBody = z.input<typeof intersectionBody>

export const intersectionPatchBody = z.strictObject({
  ...z.object(intersectionFields).partial().shape,
  version: versionField,
})
export type IntersectionPatchBody = z.infer<typeof intersectionPatchBody>

export const intersectionListQuery = z.strictObject({
  jurisdictionId: z.string().min(1).max(100).optional(),
  q: z.string().trim().max(120).optional(),
})

export const versionQuery = z.object({ version: z.coerce.number().int().positive().optional() })
export const intersectionParams = z.object({ id: z.string().min(1).max(100) })
export const timingPlanParams = z.object({ id: z.string().min(1).max(100), planId: z.string().min(1).max(100) })

export interface TimingPlanDto {
  id: string
  intersectionId: string
  name: string
  dayTypes: DayType[]
  startTime: string
  endTime: string
  cycleS: number
  busGreenS: number
  yellowS: number
  redClearanceS: number
  crossMinGreenS: number
  pedWalkS: number
  pedClearanceS: number
  offsetS: number
  pedConcurrent: boolean
  version: number
  updatedAt: string
}

export interface IntersectionDto {
  id: string
  name: string
  lat: number
  lon: number
  jurisdictionId: string
  jurisdictionName: string
  crossingDistanceM: number
  minPedWalkS: number
  version: number
  updatedAt: string
  /** Sorted by start time. */
  plans: TimingPlanDto[]
}

/** One problem in an imported CSV file; line 1 is the header. */
export interface CsvLineError {
  line: number
  column: string
  value: string
  message: string
}

export interface SignalsImportResult {
  intersectionsCreated: number
  intersectionsUpdated: number
  plansCreated: number
  plansUpdated: number
}
