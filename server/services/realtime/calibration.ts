// Observed signal delay beside the model's prediction, per intersection, period and day type.
//
// Observed delay of a trip at an intersection = its segment time minus the free run over the
// segment and the dwell at a stop inside it: the same split the model makes (shared/model/bus.ts:
// the free run includes the dwell and the time lost stopping for it, so the delay is the signal's).
// The free run is the model's: the segment at the bus's speed on the approach (its cruise speed
// capped by the speed limit). Buses held back by traffic between signals therefore show that as
// delay too, which the calibration is there to reveal.
// The model's figure is the mean baseline (no priority) bus delay for the approach's data in that
// period and the timing plan in force. Where they disagree, the arrival volume that would make
// the model match is looked for by bisection (bus delay grows with the volume): a suggestion for
// the planner and engineer to check against counts, not an automatic change.
import { eq, inArray } from 'drizzle-orm'
import type { Db } from '../../db'
import { approachVolumes, corridorApproaches, timingPlans } from '../../db/schema'
import { approachBody, type ApproachInput } from '../../../shared/schemas/model'
import { DEFAULT_ROW_SETTINGS } from '../../../shared/schemas/proposals'
import { MODEL_ASSUMPTIONS, rowModelInput } from '../../../shared/proposals/model-input'
import { evaluateApproach } from '../../../shared/model/approach'
import { prepareApproach } from '../../../shared/model/setup'
import { stopPenaltyS } from '../../../shared/model/bus'
import type { DayType } from '../../../shared/signals/time-of-day'
import { planForPeriod } from '../proposals/evaluation-context'
import { observeCorridor } from './observations'
import { median } from './statistics'
import type { CalibrationDto, CalibrationRowDto, SegmentDefinitionDto } from '../../../shared/schemas/realtime'

export const TOLERANCE_S = 5
export const TOLERANCE_SHARE = 0.25
/** Fewer trips than this give a figure too noisy to suggest changes from. */
const MIN_TRIPS_FOR_SUGGESTION = 5

type ApproachRow = typeof corridorApproaches.$inferSelect
type PlanRow = typeof timingPlans.$inferSelect

async function loadModelData(db: Db, corridorId: string) {
  const approaches = await db.select().from(corridorApproaches).where(eq(corridorApproaches.corridorId, corridorId))
  const ids = approaches.map((a) => a.id)
  const volumes = ids.length ? await db.select().from(approachVolumes).where(inArray(approachVolumes.approachId, ids)) : []
  const intersections = approaches.map((a) => a.intersectionId)
  const plans = intersections.length ? await db.select().from(timingPlans).where(inArray(timingPlans.intersectionId, intersections)) : []
  return { approaches, volumes, plans }
}

/**
 * The model's input for one approach in one period without priority, built as the proposals'
 * evaluation builds it (shared/proposals/model-input.ts), so "the model" here is the same model
 * the approval table shows.
 */
export function baselineInput(a: ApproachRow, volumes: { volumeVehPerHour: number; crossVolumeVehPerHour: number }, plan: PlanRow, stopDistanceM: number | null): ApproachInput {
  return approachBody.parse(rowModelInput({
    approach: {
      lanes: a.lanes, saturationFlowVehPerHourPerLane: a.saturationFlowVehPerHourPerLane, speedLimitKmh: a.speedLimitKmh,
      jamDensityVehPerKmPerLane: a.jamDensityVehPerKmPerLane, crossLanes: a.crossLanes,
      crossSaturationFlowVehPerHourPerLane: a.crossSaturationFlowVehPerHourPerLane, stopRelation: a.stopRelation,
      stopDistanceM, dwellS: a.dwellS, checkInDistanceM: a.checkInDistanceM,
    },
    volumes,
    plan,
    settings: { ...DEFAULT_ROW_SETTINGS, strategy: 'none' },
    // Only the priority and totals use the bus count; the baseline delay of one bus does not.
    busesPerHour: 0,
  }))
}

const modelDelay = (input: ApproachInput) => evaluateApproach(input, { phaseStepS: 1 }).bus.baseline.meanDelayS

/**
 * Arrival volume at which the model's mean bus delay equals target, or null if none within half
 * to twice the current volume does (a count off by more than that is not what a calibration fixes).
 */
export function volumeMatching(input: ApproachInput, targetS: number): { volume: number; delayS: number } | null {
  const current = input.approach.arrivalFlowVehPerHour
  const at = (v: number) => modelDelay({ ...input, approach: { ...input.approach, arrivalFlowVehPerHour: v } })
  let lo = current / 2, hi = Math.min(20_000, Math.max(100, 2 * current))
  const dLo = at(lo), dHi = at(hi)
  if (targetS < dLo - 0.5 || targetS > dHi + 0.5) return null
  for (let i = 0; i < 20 && hi - lo > 2; i++) {
    const mid = (lo + hi) / 2
    if (at(mid) < targetS) lo = mid
    else hi = mid
  }
  const volume = Math.round((lo + hi) / 20) * 10
  return { volume, delayS: at(volume) }
}

