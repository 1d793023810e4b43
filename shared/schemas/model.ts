// Request and response shapes of the approach model (POST /api/model/approach and /time-space).
// Units are in the field names; every field has a default a practitioner would recognise, so a
// partial body is a what-if on the typical approach. Unknown fields are refused.
import { z } from 'zod'

const speedKmh = (def: number) => z.number().positive().max(150).default(def)
const jamDensity = z.number().min(40).max(250).default(120)

export const triangularDiagramBody = z.strictObject({
  kind: z.literal('triangular'),
  freeFlowSpeedKmh: speedKmh(60),
  backwardWaveSpeedKmh: speedKmh(20),
  jamDensityVehPerKmPerLane: jamDensity,
})

export const greenshieldsDiagramBody = z.strictObject({
  kind: z.literal('greenshields'),
  freeFlowSpeedKmh: speedKmh(60),
  jamDensityVehPerKmPerLane: jamDensity,
})

export const diagramBody = z.discriminatedUnion('kind', [triangularDiagramBody, greenshieldsDiagramBody])

export const BUS_STOP_POSITIONS = ['none', 'near-side', 'far-side'] as const
export const PRIORITY_STRATEGIES = ['none', 'green-extension', 'early-green', 'both'] as const
export type PriorityStrategy = (typeof PRIORITY_STRATEGIES)[number]
export const PRIORITY_ACTIONS = ['none', 'green-extension', 'early-green'] as const
export type PriorityAction = (typeof PRIORITY_ACTIONS)[number]
export const LOS_GRADES = ['A', 'B', 'C', 'D', 'E', 'F'] as const
export type LosGrade = (typeof LOS_GRADES)[number]

const approachShape = {
  diagram: diagramBody.prefault({ kind: 'triangular' }),
  approach: z.strictObject({
    lengthM: z.number().min(20).max(5000).default(400),
    downstreamLengthM: z.number().min(10).max(2000).default(150),
    lanes: z.int().min(1).max(8).default(1),
    arrivalFlowVehPerHour: z.number().min(0).max(20_000).default(600),
    /** for oversaturated approaches: delay is counted over this period (15 min, as in the HCM) */
    analysisPeriodMin: z.number().min(5).max(240).default(15),
  }).prefault({}),
  signal: z.strictObject({
    cycleS: z.number().min(20).max(300).default(60),
    effectiveGreenS: z.number().positive().max(300).default(30),
    /** part of the bus phase's red that is no cross-street effective green (0: all of it is) */
    lostTimeS: z.number().min(0).max(60).default(0),
  }).prefault({}),
  bus: z.strictObject({
    cruiseSpeedKmh: z.number().positive().max(120).default(50),
    accelMps2: z.number().min(0.2).max(4).default(1.2),
    decelMps2: z.number().min(0.2).max(5).default(1.2),
    stop: z.strictObject({
      position: z.enum(BUS_STOP_POSITIONS).default('none'),
      distanceM: z.number().min(0).max(2000).default(30),
      dwellS: z.number().min(0).max(600).default(20),
    }).prefault({}),
    passengers: z.number().min(0).max(300).default(30),
    /** buses per hour asking for priority at this signal (all routes); sets lockouts and totals */
    busesPerHour: z.number().min(0).max(200).default(6),
  }).prefault({}),
  priority: z.strictObject({
    strategy: z.enum(PRIORITY_STRATEGIES).default('both'),
    maxExtensionS: z.number().min(0).max(120).default(10),
    maxEarlyGreenS: z.number().min(0).max(120).default(10),
    lockoutCycles: z.int().min(0).max(20).default(1),
    checkInDistanceM: z.number().min(0).max(5000).default(150),
    /** conditional priority: only buses later than lateThresholdS ask; lateShare of them are */
    lateOnly: z.boolean().default(false),
    lateThresholdS: z.number().min(0).max(3600).default(60),
    lateShare: z.number().min(0).max(1).default(0.3),
  }).prefault({}),
  crossStreet: z.strictObject({
    arrivalFlowVehPerHour: z.number().min(0).max(20_000).default(500),
    saturationFlowVehPerHourPerLane: z.number().min(300).max(2400).default(1800),
    lanes: z.int().min(1).max(8).default(1),
    minGreenS: z.number().min(0).max(120).default(10),
    pedWalkS: z.number().min(0).max(60).default(7),
    pedClearanceS: z.number().min(0).max(120).default(12),
    carOccupancy: z.number().min(1).max(8).default(1.3),
  }).prefault({}),
}

export const approachBody = z.strictObject(approachShape)
export type ApproachBody = z.input<typeof approachBody>
export type ApproachInput = z.output<typeof approachBody>

