// Labels and units of the calculator's fields, by the body path the model's objections use.
export interface NumberFieldSpec {
  path: string
  label: string
  unit?: string
  min?: number
  max?: number
  step?: number
  decimals?: number
  /** shown as value x scale (a share as a percentage) */
  scale?: number
}

export const FIELD_LABELS: Record<string, string> = {
  'diagram.freeFlowSpeedKmh': 'Free-flow speed',
  'diagram.backwardWaveSpeedKmh': 'Backward wave speed',
  'diagram.jamDensityVehPerKmPerLane': 'Jam density',
  'approach.lanes': 'Lanes',
  'approach.arrivalFlowVehPerHour': 'Arrival flow',
  'approach.lengthM': 'Approach modelled',
  'approach.downstreamLengthM': 'Past the line',
  'approach.analysisPeriodMin': 'Analysis period',
  'signal.cycleS': 'Cycle',
  'signal.effectiveGreenS': 'Bus phase effective green',
  'signal.lostTimeS': 'Lost time in the red',
  'bus.cruiseSpeedKmh': 'Cruise speed',
  'bus.accelMps2': 'Acceleration',
  'bus.decelMps2': 'Deceleration',
  'bus.stop.distanceM': 'Bus stop distance',
  'bus.stop.dwellS': 'Dwell',
  'bus.passengers': 'Passengers on board',
  'bus.busesPerHour': 'Buses asking per hour',
  'priority.maxExtensionS': 'Longest extension',
  'priority.maxEarlyGreenS': 'Longest early green',
  'priority.lockoutCycles': 'Lockout after a grant',
  'priority.checkInDistanceM': 'Check-in before the line',
  'priority.lateThresholdS': 'Late from',
  'priority.lateShare': 'Share of buses late',
  'crossStreet.arrivalFlowVehPerHour': 'Cross-street arrival flow',
  'crossStreet.saturationFlowVehPerHourPerLane': 'Cross-street saturation flow',
  'crossStreet.lanes': 'Cross-street lanes',
  'crossStreet.minGreenS': 'Cross-street minimum green',
  'crossStreet.pedWalkS': 'Pedestrian walk',
  'crossStreet.pedClearanceS': 'Pedestrian clearance',
  'crossStreet.carOccupancy': 'Car occupancy',
}

export const fieldLabel = (path: string): string => FIELD_LABELS[path] ?? path
