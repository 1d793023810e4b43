/**
 * Trade-off sweep of one approach: the priority strategy and its limits over a grid (maximum
 * extension and early green from 0 to a cap, lockout cycles, every bus or late buses only), each
 * setting with what the bus gains, what the cross street pays and the limits it breaks.
 *
 * Every point is the exact solver's answer (evaluateApproach, Newell's cumulative counts); the
 * work the grid shares is done once:
 *  - The model caps a limit at the green the cross street can give, so every larger value shares
 *    the capped one; a strategy that leaves a limit unused is that limit at 0 (decidePriority
 *    never grants a 0 s limit).
 *  - With both strategies a bus gets the extension when the extension works and otherwise the
 *    early green of the red it meets (priority.ts). Below saturation one cycle of arrival phases
 *    is exact and the model reports each phase (delayByArrivalPhase), so the pair (E, A) is
 *    composed phase by phase from one run with extension E and one with early green A: 2 x 21
 *    runs instead of 21 x 21. Oversaturated approaches average several cycles per phase; there
 *    each pair is run.
 *  - Lockout and lateness only change which buses may ask (askingShare): the runs are made with
 *    every bus asking and no lockout, and each condition is summed up from them with the model's
 *    own per-hour formulas (approach.ts, summarise).
 * tests/unit/model/sweep.test.ts holds every point of several approaches to a direct evaluation.
 */
import type { ApproachInput, ApproachResult, LosGrade, PhaseDelay, PriorityAction, PriorityStrategy } from '../schemas/model'
import { LOS_RANK, NO_CITY_LIMITS, type CityLimits } from '../schemas/city-limits'
import { gridValues, type PointViolation, type SweepPoint, type SweepRanges, type SweepSettings } from '../schemas/sweep'
import { evaluateApproach } from './approach'
import { askingShare } from './priority'
import { busApproachChanges, crossStreetChanges, grantEffect } from './cross-street'
import { levelOfService } from './hcm'
import { prepareApproach } from './setup'
import { perSToPerHour } from './si'

const EPS = 1e-9
const s1 = (x: number): string => (Math.round(x * 10) / 10).toString()

export const usesExtension = (s: PriorityStrategy): boolean => s === 'green-extension' || s === 'both'
export const usesEarlyGreen = (s: PriorityStrategy): boolean => s === 'early-green' || s === 'both'

export interface SweepBaseline {
  vcBefore: number
  losBefore: LosGrade
  /** cross-street green a grant may take, s */
  availableGreenS: number
  /** the larger of the cross street's minimum green and pedestrian walk + clearance, s */
  crossMinimumS: number
}

export interface SweepEvaluator {
  /** The point of any settings (on the grid or not). */
  point(settings: SweepSettings): SweepPoint
  baseline: SweepBaseline
  /** exact model runs so far */
  runs(): number
}

/** What one pair of limits gives when every bus asks and none is locked out. */
interface PairFigures {
  /** share of arrival phases granted */
  grantShare: number
  /** mean bus saving, s */
  savingS: number
  takenPerGrantS: number
  crossExtraPerGrantVehS: number
  mainChangePerGrantVehS: number
}

/** A memo keyed by a pair of limits (numbers, not strings: looked up for every point). */
function pairMemo<T>() {
  const rows = new Map<number, Map<number, T>>()
  return {
    get: (e: number, a: number): T | undefined => rows.get(e)?.get(a),
    set(e: number, a: number, v: T): void {
      let row = rows.get(e)
      if (!row) rows.set(e, (row = new Map()))
      row.set(a, v)
    },
    size: () => [...rows.values()].reduce((n, r) => n + r.size, 0),
  }
}

const fromResult = (r: ApproachResult): PairFigures => ({
  grantShare: r.bus.priority.grantShare,
  savingS: r.bus.meanSavingS,
  takenPerGrantS: r.crossStreet.greenTakenPerGrantS,
  crossExtraPerGrantVehS: r.crossStreet.extraDelayPerGrantVehS,
  mainChangePerGrantVehS: r.mainStreet.delayChangePerGrantVehS,
})

/**
 * @param input a valid approach (checkApproach passes with priority off); triangular diagram
 * @param limits the city's limits the points are marked against
 */