export async function corridorCalibration(db: Db, corridorId: string, from?: string, to?: string): Promise<CalibrationDto> {
  const { corridor, derived } = await observeCorridor(db, corridorId, from, to)
  const data = await loadModelData(db, corridorId)
  const stopDist = new Map(corridor.stops.map((s) => [s.stopId, s.distanceM]))
  const rows: CalibrationRowDto[] = []
  for (const seg of derived.segments) {
    const a = data.approaches.find((x) => x.id === seg.approachId)!
    const stopAt = a.stopId ? stopDist.get(a.stopId) ?? null : null
    const stopInSegment = stopAt !== null && a.stopRelation !== 'none' && stopAt >= seg.fromM && stopAt < seg.toM
    const plans = data.plans.filter((p) => p.intersectionId === a.intersectionId)
    for (const dayType of ['weekday', 'saturday', 'sunday'] as DayType[]) {
      for (const period of corridor.periods) {
        const samples = derived.trips.filter((t) => t.dayType === dayType)
          .flatMap((t) => t.segments.filter((s) => s.approachId === seg.approachId && s.periodId === period.id))
        if (samples.length === 0) continue
        const vol = data.volumes.find((v) => v.approachId === a.id && v.periodId === period.id) ?? null
        rows.push(calibrationRow(seg, a, period, dayType, samples, planForPeriod(plans, period, dayType), vol,
          stopInSegment ? Math.abs(stopAt! - a.distanceM) : null))
      }
    }
  }
  return { corridorId, toleranceS: TOLERANCE_S, toleranceShare: TOLERANCE_SHARE, rows }
}

function calibrationRow(
  seg: SegmentDefinitionDto, a: ApproachRow, period: { id: string; name: string }, dayType: DayType,
  samples: { travelS: number; dwellS: number | null }[], plan: PlanRow | null, vol: { volumeVehPerHour: number; crossVolumeVehPerHour: number } | null,
  stopDistanceM: number | null,
): CalibrationRowDto {
  const lengthM = seg.toM - seg.fromM
  const input = plan && vol ? baselineInput(a, vol, plan, stopDistanceM) : null
  // The bus's running speed and stopping penalty as the model has them; without a plan or
  // volumes, the model's bus at the speed limit (its speed on an empty street).
  const bus = input ? prepareApproach(input).bus : (() => {
    const speed = a.speedLimitKmh / 3.6
    return { speed, stopPenaltyS: stopPenaltyS(speed, MODEL_ASSUMPTIONS.busAccelMps2, MODEL_ASSUMPTIONS.busDecelMps2) }
  })()
  const observedDwells = samples.filter((s) => s.dwellS !== null).map((s) => s.dwellS!)
  const dwellFrom: CalibrationRowDto['dwellFrom'] = observedDwells.length ? 'observed' : stopDistanceM !== null ? 'input' : 'none'
  // Running time of each trip: the segment time without its dwell and the time lost stopping for it.
  const running = samples.map((s) => {
    const dwell = s.dwellS ?? (stopDistanceM !== null ? a.dwellS ?? MODEL_ASSUMPTIONS.defaultDwellS : 0)
    return { dwell, runS: s.travelS - dwell - (dwell > 0 ? bus.stopPenaltyS : 0) }
  })
  const freeRun = lengthM / bus.speed
  const delays = running.map((r) => r.runS - freeRun)
  const meanDwell = running.reduce((x, r) => x + r.dwell, 0) / running.length
  const observed = delays.reduce((x, y) => x + y, 0) / delays.length
  const round = (v: number) => Math.round(v * 10) / 10
  const base = {
    approachId: seg.approachId, intersectionId: seg.intersectionId, intersectionName: seg.intersectionName, periodId: period.id, periodName: period.name,
    dayType, trips: samples.length, segmentLengthM: round(lengthM), observedTravelS: round(samples.reduce((x, y) => x + y.travelS, 0) / samples.length),
    freeRunS: round(freeRun), dwellS: round(meanDwell), dwellFrom, observedDelayS: round(observed), observedMedianDelayS: round(median(delays)),
  }
  if (!input) {
    const missing = !plan ? 'no timing plan is in force for this period and day type' : 'the approach has no volumes for this period'
    return { ...base, modelDelayS: null, differenceS: null, agrees: null, suggestion: null, note: `No model figure: ${missing}.` }
  }
  const predicted = modelDelay(input)
  const diff = observed - predicted
  const agrees = Math.abs(diff) <= Math.max(TOLERANCE_S, TOLERANCE_SHARE * predicted)
  let suggestion: CalibrationRowDto['suggestion'] = null
  let note = agrees ? 'The model agrees with what buses did.' : ''
  if (!agrees && samples.length < MIN_TRIPS_FOR_SUGGESTION) {
    note = `Too few trips (${samples.length}) to suggest a change; collect more snapshots.`
  } else if (!agrees) {
    const match = volumeMatching(input, Math.max(0, observed))
    if (match) {
      suggestion = {
        field: 'volumeVehPerHour', current: vol!.volumeVehPerHour, suggested: match.volume, modelDelayS: round(match.delayS),
        note: `With ${match.volume} veh/h instead of ${vol!.volumeVehPerHour} the model gives ${round(match.delayS)} s; check it against a count before changing it.`,
      }
      note = diff > 0 ? 'Buses were held longer than the model predicts.' : 'Buses were held less than the model predicts.'
    } else {
      note = diff > 0
        ? 'Buses were held longer than even twice the volume explains: check the timing plan in force, detector faults or queues from downstream.'
        : 'Buses were held less than the model predicts even with half the volume: arrivals are likely coordinated with the green (progression), which the model does not assume.'
    }
  }
  return { ...base, modelDelayS: round(predicted), differenceS: round(diff), agrees, suggestion, note }
}
