/**
 * Transit signal priority rules for one bus at one signal.
 *
 *  - Green extension: the request arrives during a green that ends before the bus would pass the
 *    line; the green is held up to E s and ends when the bus passes (checks out). The queue ahead
 *    of the bus counts: the extension is tried against the traffic field, and if even E s do not
 *    get the bus through it is NOT granted (no green is wasted on a bus that stops anyway).
 *  - Early green (red truncation): the bus would wait at a red; that red ends up to A s early, but
 *    not before the request arrives. Granted only when it gets the bus through sooner.
 *  - Both: an extension when it works, otherwise an early green of the red the bus then meets.
 * E and A are first capped by what the cross street can give (see cross-street.ts), so a grant
 * never takes the cross street below its minimum green or its pedestrian walk + clearance.
 * The controller is taken to predict the bus's own path exactly (deterministic model).
 * Near-side stops: a request from upstream of the stop would have to guess the dwell, so the bus
 * asks when its doors close (bus.ts). The extension then has only the run from the stop to the
 * line to work with, and a bus that closes its doors after the green has ended can only get an
 * early green; this is why near-side stops save less.
 *
 * Lockout and lateness act on the share of buses that may ask: after a grant no other grant for N
 * cycles; requests come from busesPerHour buses (Poisson), so a bus finds the signal locked with
 * probability 1 - exp(-lambda N C p), p the grant share, solved as a fixed point. With
 * conditional priority only the late share asks.
 */
import type { BusRun } from './bus'
import { type SignalPlan, extendGreen, redIndexAfter, truncateRed } from './boundary'
import type { PriorityAction, PriorityStrategy } from '../schemas/model'

/** Runs one bus (its start time fixed) through the field that a plan produces. */
export interface BusModel {
  run(plan: SignalPlan, record: boolean): BusRun
}

export interface PriorityLimits {
  strategy: PriorityStrategy
  /** already capped by the cross street */
  maxExtensionS: number
  maxEarlyGreenS: number
}

export interface PriorityOutcome {
  action: PriorityAction
  greenTakenS: number
  plan: SignalPlan
  run: BusRun
  /** the red whose start or end moved, or -1 */
  redIndex: number
}

/** Smallest change worth granting, s. */
const MIN_GAIN = 1e-6

export function decidePriority(model: BusModel, plan: SignalPlan, limits: PriorityLimits, base: BusRun, record = false): PriorityOutcome {
  const none: PriorityOutcome = { action: 'none', greenTakenS: 0, plan, run: base, redIndex: -1 }
  if (limits.strategy === 'none' || Number.isNaN(base.requestS)) return none
  const req = base.requestS
  const useExtension = limits.strategy === 'green-extension' || limits.strategy === 'both'
  const useEarly = limits.strategy === 'early-green' || limits.strategy === 'both'
  const i = redIndexAfter(plan, req)
  const n = plan.redStart.length

  if (useExtension && limits.maxExtensionS > 0 && i < n && req < plan.redStart[i] && base.crossS > plan.redStart[i]) {
    const greenEnd = plan.redStart[i]
    const trial = model.run(extendGreen(plan, i, limits.maxExtensionS), false)
    if (trial.crossS <= greenEnd + limits.maxExtensionS) {
      // held until the bus has passed; a microsecond over so that "at the line as red starts" is through
      const e = Math.max(0, trial.crossS - greenEnd) + 1e-6
      const granted = extendGreen(plan, i, e)
      return { action: 'green-extension', greenTakenS: e, plan: granted, run: model.run(granted, record), redIndex: i }
    }
  }

  if (useEarly && limits.maxEarlyGreenS > 0) {
    // the last red the bus meets before it passes the line
    const j = redIndexAfter(plan, base.crossS) - 1
    if (j >= 0 && plan.redEnd[j] > req && plan.redEnd[j] <= base.crossS) {
      const newEnd = Math.max(req, plan.redEnd[j] - limits.maxEarlyGreenS, plan.redStart[j])
      if (newEnd < plan.redEnd[j] - MIN_GAIN) {
        const truncated = truncateRed(plan, j, newEnd)
        const run = model.run(truncated, record)
        if (run.crossS < base.crossS - MIN_GAIN) {
          return { action: 'early-green', greenTakenS: plan.redEnd[j] - newEnd, plan: truncated, run, redIndex: j }
        }
      }
    }
  }
  return none
}

export interface AskingShare {
  /** share of buses that ask (all, or the late share under conditional priority) */
  askShare: number
  /** share of asking buses that find the signal locked out */
  lockedOutShare: number
  /** share of all buses granted */
  grantShare: number
}

/**
 * @param grantShareWhenAsked share of arrival phases at which an asking, unlocked bus is granted
 */
export function askingShare(p: {
  grantShareWhenAsked: number
  lateOnly: boolean
  lateShare: number
  busesPerHour: number
  cycleS: number
  lockoutCycles: number
}): AskingShare {
  const askShare = p.lateOnly ? p.lateShare : 1
  const a = p.grantShareWhenAsked * askShare
  const b = (p.busesPerHour / 3600) * p.lockoutCycles * p.cycleS
  // grant share g solves g = a exp(-b g); Newton from g = a (f is increasing and concave)
  let g = a
  for (let k = 0; k < 30 && b > 0 && a > 0; k++) {
    const e = Math.exp(-b * g)
    const next = g - (g - a * e) / (1 + a * b * e)
    if (Math.abs(next - g) < 1e-12) { g = next; break }
    g = next
  }
  const lockedOutShare = b > 0 ? 1 - Math.exp(-b * g) : 0
  return { askShare, lockedOutShare, grantShare: g }
}
