/**
 * The recommended priority settings of one approach: over the sweep's grid, the settings that
 * maximise the person-delay saving (or the bus saving, the planner's choice) among those that keep
 * every limit of the city and the hard minimums of the timing, and which limit holds each setting
 * back ("early green capped at 6 s by pedestrian walk + clearance").
 *
 * A row of a proposal runs in several periods (each with its timing plan and volumes): the cases
 * share one grid, a setting is kept only when it keeps every limit in every period, and the
 * objective is summed over the periods (person-seconds per day, or bus-seconds per day).
 *
 * Ties (equal objective within 1e-9) go to the setting that costs the cross street least, then
 * to the smaller limits, the simpler strategy, the longer lockout and priority for late buses
 * only: what a careful engineer would pick between two equal offers.
 */
import type { CityLimits, ConstraintKind } from '../schemas/city-limits'
import { HARD_CONSTRAINTS, constraintLabel } from '../schemas/city-limits'
import type { BindingConstraint, Objective, PointViolation, Recommendation, SweepPoint, SweepSettings } from '../schemas/sweep'
import type { ApproachInput } from '../schemas/model'
import { gridValues, type SweepRanges } from '../schemas/sweep'
import { sweepApproach, usesEarlyGreen, usesExtension, type SweepOutcome } from './sweep'

export interface SweepCase {
  label: string
  /** the sweep's points, on the same grid for every case */
  points: readonly SweepPoint[]
  /** multiplies the person-delay balance (per hour): the period's hours; 1 for one approach */
  personWeight: number
  /** multiplies the bus saving per trip: the period's trips; 1 for one approach */
  busWeight: number
  /** cross-street green a grant may take (the model caps the limits there), s */
  availableGreenS: number
}

const STRATEGY_ORDER: Record<SweepSettings['strategy'], number> = { none: 0, 'green-extension': 1, 'early-green': 2, both: 3 }

export function objectiveOf(point: SweepPoint, objective: Objective): number {
  return objective === 'person-delay' ? point.personDelayBalanceS : point.busSavingPerTripS
}

const usedGreenS = (s: SweepSettings): number =>
  (usesExtension(s.strategy) ? s.maxExtensionS : 0) + (usesEarlyGreen(s.strategy) ? s.maxEarlyGreenS : 0)

/** The grid, summed over the cases: objective, cross-street cost and feasibility per setting. */
export interface CombinedGrid {
  settings: SweepSettings[]
  value: Float64Array
  crossCost: Float64Array
  feasible: Uint8Array
}

export function combine(cases: readonly SweepCase[], objective: Objective): CombinedGrid {
  if (!cases.length) throw new RangeError('no case to recommend for')
  const n = cases[0].points.length
  for (const c of cases) if (c.points.length !== n) throw new RangeError('the cases of a recommendation must share one grid')
  const value = new Float64Array(n)
  const crossCost = new Float64Array(n)
  const feasible = new Uint8Array(n).fill(1)
  for (const c of cases) {
    const w = objective === 'person-delay' ? c.personWeight : c.busWeight
    for (let i = 0; i < n; i++) {
      const pt = c.points[i]
      value[i] += w * objectiveOf(pt, objective)
      crossCost[i] += c.personWeight * pt.crossExtraDelayPerVehS
      if (pt.violations.length) feasible[i] = 0
    }
  }
  return { settings: cases[0].points.map((p) => p.settings), value, crossCost, feasible }
}

/** Setting i has the higher objective, beyond rounding. */
function higher(g: CombinedGrid, i: number, j: number): boolean {
  return g.value[i] > g.value[j] + 1e-9 * Math.max(1, Math.abs(g.value[i]), Math.abs(g.value[j]))
}

/** True when setting i is a better offer than setting j. */
export function better(g: CombinedGrid, i: number, j: number): boolean {
  if (higher(g, i, j)) return true
  if (higher(g, j, i)) return false
  const ci = g.crossCost[i]
  const cj = g.crossCost[j]
  const ctol = 1e-9 * Math.max(1, Math.abs(ci), Math.abs(cj))
  if (ci < cj - ctol) return true
  if (cj < ci - ctol) return false
  const a = g.settings[i]
  const b = g.settings[j]
  if (usedGreenS(a) !== usedGreenS(b)) return usedGreenS(a) < usedGreenS(b)
  if (a.strategy !== b.strategy) return STRATEGY_ORDER[a.strategy] < STRATEGY_ORDER[b.strategy]
  if (a.lockoutCycles !== b.lockoutCycles) return a.lockoutCycles > b.lockoutCycles
  if (a.lateOnly !== b.lateOnly) return a.lateOnly
  return i < j
}