export function sweepEvaluator(input: ApproachInput, limits: CityLimits = NO_CITY_LIMITS): SweepEvaluator {
  if (input.diagram.kind !== 'triangular') throw new RangeError('the sweep uses the exact solver, which needs the triangular diagram')
  const p = prepareApproach(input)
  const cr = p.cross
  const C = p.cycleS
  const cs = input.crossStreet
  const ped = cs.pedWalkS + cs.pedClearanceS
  const crossPerHour = perSToPerHour(cr.q)
  const crossSatPerHour = perSToPerHour(cr.s)
  const maxCycles = Math.max(4, Math.ceil(p.periodS / C))
  const runs = pairMemo<ApproachResult>()
  const pairs = pairMemo<PairFigures>()

  const run = (e: number, a: number): ApproachResult => {
    let r = runs.get(e, a)
    if (!r) {
      const strategy: PriorityStrategy = e > 0 && a > 0 ? 'both' : e > 0 ? 'green-extension' : a > 0 ? 'early-green' : 'none'
      r = evaluateApproach({
        ...input,
        priority: { ...input.priority, strategy, maxExtensionS: e, maxEarlyGreenS: a, lockoutCycles: 0, lateOnly: false },
      }, { solver: 'exact' })
      runs.set(e, a, r)
    }
    return r
  }

  const none = run(0, 0)
  const composable = none.traffic.degreeOfSaturation < 1

  // what each distinct grant costs the cross street and gives the bus approach, as the model works it out
  // (keyed by number: the green taken varies by phase, and formatting it as a string costs more than the effect)
  const effects = { 'green-extension': new Map<number, [number, number]>(), 'early-green': new Map<number, [number, number]>() }
  const effectOf = (action: Exclude<PriorityAction, 'none'>, taken: number): [number, number] => {
    const memo = effects[action]
    let e = memo.get(taken)
    if (!e) {
      e = [
        grantEffect(cr.q, cr.s, cr.redS, cr.greenS, crossStreetChanges(action, taken), maxCycles).extraVehS,
        grantEffect(p.qa, p.s, p.redS, p.greenS, busApproachChanges(action, taken), maxCycles).extraVehS,
      ]
      memo.set(taken, e)
    }
    return e
  }

  /** Both strategies, phase by phase: the extension where it is granted, else the early green. */
  const compose = (ext: readonly PhaseDelay[], early: readonly PhaseDelay[]): PairFigures => {
    const n = ext.length
    let granted = 0
    let saving = 0
    let taken = 0
    let cross = 0
    let main = 0
    for (let k = 0; k < n; k++) {
      const ph = ext[k].action === 'green-extension' ? ext[k] : early[k]
      saving += ph.baselineS - ph.priorityS
      if (ph.action === 'none') continue
      granted++
      taken += ph.greenTakenS
      const [c, m] = effectOf(ph.action, ph.greenTakenS)
      cross += c
      main += m
    }
    const g = granted || 1
    return {
      grantShare: n ? granted / n : 0,
      savingS: n ? saving / n : 0,
      takenPerGrantS: granted ? taken / g : 0,
      crossExtraPerGrantVehS: granted ? cross / g : 0,
      mainChangePerGrantVehS: granted ? main / g : 0,
    }
  }

  const pair = (e: number, a: number): PairFigures => {
    let f = pairs.get(e, a)
    if (!f) {
      f = e > 0 && a > 0 && composable
        ? compose(run(e, 0).delayByArrivalPhase, run(0, a).delayByArrivalPhase)
        : fromResult(run(e, a))
      pairs.set(e, a, f)
    }
    return f
  }

  const baseline: SweepBaseline = {
    vcBefore: none.crossStreet.vcBefore,
    losBefore: none.crossStreet.losBefore,
    availableGreenS: cr.availableS,
    crossMinimumS: cr.minimumS,
  }
  const delayBeforeS = none.crossStreet.delayBeforeS

  function floors(taken: number, what: string): PointViolation[] {
    const left = cr.greenS - taken
    const out: PointViolation[] = []
    if (left < cs.minGreenS - EPS) {
      out.push({ constraint: 'min-green', detail: `${what} leaves the cross street ${s1(left)} s of green, less than its minimum green of ${s1(cs.minGreenS)} s` })
    }
    if (left < ped - EPS) {
      out.push({ constraint: 'ped-walk-clearance', detail: `${what} leaves the cross street ${s1(left)} s of green, less than the pedestrian walk + clearance of ${s1(ped)} s` })
    }
    return out
  }

  function point(settings: SweepSettings): SweepPoint {
    const { strategy, maxExtensionS: E, maxEarlyGreenS: A, lockoutCycles: L, lateOnly } = settings
    const ext = usesExtension(strategy)
    const early = usesEarlyGreen(strategy)
    const f = pair(ext ? Math.min(E, cr.availableS) : 0, early ? Math.min(A, cr.availableS) : 0)

    // the model's summary (approach.ts) for this lockout and condition
    const share = askingShare({
      grantShareWhenAsked: f.grantShare,
      lateOnly,
      lateShare: input.priority.lateShare,
      busesPerHour: input.bus.busesPerHour,
      cycleS: C,
      lockoutCycles: L,
    })
    const served = share.askShare * (1 - share.lockedOutShare)
    const busSavingPerTripS = served * f.savingS
    const grantsPerHour = input.bus.busesPerHour * share.grantShare
    const crossExtraDelayPerVehS = crossPerHour > 0 ? (grantsPerHour * f.crossExtraPerGrantVehS) / crossPerHour : 0
    const takenPerCycle = (grantsPerHour * f.takenPerGrantS * C) / 3600
    const vcAfter = crossPerHour / ((crossSatPerHour * Math.max(1e-9, cr.greenS - takenPerCycle)) / C)
    const losAfter = levelOfService(delayBeforeS + crossExtraDelayPerVehS, vcAfter)
    const occupancy = cs.carOccupancy
    const personDelayBalanceS = input.bus.busesPerHour * input.bus.passengers * busSavingPerTripS
      - grantsPerHour * f.mainChangePerGrantVehS * occupancy
      - grantsPerHour * f.crossExtraPerGrantVehS * occupancy

    const violations: PointViolation[] = []
    if (ext && E > cr.availableS + EPS) violations.push(...floors(E, `an extension of ${s1(E)} s`))
    if (early && A > cr.availableS + EPS) violations.push(...floors(A, `an early green of ${s1(A)} s`))
    if (ext && early && L === 0 && E <= cr.availableS + EPS && A <= cr.availableS + EPS && E + A > cr.availableS + EPS) {
      violations.push(...floors(E + A, `without a lockout, one green losing both the extension and the early green (${s1(E + A)} s)`))
    }
    if (ext && limits.maxExtensionS !== null && E > limits.maxExtensionS + EPS) {
      violations.push({ constraint: 'max-extension', detail: `an extension of ${s1(E)} s is above the city’s maximum of ${s1(limits.maxExtensionS)} s` })
    }
    if (early && limits.maxEarlyGreenS !== null && A > limits.maxEarlyGreenS + EPS) {
      violations.push({ constraint: 'max-early-green', detail: `an early green of ${s1(A)} s is above the city’s maximum of ${s1(limits.maxEarlyGreenS)} s` })
    }
    if (strategy !== 'none' && L < limits.minLockoutCycles) {
      violations.push({ constraint: 'min-lockout', detail: `a lockout of ${L} cycle${L === 1 ? '' : 's'} is less than the city’s minimum recovery of ${limits.minLockoutCycles}` })
    }
    // The city's v/c and LOS limits bound what priority does to the cross street: above the limit,
    // or past it where the street is there already (then no worse than it is without priority).
    if (limits.maxCrossVc !== null && vcAfter > Math.max(limits.maxCrossVc, baseline.vcBefore) + EPS) {
      violations.push({
        constraint: 'max-vc',
        detail: baseline.vcBefore > limits.maxCrossVc
          ? `the cross street’s v/c rises from ${baseline.vcBefore.toFixed(2)} to ${vcAfter.toFixed(2)}, already above the city’s limit of ${limits.maxCrossVc.toFixed(2)}`
          : `the cross street’s v/c becomes ${vcAfter.toFixed(2)}, above the city’s limit of ${limits.maxCrossVc.toFixed(2)}`,
      })
    }
    if (limits.worstLos !== null && LOS_RANK[losAfter] > Math.max(LOS_RANK[limits.worstLos], LOS_RANK[baseline.losBefore])) {
      violations.push({
        constraint: 'worst-los',
        detail: LOS_RANK[baseline.losBefore] > LOS_RANK[limits.worstLos]
          ? `the cross street falls from level of service ${baseline.losBefore} to ${losAfter}, already worse than the city’s ${limits.worstLos}`
          : `the cross street falls to level of service ${losAfter}, worse than the city’s ${limits.worstLos}`,
      })
    }

    return { settings, busSavingPerTripS, crossExtraDelayPerVehS, personDelayBalanceS, vcAfter, losAfter, grantsPerHour, violations }
  }

  return { point, baseline, runs: () => runs.size() }
}