export const timeSpaceBody = z.strictObject({
  ...approachShape,
  cycles: z.int().min(1).max(6).default(2),
  dxM: z.number().min(1).max(50).default(5),
  /** when the bus would reach the stop line running free, s into the cycle; default: where priority saves most */
  busArrivalPhaseS: z.number().min(0).max(300).optional(),
})
export type TimeSpaceBody = z.input<typeof timeSpaceBody>
export type TimeSpaceInput = z.output<typeof timeSpaceBody>

// Responses

const delayStats = z.object({
  meanDelayS: z.number(),
  medianDelayS: z.number(),
  p90DelayS: z.number(),
  /** share of buses the signal or its queue holds at least once */
  stoppedShare: z.number(),
})

export const phaseDelay = z.object({
  /** when the bus would reach the stop line running free, s into the cycle (red starts at 0) */
  phaseS: z.number(),
  baselineS: z.number(),
  /** delay of a bus that asks for priority (not locked out) at this phase */
  priorityS: z.number(),
  granted: z.boolean(),
  action: z.enum(PRIORITY_ACTIONS),
  greenTakenS: z.number(),
})
export type PhaseDelay = z.infer<typeof phaseDelay>

export const approachResult = z.object({
  solver: z.enum(['exact-triangular', 'godunov']),
  traffic: z.object({
    capacityVehPerHour: z.number(),
    degreeOfSaturation: z.number(),
    maxQueueM: z.number(),
    maxQueueVeh: z.number(),
    /** s from the start of red */
    maxQueueTimeS: z.number(),
    /** s after the start of green; null when the queue does not clear in the green */
    queueClearS: z.number().nullable(),
    /** mean delay of the car stream from the kinematic-wave solution (deterministic arrivals) */
    meanDelayS: z.number(),
    /** HCM control delay d1 + d2 (random arrivals, analysis period) */
    hcmDelayS: z.number(),
    los: z.enum(LOS_GRADES),
    residualQueueVeh: z.number(),
  }),
  bus: z.object({
    freeRunS: z.number(),
    baseline: delayStats,
    priority: delayStats.extend({ grantShare: z.number(), lockedOutShare: z.number() }),
    meanSavingS: z.number(),
  }),
  crossStreet: z.object({
    effectiveGreenS: z.number(),
    /** green that can be taken above max(min green, walk + clearance) */
    availableGreenS: z.number(),
    greenTakenPerGrantS: z.number(),
    grantsPerHour: z.number(),
    extraDelayPerGrantVehS: z.number(),
    extraQueuePerGrantVeh: z.number(),
    recoveryCycles: z.number(),
    extraDelayPerVehS: z.number(),
    delayBeforeS: z.number(),
    delayAfterS: z.number(),
    vcBefore: z.number(),
    vcAfter: z.number(),
    losBefore: z.enum(LOS_GRADES),
    losAfter: z.enum(LOS_GRADES),
  }),
  mainStreet: z.object({
    /** change of car delay on the bus approach per grant, vehicle-seconds (negative: saved) */
    delayChangePerGrantVehS: z.number(),
  }),
  /** person-seconds per hour */
  personDelay: z.object({
    busPassengersSavedS: z.number(),
    mainStreetOccupantsSavedS: z.number(),
    crossStreetOccupantsLostS: z.number(),
  }),
  /** person-seconds saved per hour, all travellers of both streets (positive: priority pays) */
  personDelayBalanceS: z.number(),
  delayByArrivalPhase: z.array(phaseDelay),
  warnings: z.array(z.string()),
})
export type ApproachResult = z.infer<typeof approachResult>

const signalInterval = z.object({ startS: z.number(), endS: z.number(), state: z.enum(['red', 'green']) })
const trajectoryPoint = z.object({ tS: z.number(), xM: z.number() })

export const timeSpaceResult = z.object({
  /** cell centres, stop line at 0, upstream negative */
  xM: z.array(z.number()),
  /** t = 0 at the start of the first red */
  tS: z.array(z.number()),
  /** one row per time, all lanes */
  densityVehPerKm: z.array(z.array(z.number())),
  jamDensityVehPerKm: z.number(),
  signal: z.array(signalInterval),
  /** the field and signal with the bus's priority grant, when it is granted */
  priorityDensityVehPerKm: z.array(z.array(z.number())).nullable(),
  prioritySignal: z.array(signalInterval),
  bus: z.object({
    arrivalPhaseS: z.number(),
    action: z.enum(PRIORITY_ACTIONS),
    greenTakenS: z.number(),
    baseline: z.array(trajectoryPoint),
    priority: z.array(trajectoryPoint),
  }),
})
export type TimeSpaceResult = z.infer<typeof timeSpaceResult>

export interface ConstraintViolation {
  /** dotted path of the field in the body */
  field: string
  reason: string
}
