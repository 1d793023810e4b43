// Runs the shared timing checks over the full set of plans an intersection would have after a
// change, and refuses it (422) when any error remains. Warnings never block a save.
import { Unprocessable } from '../../errors'
import { checkPlanSchedule, checkTiming, errorsOf, type TimingIssue } from '../../../shared/signals/checks'
import type { TimingPlanValues } from '../../../shared/signals/timing-plan'

export interface SignalContext { crossingDistanceM: number; minPedWalkS: number }

/** Errors for each plan as [index, field] paths, then schedule clashes. */
export function planSetErrors(signal: SignalContext, plans: TimingPlanValues[]): TimingIssue[] {
  const perPlan = plans.flatMap((p, i) => errorsOf(checkTiming(p, signal)).map((e) => ({ ...e, path: [i, ...e.path] })))
  return [...perPlan, ...errorsOf(checkPlanSchedule(plans))]
}

/**
 * Throws 422 when the plans break a rule. `pathOf` maps a plan index to the request path prefix
 * (['plans', i] for a whole intersection, [] for the one plan a request is about), or returns
 * null for plans that are not part of the request (their issues are then reported on `fallbackPath`).
 */
export function assertPlansValid(
  signal: SignalContext, plans: TimingPlanValues[],
  pathOf: (index: number) => (string | number)[] | null, fallbackPath: (string | number)[] = [],
): void {
  const errors = planSetErrors(signal, plans)
  if (!errors.length) return
  const issues = errors.map((e) => {
    const [index, ...rest] = e.path as [number, ...(string | number)[]]
    const prefix = pathOf(index)
    return prefix
      ? { path: [...prefix, ...rest], message: e.message }
      : { path: fallbackPath, message: `Plan "${plans[index].name}": ${e.message}` }
  })
  throw new Unprocessable('The timing breaks a rule Fanlight checks.', issues)
}

/**
 * Errors of one plan being created or changed, with field paths of that plan. The plan goes last
 * in the schedule check, so every clash with the other plans is reported on it.
 */
export function assertPlanValid(signal: SignalContext, others: TimingPlanValues[], plan: TimingPlanValues): void {
  const own = errorsOf(checkTiming(plan, signal))
  const clashes = errorsOf(checkPlanSchedule([...others, plan])).filter((e) => e.path[0] === others.length).map((e) => ({ ...e, path: e.path.slice(1) }))
  const issues = [...own, ...clashes].map((e) => ({ path: e.path, message: e.message }))
  if (issues.length) throw new Unprocessable('The timing breaks a rule Fanlight checks.', issues)
}
