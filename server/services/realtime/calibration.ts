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
import { sql } from 'drizzle-orm'
import type { Db } from '../../db'
import { approachBody, type ApproachInput } from '../../../shared/schemas/model'
import { evaluateApproach } from '../../../shared/model/approach'
import { prepareApproach } from '../../../shared/model/setup'
import { minutesOfDay, windowIntervals, type DayType } from '../../../shared/signals/time-of-day'
import { planInForce, type TimingPlanValues } from '../../../shared/signals/timing-plan'
import { observeCorridor } from './observations'
import { median } from './statistics'
import { SEGMENT_DOWNSTREAM_M, SEGMENT_UPSTREAM_M } from './derive'
import type { CalibrationDto, CalibrationRowDto, SegmentDefinitionDto } from '../../../shared/schemas/realtime'

export const TOLERANCE_S = 5
export const TOLERANCE_SHARE = 0.25
/** Fewer trips than this give a figure too noisy to suggest changes from. */
const MIN_TRIPS_FOR_SUGGESTION = 5

interface ApproachData {
  id: string
  distanceM: number
  lanes: number
  saturationFlowVehPerHourPerLane: number
  speedLimitKmh: number
  jamDensityVehPerKmPerLane: number
  crossLanes: number
  crossSaturationFlowVehPerHourPerLane: number
  stopRelation: 'near-side' | 'far-side' | 'none'
  stopId: string | null
  dwellS: number | null
  checkInDistanceM: number
  intersectionId: string
}

async function loadModelData(db: Db, corridorId: string) {
  const approaches = (await db.execute<Record<string, unknown>>(sql`
    select id, distance_m, lanes, saturation_flow_veh_per_hour_per_lane, speed_limit_kmh, jam_density_veh_per_km_per_lane, cross_lanes,
      cross_saturation_flow_veh_per_hour_per_lane, stop_relation, stop_id, dwell_s, check_in_distance_m, intersection_id
    from corridor_approaches where corridor_id = ${corridorId}`)).rows.map((r): ApproachData => ({
    id: String(r.id), distanceM: Number(r.distance_m), lanes: Number(r.lanes),
    saturationFlowVehPerHourPerLane: Number(r.saturation_flow_veh_per_hour_per_lane), speedLimitKmh: Number(r.speed_limit_kmh),
    jamDensityVehPerKmPerLane: Number(r.jam_density_veh_per_km_per_lane), crossLanes: Number(r.cross_lanes),
    crossSaturationFlowVehPerHourPerLane: Number(r.cross_saturation_flow_veh_per_hour_per_lane),
    stopRelation: r.stop_relation as ApproachData['stopRelation'], stopId: (r.stop_id as string | null) ?? null,
    dwellS: r.dwell_s === null ? null : Number(r.dwell_s), checkInDistanceM: Number(r.check_in_distance_m), intersectionId: String(r.intersection_id),
  }))
  const volumes = (await db.execute<{ approach_id: string; period_id: string; volume: number; cross: number }>(sql`
    select v.approach_id, v.period_id, v.volume_veh_per_hour as volume, v.cross_volume_veh_per_hour as cross
    from approach_volumes v join corridor_approaches a on a.id = v.approach_id where a.corridor_id = ${corridorId}`)).rows
  const plans = (await db.execute<Record<string, unknown>>(sql`
    select p.* from timing_plans p join corridor_approaches a on a.intersection_id = p.intersection_id where a.corridor_id = ${corridorId}`)).rows
    .map((r) => ({
      intersectionId: String(r.intersection_id),
      plan: {
        name: String(r.name), dayTypes: r.day_types as DayType[], startTime: String(r.start_time), endTime: String(r.end_time),
        cycleS: Number(r.cycle_s), busGreenS: Number(r.bus_green_s), yellowS: Number(r.yellow_s), redClearanceS: Number(r.red_clearance_s),
        crossMinGreenS: Number(r.cross_min_green_s), pedWalkS: Number(r.ped_walk_s), pedClearanceS: Number(r.ped_clearance_s),
        offsetS: Number(r.offset_s), pedConcurrent: Boolean(r.ped_concurrent),
      } satisfies TimingPlanValues,
    }))
  return { approaches, volumes, plans }
}

/**
 * Backward wave speed that gives the approach's saturation flow with its free speed and jam
 * density on the triangular diagram: s = v w kj / (v + w)  =>  w = s v / (v kj - s)
 * (Newell 1993; Daganzo 1994: capacity of the triangular diagram).
 */
export function backwardWaveSpeedKmh(saturationFlowPerLane: number, freeSpeedKmh: number, jamDensityPerKm: number): number {
  const denom = freeSpeedKmh * jamDensityPerKm - saturationFlowPerLane
  return denom > 0 ? Math.min(150, (saturationFlowPerLane * freeSpeedKmh) / denom) : 150
}