/** The grid of a sweep, in its fixed order: no priority first, then each strategy. */
export function sweepGrid(ranges: SweepRanges): SweepSettings[] {
  const out: SweepSettings[] = [{ strategy: 'none', maxExtensionS: 0, maxEarlyGreenS: 0, lockoutCycles: 0, lateOnly: false }]
  const eValues = gridValues(ranges.maxExtensionCapS, ranges.stepS)
  const aValues = gridValues(ranges.maxEarlyGreenCapS, ranges.stepS)
  const push = (strategy: SweepSettings['strategy'], E: number, A: number) => {
    for (const L of ranges.lockoutCycles) for (const lateOnly of ranges.conditional) out.push({ strategy, maxExtensionS: E, maxEarlyGreenS: A, lockoutCycles: L, lateOnly })
  }
  for (const strategy of ranges.strategies) {
    if (strategy === 'green-extension') for (const E of eValues) push(strategy, E, 0)
    else if (strategy === 'early-green') for (const A of aValues) push(strategy, 0, A)
    else for (const E of eValues) for (const A of aValues) push(strategy, E, A)
  }
  return out
}

export interface SweepOutcome {
  points: SweepPoint[]
  baseline: SweepBaseline
  /** exact model runs the sweep made */
  runs: number
}

export function sweepApproach(input: ApproachInput, ranges: SweepRanges, limits: CityLimits = NO_CITY_LIMITS): SweepOutcome {
  const ev = sweepEvaluator(input, limits)
  const points = sweepGrid(ranges).map((s) => ev.point(s))
  return { points, baseline: ev.baseline, runs: ev.runs() }
}

/** The approach input with a point's settings in its priority block. */
export function withSettings(input: ApproachInput, s: SweepSettings): ApproachInput {
  return {
    ...input,
    priority: { ...input.priority, strategy: s.strategy, maxExtensionS: s.maxExtensionS, maxEarlyGreenS: s.maxEarlyGreenS, lockoutCycles: s.lockoutCycles, lateOnly: s.lateOnly },
  }
}
