// From the request body (practical units) to the model's SI quantities for one approach.
import type { ApproachInput } from '../schemas/model'
import { type Diagram, capacity, freeDensity, greenshields, speed, triangularFromWaveSpeed } from './fundamental-diagram'
import { type BusSetup, stopPenaltyS } from './bus'
import type { PriorityLimits } from './priority'
import { availableGreenS, crossStreetGreenS, crossStreetMinimumS } from './cross-street'
import { kmhToMps, perHourToPerS } from './si'

export interface PreparedApproach {
  input: ApproachInput
  /** the whole section (all lanes) */
  diagram: Diagram
  /** arrivals, veh/s */
  qa: number
  /** saturation flow of the section, veh/s */
  s: number
  cycleS: number
  greenS: number
  redS: number
  periodS: number
  bus: BusSetup
  limits: PriorityLimits
  cross: {
    q: number
    s: number
    greenS: number
    redS: number
    minimumS: number
    availableS: number
  }
  warnings: string[]
}

export function diagramOf(input: ApproachInput): Diagram {
  const lanes = input.approach.lanes
  const d = input.diagram
  return d.kind === 'triangular' ? triangularFromWaveSpeed(d, lanes) : greenshields(d, lanes)
}

export function prepareApproach(input: ApproachInput): PreparedApproach {
  const warnings: string[] = []
  const diagram = diagramOf(input)
  const qa = Math.min(perHourToPerS(input.approach.arrivalFlowVehPerHour), capacity(diagram) * (1 - 1e-9))
  const cycleS = input.signal.cycleS
  const greenS = Math.min(input.signal.effectiveGreenS, cycleS)
  const cruise = kmhToMps(input.bus.cruiseSpeedKmh)
  const trafficSpeed = speed(diagram, freeDensity(diagram, qa))
  if (cruise > trafficSpeed) warnings.push(`The bus runs with the traffic at ${(trafficSpeed * 3.6).toFixed(0)} km/h, below its cruise speed.`)
  const v = Math.min(cruise, trafficSpeed)
  const stop = input.bus.stop
  const bus: BusSetup = {
    speed: v,
    lengthM: input.approach.lengthM,
    downstreamLengthM: input.approach.downstreamLengthM,
    nearSide: stop.position === 'near-side' ? { distanceM: Math.min(stop.distanceM, input.approach.lengthM), dwellS: stop.dwellS } : null,
    farSide: stop.position === 'far-side' ? { distanceM: Math.min(stop.distanceM, input.approach.downstreamLengthM), dwellS: stop.dwellS } : null,
    checkInDistanceM: Math.min(input.priority.checkInDistanceM, input.approach.lengthM),
    accelMps2: input.bus.accelMps2,
    decelMps2: input.bus.decelMps2,
    stopPenaltyS: stopPenaltyS(v, input.bus.accelMps2, input.bus.decelMps2),
  }
  const cs = input.crossStreet
  const crossGreen = Math.max(0, crossStreetGreenS(cycleS, greenS, input.signal.lostTimeS))
  const availableS = availableGreenS(crossGreen, cs.minGreenS, cs.pedWalkS, cs.pedClearanceS)
  const pr = input.priority
  const limits: PriorityLimits = {
    strategy: pr.strategy,
    maxExtensionS: Math.min(pr.maxExtensionS, availableS),
    maxEarlyGreenS: Math.min(pr.maxEarlyGreenS, availableS),
  }
  const usesExtension = pr.strategy === 'green-extension' || pr.strategy === 'both'
  const usesEarly = pr.strategy === 'early-green' || pr.strategy === 'both'
  if ((usesExtension && pr.maxExtensionS > availableS) || (usesEarly && pr.maxEarlyGreenS > availableS)) {
    warnings.push(`Priority is capped at ${availableS.toFixed(1)} s, what the cross street can give.`)
  }
  return {
    input,
    diagram,
    qa,
    s: capacity(diagram),
    cycleS,
    greenS,
    redS: cycleS - greenS,
    periodS: input.approach.analysisPeriodMin * 60,
    bus,
    limits,
    cross: {
      q: perHourToPerS(cs.arrivalFlowVehPerHour),
      s: perHourToPerS(cs.saturationFlowVehPerHourPerLane * cs.lanes),
      greenS: crossGreen,
      redS: cycleS - crossGreen,
      minimumS: crossStreetMinimumS(cs.minGreenS, cs.pedWalkS, cs.pedClearanceS),
      availableS,
    },
    warnings,
  }
}
