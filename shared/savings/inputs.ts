// The agency's figures the savings need besides the schedule and the model: how full the buses
// are, what an hour of service costs, how much layover the schedule adds. Until the agency gives
// its own, Fanlight uses these and says so.
import type { LoadInput, SavingsInputs } from '../schemas/savings'
import { MODEL_ASSUMPTIONS } from '../proposals/model-input'

export function defaultSavingsInputs(year: number): SavingsInputs {
  return {
    // The model's own assumption of a bus's load.
    defaultLoad: MODEL_ASSUMPTIONS.busPassengers,
    loads: [],
    costPerRevenueHour: null,
    currency: 'EUR',
    costYear: year,
    // 10% of the round trip (common practice).
    layoverShare: 0.1,
  }
}

/**
 * Average load of a bus of the route in the period: the most specific row wins (route and
 * period, then route, then period, then neither), else the default.
 */
export function loadOf(inputs: Pick<SavingsInputs, 'defaultLoad' | 'loads'>, routeId: string, periodName: string | null): number {
  const match = (l: LoadInput, r: boolean, p: boolean) =>
    (r ? l.routeId === routeId : l.routeId === null) && (p ? periodName !== null && l.periodName === periodName : l.periodName === null)
  for (const [r, p] of [[true, true], [true, false], [false, true], [false, false]] as const) {
    const hit = inputs.loads.find((l) => match(l, r, p))
    if (hit) return hit.passengers
  }
  return inputs.defaultLoad
}