/** The model's input for one approach in one period under one timing plan, without priority. */
export function baselineInput(a: ApproachData, volume: number, crossVolume: number, plan: TimingPlanValues, stopDistanceM: number | null): ApproachInput {
  const intergreen = plan.yellowS + plan.redClearanceS
  return approachBody.parse({
    diagram: {
      kind: 'triangular',
      freeFlowSpeedKmh: a.speedLimitKmh,
      backwardWaveSpeedKmh: backwardWaveSpeedKmh(a.saturationFlowVehPerHourPerLane, a.speedLimitKmh, a.jamDensityVehPerKmPerLane),
      jamDensityVehPerKmPerLane: Math.min(250, Math.max(40, a.jamDensityVehPerKmPerLane)),
    },
    approach: { lengthM: SEGMENT_UPSTREAM_M, downstreamLengthM: SEGMENT_DOWNSTREAM_M, lanes: a.lanes, arrivalFlowVehPerHour: volume },
    // Effective green = displayed green: start-up lost time and the use of the yellow cancel
    // (about 2 s each; HCM, from memory). Both intergreens are lost to both streets.
    signal: { cycleS: plan.cycleS, effectiveGreenS: plan.busGreenS, lostTimeS: 2 * intergreen },
    bus: {
      cruiseSpeedKmh: Math.min(50, a.speedLimitKmh),
      stop: a.stopRelation === 'none' || stopDistanceM === null
        ? { position: 'none' }
        : { position: a.stopRelation, distanceM: Math.min(stopDistanceM, a.stopRelation === 'near-side' ? SEGMENT_UPSTREAM_M : SEGMENT_DOWNSTREAM_M), dwellS: a.dwellS ?? 20 },
    },
    priority: { strategy: 'none' },
    crossStreet: {
      arrivalFlowVehPerHour: crossVolume, saturationFlowVehPerHourPerLane: a.crossSaturationFlowVehPerHourPerLane, lanes: a.crossLanes,
      minGreenS: plan.crossMinGreenS, pedWalkS: plan.pedWalkS, pedClearanceS: plan.pedClearanceS,
    },
  })
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

function periodMidMinute(p: { startTime: string; endTime: string }): number {
  const [first] = windowIntervals(p)
  return first ? (first[0] + first[1]) / 2 : minutesOfDay(p.startTime)
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
    for (const dayType of ['weekday', 'saturday', 'sunday'] as DayType[]) {
      for (const period of corridor.periods) {
        const samples = derived.trips.filter((t) => t.dayType === dayType)
          .flatMap((t) => t.segments.filter((s) => s.approachId === seg.approachId && s.periodId === period.id))
        if (samples.length === 0) continue
        const plan = planInForce(data.plans.filter((p) => p.intersectionId === a.intersectionId).map((p) => p.plan), dayType, periodMidMinute(period))
        const vol = data.volumes.find((v) => v.approach_id === a.id && v.period_id === period.id)
        rows.push(calibrationRow(seg, a, period, dayType, samples, plan ?? null, vol ? { volume: Number(vol.volume), cross: Number(vol.cross) } : null,
          stopInSegment ? Math.abs(stopAt! - a.distanceM) : null))
      }
    }
  }
  return { corridorId, toleranceS: TOLERANCE_S, toleranceShare: TOLERANCE_SHARE, rows }
}

function calibrationRow(
  seg: SegmentDefinitionDto, a: ApproachData, period: { id: string; name: string }, dayType: DayType,
  samples: { travelS: number; dwellS: number | null }[], plan: TimingPlanValues | null, vol: { volume: number; cross: number } | null,
  stopDistanceM: number | null,
): CalibrationRowDto {
  const lengthM = seg.toM - seg.fromM
  const input = plan && vol ? baselineInput(a, vol.volume, vol.cross, plan, stopDistanceM) : null
  // The bus's running speed and stopping penalty as the model has them (without a plan or
  // volumes, the approach's speed with the model's default bus).
  const bus = prepareApproach(input ?? baselineInput(a, 0, 0, FALLBACK_PLAN, stopDistanceM)).bus
  const observedDwells = samples.filter((s) => s.dwellS !== null).map((s) => s.dwellS!)
  const dwellFrom: CalibrationRowDto['dwellFrom'] = observedDwells.length ? 'observed' : stopDistanceM !== null ? 'input' : 'none'
  // Running time of each trip: the segment time without its dwell and the time lost stopping for it.
  const running = samples.map((s) => {
    const dwell = s.dwellS ?? (stopDistanceM !== null ? a.dwellS ?? 20 : 0)
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
        field: 'volumeVehPerHour', current: vol!.volume, suggested: match.volume, modelDelayS: round(match.delayS),
        note: `With ${match.volume} veh/h instead of ${vol!.volume} the model gives ${round(match.delayS)} s; check it against a count before changing it.`,
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

/** Only for the bus's speed and stop penalty when no real plan exists; never evaluated. */
const FALLBACK_PLAN: TimingPlanValues = {
  name: '', dayTypes: [], startTime: '00:00', endTime: '24:00', cycleS: 90, busGreenS: 45, yellowS: 4, redClearanceS: 1,
  crossMinGreenS: 10, pedWalkS: 7, pedClearanceS: 12, offsetS: 0, pedConcurrent: true,
}
