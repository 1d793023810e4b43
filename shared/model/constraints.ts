/**
 * Settings the model refuses, each with the field at fault and the reason: signal timings that
 * leave the cross street less than its minimum green or its pedestrians less than walk +
 * clearance, priority limits larger than what the cross street can give, check-in points and
 * bus stops off the modelled approach, flows no road can carry. The API answers these with 422;
 * the calculator shows them beside the fields.
 */
import type { ApproachInput, ConstraintViolation, TimeSpaceInput } from '../schemas/model'
import { capacity, maxWaveSpeed } from './fundamental-diagram'
import { availableGreenS, crossStreetGreenS, crossStreetMinimumS } from './cross-street'
import { diagramOf } from './setup'
import { perSToPerHour } from './si'

const s1 = (x: number): string => (Math.round(x * 10) / 10).toString()

export function checkApproach(input: ApproachInput): ConstraintViolation[] {
  const out: ConstraintViolation[] = []
  const { signal, crossStreet: cs, priority: pr, approach, bus } = input
  if (signal.effectiveGreenS >= signal.cycleS) {
    out.push({ field: 'signal.effectiveGreenS', reason: `the effective green (${s1(signal.effectiveGreenS)} s) must be shorter than the cycle (${s1(signal.cycleS)} s)` })
    return out
  }
  const crossGreen = crossStreetGreenS(signal.cycleS, signal.effectiveGreenS, signal.lostTimeS)
  if (crossGreen <= 0) {
    out.push({ field: 'signal.lostTimeS', reason: `the lost time leaves the cross street no green (cycle ${s1(signal.cycleS)} s - bus green ${s1(signal.effectiveGreenS)} s - lost time ${s1(signal.lostTimeS)} s)` })
    return out
  }
  if (crossGreen < cs.minGreenS) {
    out.push({ field: 'signal.effectiveGreenS', reason: `leaves the cross street ${s1(crossGreen)} s of green, less than its minimum green of ${s1(cs.minGreenS)} s` })
  }
  if (crossGreen < cs.pedWalkS + cs.pedClearanceS) {
    out.push({ field: 'signal.effectiveGreenS', reason: `leaves the cross street ${s1(crossGreen)} s of green, less than the pedestrian walk + clearance of ${s1(cs.pedWalkS + cs.pedClearanceS)} s` })
  }
  const available = availableGreenS(crossGreen, cs.minGreenS, cs.pedWalkS, cs.pedClearanceS)
  const minimum = crossStreetMinimumS(cs.minGreenS, cs.pedWalkS, cs.pedClearanceS)
  const usesExtension = pr.strategy === 'green-extension' || pr.strategy === 'both'
  const usesEarly = pr.strategy === 'early-green' || pr.strategy === 'both'
  const budget = `the cross street has ${s1(crossGreen)} s of green and needs ${s1(minimum)} s (the larger of its minimum green and walk + clearance), so ${s1(available)} s can be taken`
  if (usesExtension && pr.maxExtensionS > available) {
    out.push({ field: 'priority.maxExtensionS', reason: `an extension of ${s1(pr.maxExtensionS)} s is too long: ${budget}` })
  }
  if (usesEarly && pr.maxEarlyGreenS > available) {
    out.push({ field: 'priority.maxEarlyGreenS', reason: `an early green of ${s1(pr.maxEarlyGreenS)} s is too long: ${budget}` })
  }
  if (pr.strategy === 'both' && pr.lockoutCycles === 0 && pr.maxExtensionS + pr.maxEarlyGreenS > available
      && pr.maxExtensionS <= available && pr.maxEarlyGreenS <= available) {
    out.push({ field: 'priority.lockoutCycles', reason: `without a lockout an extension and an early green can take from the same cross-street green (${s1(pr.maxExtensionS + pr.maxEarlyGreenS)} s together): ${budget}` })
  }
  if (pr.checkInDistanceM > approach.lengthM) {
    out.push({ field: 'priority.checkInDistanceM', reason: `the check-in point (${s1(pr.checkInDistanceM)} m) lies beyond the modelled approach (${s1(approach.lengthM)} m)` })
  }
  if (bus.stop.position === 'near-side' && bus.stop.distanceM > approach.lengthM) {
    out.push({ field: 'bus.stop.distanceM', reason: `a near-side stop ${s1(bus.stop.distanceM)} m before the line lies beyond the modelled approach (${s1(approach.lengthM)} m)` })
  }
  if (bus.stop.position === 'far-side' && bus.stop.distanceM > approach.downstreamLengthM) {
    out.push({ field: 'bus.stop.distanceM', reason: `a far-side stop ${s1(bus.stop.distanceM)} m past the line lies beyond the modelled downstream stretch (${s1(approach.downstreamLengthM)} m)` })
  }
  const roadCapacity = perSToPerHour(capacity(diagramOf(input)))
  if (approach.arrivalFlowVehPerHour >= roadCapacity) {
    out.push({ field: 'approach.arrivalFlowVehPerHour', reason: `${s1(approach.arrivalFlowVehPerHour)} veh/h cannot arrive on a road whose capacity is ${s1(roadCapacity)} veh/h (${approach.lanes} lane(s) of this diagram)` })
  }
  const crossSaturation = cs.saturationFlowVehPerHourPerLane * cs.lanes
  if (cs.arrivalFlowVehPerHour >= crossSaturation) {
    out.push({ field: 'crossStreet.arrivalFlowVehPerHour', reason: `${s1(cs.arrivalFlowVehPerHour)} veh/h is more than the cross street could pass even with all green (${s1(crossSaturation)} veh/h)` })
  }
  return out
}

/** Cell updates a time-space request may cost (keeps one request well under a second). */
export const MAX_TIME_SPACE_UPDATES = 20_000_000

export function checkTimeSpace(input: TimeSpaceInput): ConstraintViolation[] {
  const out = checkApproach(input)
  const { lengthM, downstreamLengthM } = input.approach
  if (input.dxM > lengthM / 4) {
    out.push({ field: 'dxM', reason: `cells of ${s1(input.dxM)} m are too coarse for a ${s1(lengthM)} m approach (at most ${s1(lengthM / 4)} m)` })
  }
  const cells = (lengthM + downstreamLengthM) / input.dxM
  const dt = (0.9 * input.dxM) / maxWaveSpeed(diagramOf(input))
  const updates = cells * ((input.cycles + 2) * input.signal.cycleS) / dt
  if (updates > MAX_TIME_SPACE_UPDATES) {
    const minDx = input.dxM * Math.sqrt(updates / MAX_TIME_SPACE_UPDATES)
    out.push({ field: 'dxM', reason: `cells of ${s1(input.dxM)} m over ${input.cycles} cycles need ${Math.round(updates / 1e6)} million cell updates; use at least ${s1(Math.ceil(minDx * 10) / 10)} m` })
  }
  if (input.busArrivalPhaseS !== undefined && input.busArrivalPhaseS >= input.signal.cycleS) {
    out.push({ field: 'busArrivalPhaseS', reason: `the arrival phase must lie within the cycle (0 to ${s1(input.signal.cycleS)} s)` })
  }
  return out
}
