// The model input for one proposal row in one period: the corridor approach's traffic data, the
// timing plan in force, the row's priority settings and the buses of the schedule. Stored with
// every result, so each figure can be recomputed from exactly what produced it.
import type { ApproachBody } from '../schemas/model'
import type { RowSettings } from '../schemas/proposals'
import type { TimingValues } from '../signals/timing-plan'
import { intergreenS } from '../signals/timing-plan'

export interface ApproachData {
  lanes: number
  saturationFlowVehPerHourPerLane: number
  speedLimitKmh: number
  jamDensityVehPerKmPerLane: number
  crossLanes: number
  crossSaturationFlowVehPerHourPerLane: number
  stopRelation: 'near-side' | 'far-side' | 'none'
  /** Between the stop and the stop line, metres; null when unknown. */
  stopDistanceM: number | null
  dwellS: number | null
  checkInDistanceM: number
}

export interface RowModelContext {
  approach: ApproachData
  volumes: { volumeVehPerHour: number; crossVolumeVehPerHour: number }
  plan: TimingValues
  settings: RowSettings
  busesPerHour: number
}

/** Assumptions that are not data of the corridor yet; stored in every input. */
export const MODEL_ASSUMPTIONS = {
  /** Average load of a bus passing the signal. */
  busPassengers: 30,
  /** Car occupancy about 1.5 per vehicle [P: US NHTS 2017]. */
  carOccupancy: 1.5,
  /** Bus rates [TCQSM 3rd ed., from memory]. */
  busAccelMps2: 1.2,
  busDecelMps2: 1.2,
  /** Modelled stretch upstream of the stop line, at least, and downstream of it. */
  minApproachLengthM: 400,
  downstreamLengthM: 150,
  /** A near-side or far-side stop whose distance is unknown is taken this far from the line. */
  defaultStopDistanceM: 30,
  defaultDwellS: 20,
}

/**
 * Triangular diagram through the approach's saturation flow s, free speed vf (the speed limit) and
 * jam density kj: w = s vf / (vf kj - s) (the capacity point on both branches).
 */
export function backwardWaveSpeedKmh(s: number, vfKmh: number, kj: number): number {
  return (s * vfKmh) / (vfKmh * kj - s)
}

export function rowModelInput(c: RowModelContext): ApproachBody {
  const a = c.approach
  const A = MODEL_ASSUMPTIONS
  const stopDistanceM = a.stopRelation === 'none' ? A.defaultStopDistanceM : a.stopDistanceM ?? A.defaultStopDistanceM
  const lengthM = Math.max(A.minApproachLengthM, a.checkInDistanceM + 50, a.stopRelation === 'near-side' ? stopDistanceM + 50 : 0)
  const downstreamLengthM = Math.max(A.downstreamLengthM, a.stopRelation === 'far-side' ? stopDistanceM + 50 : 0)
  const pedWithCross = c.plan.pedConcurrent
  return {
    diagram: {
      kind: 'triangular',
      freeFlowSpeedKmh: a.speedLimitKmh,
      backwardWaveSpeedKmh: backwardWaveSpeedKmh(a.saturationFlowVehPerHourPerLane, a.speedLimitKmh, a.jamDensityVehPerKmPerLane),
      jamDensityVehPerKmPerLane: a.jamDensityVehPerKmPerLane,
    },
    approach: { lengthM, downstreamLengthM, lanes: a.lanes, arrivalFlowVehPerHour: c.volumes.volumeVehPerHour },
    // Effective green equals the displayed green with the usual 2 s start-up loss and 2 s use of
    // the yellow [HCM, from memory]; both intergreens are lost to either street.
    signal: { cycleS: c.plan.cycleS, effectiveGreenS: c.plan.busGreenS, lostTimeS: 2 * intergreenS(c.plan) },
    bus: {
      cruiseSpeedKmh: a.speedLimitKmh,
      accelMps2: A.busAccelMps2,
      decelMps2: A.busDecelMps2,
      stop: { position: a.stopRelation, distanceM: stopDistanceM, dwellS: a.dwellS ?? A.defaultDwellS },
      passengers: A.busPassengers,
      busesPerHour: c.busesPerHour,
    },
    priority: {
      strategy: c.settings.strategy,
      maxExtensionS: c.settings.maxExtensionS,
      maxEarlyGreenS: c.settings.maxEarlyGreenS,
      lockoutCycles: c.settings.lockoutCycles,
      checkInDistanceM: a.checkInDistanceM,
      lateOnly: c.settings.conditional.onlyLateBuses,
      lateThresholdS: c.settings.conditional.lateThresholdS,
      lateShare: c.settings.conditional.lateShare,
    },
    crossStreet: {
      arrivalFlowVehPerHour: c.volumes.crossVolumeVehPerHour,
      saturationFlowVehPerHourPerLane: a.crossSaturationFlowVehPerHourPerLane,
      lanes: a.crossLanes,
      minGreenS: c.plan.crossMinGreenS,
      // Pedestrians on their own phase do not bound the cross-street green.
      pedWalkS: pedWithCross ? c.plan.pedWalkS : 0,
      pedClearanceS: pedWithCross ? c.plan.pedClearanceS : 0,
      carOccupancy: A.carOccupancy,
    },
  }
}
