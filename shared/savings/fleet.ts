// Peak vehicles of a route: a bus leaves every headway, and each one is away for a cycle (the
// round trip plus layover and recovery), so the route needs ceil(cycle / headway) buses. The
// layover is a share of the round trip; schedules are written in whole minutes, so the cycle is
// rounded up to the minute (common practice: 65 min + 10% = 71.5 -> 72 min).

/** Tolerance for ratios that are whole numbers but land a hair above in floating point. */
const EPS = 1e-9

export function cycleTimeMin(roundTripMin: number, layoverShare: number): number {
  return Math.ceil(roundTripMin * (1 + layoverShare) - EPS)
}

export function vehiclesRequired(cycleMin: number, headwayMin: number): number {
  if (!(headwayMin > 0)) throw new RangeError('the headway must be positive')
  return Math.max(0, Math.ceil(cycleMin / headwayMin - EPS))
}

export interface FleetCase {
  roundTripMin: number
  headwayMin: number
  layoverShare: number
  /** Minutes the priority takes off the round trip. */
  savedMin: number
}

export interface FleetResult {
  cycleBeforeMin: number
  cycleAfterMin: number
  before: number
  after: number
  /** A bus can come out of service in this period. */
  busSaved: boolean
}

export function fleetEffect(c: FleetCase): FleetResult {
  const cycleBeforeMin = cycleTimeMin(c.roundTripMin, c.layoverShare)
  const cycleAfterMin = cycleTimeMin(Math.max(0, c.roundTripMin - c.savedMin), c.layoverShare)
  const before = vehiclesRequired(cycleBeforeMin, c.headwayMin)
  const after = vehiclesRequired(cycleAfterMin, c.headwayMin)
  return { cycleBeforeMin, cycleAfterMin, before, after, busSaved: after < before }
}