/** Index of the best setting, among the feasible ones or all; -1 when none qualifies. */
export function bestIndex(g: CombinedGrid, feasibleOnly: boolean): number {
  let best = -1
  for (let i = 0; i < g.value.length; i++) {
    if (feasibleOnly && !g.feasible[i]) continue
    if (best < 0 || better(g, i, best)) best = i
  }
  return best
}

const key = (s: SweepSettings) => `${s.strategy}|${s.maxExtensionS}|${s.maxEarlyGreenS}|${s.lockoutCycles}|${s.lateOnly}`
const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`

export function describeSettings(s: SweepSettings): string {
  if (s.strategy === 'none') return 'no priority'
  const parts: string[] = []
  if (usesExtension(s.strategy)) parts.push(`green extension up to ${s.maxExtensionS} s`)
  if (usesEarlyGreen(s.strategy)) parts.push(`early green up to ${s.maxEarlyGreenS} s`)
  parts.push(`lockout ${plural(s.lockoutCycles, 'cycle')}`)
  parts.push(s.lateOnly ? 'late buses only' : 'every bus')
  return parts.join(', ')
}

type Axis = BindingConstraint['setting']

function capPrefix(axis: Axis, s: SweepSettings): string {
  switch (axis) {
    case 'maxExtensionS': return `green extension capped at ${s.maxExtensionS} s by`
    case 'maxEarlyGreenS': return `early green capped at ${s.maxEarlyGreenS} s by`
    case 'lockoutCycles': return `lockout kept at ${plural(s.lockoutCycles, 'cycle')} by`
    case 'lateOnly': return 'priority kept to late buses by'
    case 'strategy': return `${s.strategy === 'none' ? 'no priority' : STRATEGY_WORDS[s.strategy]} chosen: the better settings break`
  }
}

const STRATEGY_WORDS: Record<SweepSettings['strategy'], string> = {
  none: 'no priority', 'green-extension': 'green extension only', 'early-green': 'early green only', both: 'extension and early green',
}

/** One clause per setting held back: "early green capped at 6 s by A and B". */
function bindingSentence(binding: readonly BindingConstraint[], s: SweepSettings, limits: CityLimits): string {
  const bySetting = new Map<Axis, string[]>()
  for (const b of binding) {
    const label = b.constraint === 'sweep-range' ? 'the sweep’s cap' : constraintLabel(b.constraint, limits)
    bySetting.set(b.setting, [...(bySetting.get(b.setting) ?? []), label])
  }
  return [...bySetting].map(([axis, labels]) => `${capPrefix(axis, s)} ${[...new Set(labels)].join(' and ')}`).join('; ')
}

function axisValue(axis: Exclude<Axis, 'strategy'>, s: SweepSettings): string {
  switch (axis) {
    case 'maxExtensionS': return `${s.maxExtensionS} s of extension`
    case 'maxEarlyGreenS': return `${s.maxEarlyGreenS} s of early green`
    case 'lockoutCycles': return `a lockout of ${plural(s.lockoutCycles, 'cycle')}`
    case 'lateOnly': return 'priority for every bus'
  }
}

/** Violations of setting i in every case, one per constraint (the first case where it is broken). */
function violationsAt(cases: readonly SweepCase[], i: number): { v: PointViolation; caseLabel: string | null }[] {
  const seen = new Map<ConstraintKind, { v: PointViolation; caseLabel: string | null }>()
  for (const c of cases) {
    for (const v of c.points[i].violations) if (!seen.has(v.constraint)) seen.set(v.constraint, { v, caseLabel: cases.length > 1 ? c.label : null })
  }
  return [...seen.values()]
}

/** The objective at setting b is above that one grid step lower on the axis. */
function risingAt(g: CombinedGrid, index: Map<string, number>, s: SweepSettings, axis: 'maxExtensionS' | 'maxEarlyGreenS', values: number[], b: number): boolean {
  const lower = values.filter((x) => x < s[axis])
  if (!lower.length) return false
  const prev = index.get(key({ ...s, [axis]: lower[lower.length - 1] }))
  return prev !== undefined && higher(g, b, prev)
}

/**
 * Along each setting of the recommendation, looser values in order (more extension or early green,
 * less lockout, every bus): where the first one that breaks a limit lies before a better offer,
 * that limit holds the setting back.
 */
function bindingOf(cases: readonly SweepCase[], g: CombinedGrid, b: number, limits: CityLimits, eValues: number[], aValues: number[], lockouts: number[]): BindingConstraint[] {
  const index = new Map(g.settings.map((s, i) => [key(s), i]))
  const s = g.settings[b]
  const out: BindingConstraint[] = []
  const axes: { axis: Exclude<Axis, 'strategy'>; next: SweepSettings[] }[] = []
  if (s.strategy !== 'none') {
    if (usesExtension(s.strategy)) axes.push({ axis: 'maxExtensionS', next: eValues.filter((e) => e > s.maxExtensionS).map((e) => ({ ...s, maxExtensionS: e })) })
    if (usesEarlyGreen(s.strategy)) axes.push({ axis: 'maxEarlyGreenS', next: aValues.filter((a) => a > s.maxEarlyGreenS).map((a) => ({ ...s, maxEarlyGreenS: a })) })
    axes.push({ axis: 'lockoutCycles', next: lockouts.filter((l) => l < s.lockoutCycles).sort((x, y) => y - x).map((l) => ({ ...s, lockoutCycles: l })) })
    if (s.lateOnly) axes.push({ axis: 'lateOnly', next: [{ ...s, lateOnly: false }] })
  }
  for (const { axis, next } of axes) {
    const ids = next.map((x) => index.get(key(x))).filter((i): i is number => i !== undefined)
    const first = ids.findIndex((i) => !g.feasible[i])
    if (first < 0) continue
    // the model caps a grant at what the cross street can give, so beyond that cap the values stay
    // flat: there the cap binds when the objective is still rising at the recommendation
    const capped = first === 0 && (axis === 'maxExtensionS' || axis === 'maxEarlyGreenS')
      && cases.some((c) => g.settings[ids[0]][axis] > c.availableGreenS + 1e-9)
      && violationsAt(cases, ids[0]).some(({ v }) => HARD_CONSTRAINTS.includes(v.constraint))
      && risingAt(g, index, s, axis, axis === 'maxExtensionS' ? eValues : aValues, b)
    if (!capped && !ids.slice(first).some((i) => higher(g, i, b))) continue
    const at = g.settings[ids[first]]
    for (const { v, caseLabel } of violationsAt(cases, ids[first])) {
      out.push({
        setting: axis,
        constraint: v.constraint,
        message: `${capPrefix(axis, s)} ${constraintLabel(v.constraint, limits)}`,
        detail: `with ${axisValue(axis, at)}: ${v.detail}`,
        caseLabel,
      })
    }
  }
  // the grid's cap: the objective still grows at the last value
  const last = (values: number[], cur: number) => values.length > 1 && cur === values[values.length - 1]
  for (const axis of ['maxExtensionS', 'maxEarlyGreenS'] as const) {
    const values = axis === 'maxExtensionS' ? eValues : aValues
    const used = axis === 'maxExtensionS' ? usesExtension(s.strategy) : usesEarlyGreen(s.strategy)
    if (!used || !last(values, s[axis])) continue
    const below = index.get(key({ ...s, [axis]: values[values.length - 2] }))
    if (below !== undefined && higher(g, b, below)) {
      out.push({
        setting: axis, constraint: 'sweep-range',
        message: `${capPrefix(axis, s)} the sweep’s cap`,
        detail: 'the objective still grows there: widen the sweep', caseLabel: null,
      })
    }
  }
  // a better offer off these axes (another strategy, say) that breaks a limit
  const u = bestIndex(g, false)
  if (!out.length && u !== b && higher(g, u, b)) {
    for (const { v, caseLabel } of violationsAt(cases, u)) {
      out.push({
        setting: 'strategy',
        constraint: v.constraint,
        message: `${capPrefix('strategy', s)} ${constraintLabel(v.constraint, limits)}`,
        detail: `${describeSettings(g.settings[u])}: ${v.detail}`,
        caseLabel,
      })
    }
  }
  return out
}

export interface RecommendOptions {
  objective: Objective
  limits: CityLimits
  /** the grid's values, for the walk along each setting (sweepGrid's ranges) */
  extensionValues: number[]
  earlyGreenValues: number[]
  lockoutValues: number[]
}

export function recommend(cases: readonly SweepCase[], o: RecommendOptions): Recommendation {
  const g = combine(cases, o.objective)
  const b = bestIndex(g, true)
  const what = o.objective === 'person-delay' ? 'person-delay saving' : 'bus saving'
  if (b < 0) {
    // nothing keeps every limit, not even leaving the signal as it is
    const first = g.settings.findIndex((s) => s.strategy === 'none')
    const broken = violationsAt(cases, first)
    return {
      objective: o.objective,
      settings: g.settings[first],
      objectiveValue: g.value[first],
      feasible: false,
      binding: broken.map(({ v, caseLabel }) => ({
        setting: 'strategy' as const, constraint: v.constraint, message: `no priority: even without it ${v.detail}`, detail: v.detail, caseLabel,
      })),
      summary: `No setting keeps every limit: even without priority ${broken.map((x) => x.v.detail).join('; ')}. No priority is suggested; the timing itself needs a look.`,
      cases: cases.map((c) => ({ label: c.label, point: c.points[first] })),
    }
  }
  const s = g.settings[b]
  const binding = bindingOf(cases, g, b, o.limits, o.extensionValues, o.earlyGreenValues, o.lockoutValues)
  let summary: string
  if (s.strategy === 'none') {
    summary = binding.length
      ? `No priority: ${binding.map((x) => x.detail).join('; ')}.`
      : `No priority: no setting of the grid gives a positive ${what}.`
  } else {
    const why = binding.length
      ? `${bindingSentence(binding, s, o.limits)}.`
      : `No limit binds: looser settings would not add to the ${what}.`
    summary = `Suggested: ${describeSettings(s)}. ${why.charAt(0).toUpperCase()}${why.slice(1)}`
  }
  return {
    objective: o.objective,
    settings: s,
    objectiveValue: g.value[b],
    feasible: true,
    binding,
    summary,
    cases: cases.map((c) => ({ label: c.label, point: c.points[b] })),
  }
}

export function recommendOptions(ranges: SweepRanges, limits: CityLimits, objective: Objective): RecommendOptions {
  return {
    objective,
    limits,
    extensionValues: gridValues(ranges.maxExtensionCapS, ranges.stepS),
    earlyGreenValues: gridValues(ranges.maxEarlyGreenCapS, ranges.stepS),
    lockoutValues: [...ranges.lockoutCycles],
  }
}

/** One approach in one period: its sweep and the recommendation over it. */
export function recommendApproach(input: ApproachInput, ranges: SweepRanges, limits: CityLimits, objective: Objective): { sweep: SweepOutcome; recommendation: Recommendation } {
  const sweep = sweepApproach(input, ranges, limits)
  const recommendation = recommend(
    [{ label: 'this period', points: sweep.points, personWeight: 1, busWeight: 1, availableGreenS: sweep.baseline.availableGreenS }],
    recommendOptions(ranges, limits, objective),
  )
  return { sweep, recommendation }
}

export interface PeriodCase {
  label: string
  input: ApproachInput
  /** the period's length, h */
  hours: number
  /** buses crossing in the period on a day */
  trips: number
}

/** One setting for several periods of an approach (a proposal row): kept in each, best over the day. */
export function recommendPeriods(periods: readonly PeriodCase[], ranges: SweepRanges, limits: CityLimits, objective: Objective): Recommendation {
  const cases: SweepCase[] = periods.map((c) => {
    const sweep = sweepApproach(c.input, ranges, limits)
    return { label: c.label, points: sweep.points, personWeight: c.hours, busWeight: c.trips, availableGreenS: sweep.baseline.availableGreenS }
  })
  return recommend(cases, recommendOptions(ranges, limits, objective))
}

/**
 * The best trade-offs of a sweep: the points within every limit that no other such point beats on
 * both the bus saving (higher) and the cross-street delay (lower), one per distinct pair of
 * figures (the simplest settings giving it), by rising bus saving. Settings that never grant are
 * left out but for "no priority" itself.
 * @param minGainS a point must save the bus this much more than the one before (0.05 s: the
 *   difference a table shows)
 */
export function tradeOffFront(points: readonly SweepPoint[], minGainS = 0): SweepPoint[] {
  const tol = Math.max(1e-9, minGainS)
  const order = points
    .map((p, i) => ({ p, i }))
    .filter(({ p }) => p.violations.length === 0 && (p.grantsPerHour > 0 || p.settings.strategy === 'none'))
    .sort((a, b) => a.p.crossExtraDelayPerVehS - b.p.crossExtraDelayPerVehS || b.p.busSavingPerTripS - a.p.busSavingPerTripS
      || usedGreenS(a.p.settings) - usedGreenS(b.p.settings) || b.p.settings.lockoutCycles - a.p.settings.lockoutCycles || a.i - b.i)
  const out: SweepPoint[] = []
  let best = -Infinity
  for (const { p } of order) {
    if (p.busSavingPerTripS > best + tol) {
      out.push(p)
      best = p.busSavingPerTripS
    }
  }
  return out
}
