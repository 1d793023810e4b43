// Request and response shapes of the trade-off sweep (POST /api/model/sweep) and of the suggested
// settings (POST /api/proposals/:id/suggest). A sweep runs one approach through a grid of
// priority settings; each point carries what the bus gains, what the cross street pays, and the
// limits it breaks.
import { z } from 'zod'
import { approachBody, type LosGrade } from './model'
import { cityLimitsSchema, type CityLimits, type ConstraintKind } from './city-limits'
import { MAX_LIMIT_S, MAX_LOCKOUT_CYCLES } from './proposals'

export const SWEEP_STRATEGIES = ['green-extension', 'early-green', 'both'] as const
export type SweepStrategy = (typeof SWEEP_STRATEGIES)[number]

export const OBJECTIVES = ['person-delay', 'bus-saving'] as const
export type Objective = (typeof OBJECTIVES)[number]
export const OBJECTIVE_LABELS: Record<Objective, string> = {
  'person-delay': 'Person-delay saving (all travellers)',
  'bus-saving': 'Bus saving per trip',
}

/** Grids larger than this are refused: a request stays well under a second of model time. */
export const MAX_SWEEP_POINTS = 30_000

const capS = z.number().min(0).max(MAX_LIMIT_S)

export const sweepRanges = z.strictObject({
  strategies: z.array(z.enum(SWEEP_STRATEGIES)).min(1).max(3).default([...SWEEP_STRATEGIES]),
  /** maxExtensionS runs 0, step, 2 step ... up to this cap */
  maxExtensionCapS: capS.default(20),
  maxEarlyGreenCapS: capS.default(20),
  stepS: z.number().min(0.5).max(10).default(1),
  lockoutCycles: z.array(z.int().min(0).max(MAX_LOCKOUT_CYCLES)).min(1).max(MAX_LOCKOUT_CYCLES + 1).default([0, 1, 2, 3]),
  /** false: every bus asks; true: only late buses (the body's priority.lateShare of them) */
  conditional: z.array(z.boolean()).min(1).max(2).default([false, true]),
}).superRefine((r, ctx) => {
  if (new Set(r.strategies).size !== r.strategies.length) ctx.addIssue({ code: 'custom', path: ['strategies'], message: 'Name each strategy once.' })
  if (new Set(r.lockoutCycles).size !== r.lockoutCycles.length) ctx.addIssue({ code: 'custom', path: ['lockoutCycles'], message: 'Name each lockout once.' })
  if (new Set(r.conditional).size !== r.conditional.length) ctx.addIssue({ code: 'custom', path: ['conditional'], message: 'Name each condition once.' })
  const n = sweepPointCount(r)
  if (n > MAX_SWEEP_POINTS) {
    ctx.addIssue({ code: 'custom', path: ['stepS'], message: `The grid has ${n} points, more than ${MAX_SWEEP_POINTS}: use a larger step or smaller caps.` })
  }
})
export type SweepRangesBody = z.input<typeof sweepRanges>
export type SweepRanges = z.output<typeof sweepRanges>

/** Values 0, step, 2 step ... with the cap itself last when it is not a multiple of the step. */
export function gridValues(capS: number, stepS: number): number[] {
  const out: number[] = []
  const n = Math.floor(capS / stepS + 1e-9)
  for (let i = 0; i <= n; i++) out.push(Math.round(i * stepS * 1e6) / 1e6)
  if (capS - out[out.length - 1] > 1e-6) out.push(capS)
  return out
}

export function sweepPointCount(r: Pick<SweepRanges, 'strategies' | 'maxExtensionCapS' | 'maxEarlyGreenCapS' | 'stepS' | 'lockoutCycles' | 'conditional'>): number {
  const e = gridValues(r.maxExtensionCapS, r.stepS).length
  const a = gridValues(r.maxEarlyGreenCapS, r.stepS).length
  const perLimits = r.lockoutCycles.length * r.conditional.length
  let n = 1
  for (const s of r.strategies) n += (s === 'green-extension' ? e : s === 'early-green' ? a : e * a) * perLimits
  return n
}

/** The priority settings of one point, in the names of the approach body's priority block. */
export const sweepSettings = z.strictObject({
  strategy: z.enum(['none', ...SWEEP_STRATEGIES]),
  maxExtensionS: capS,
  maxEarlyGreenS: capS,
  lockoutCycles: z.int().min(0).max(MAX_LOCKOUT_CYCLES),
  lateOnly: z.boolean(),
})
export type SweepSettings = z.infer<typeof sweepSettings>

export const sweepBody = approachBody.extend({
  ranges: sweepRanges.prefault({}),
  /** Limits to mark points against; merged over the city's when cityId is given. */
  limits: cityLimitsSchema.partial().optional(),
  /** A city whose stored limits apply (an organisation of kind city). */
  cityId: z.string().min(1).max(100).optional(),
  objective: z.enum(OBJECTIVES).default('person-delay'),
  /** Settings to mark on the curve (the current proposal, a counter), evaluated exactly. */
  marks: z.array(z.strictObject({ label: z.string().trim().min(1).max(60), settings: sweepSettings })).max(4).default([]),
})
export type SweepBody = z.input<typeof sweepBody>
export type SweepInput = z.output<typeof sweepBody>

export const suggestBody = z.strictObject({
  /** One row; all rows the planner may still edit when left out. */
  rowId: z.string().min(1).max(100).optional(),
  /** With rowId: the row version read (a stale one is refused with 409). */
  version: z.int().positive().optional(),
  objective: z.enum(OBJECTIVES).default('person-delay'),
  /** Which day type's periods the settings must suit (each period's timing plan and volumes). */
  dayType: z.enum(['weekday', 'saturday', 'sunday']).default('weekday'),
}).superRefine((b, ctx) => {
  if (b.version !== undefined && b.rowId === undefined) ctx.addIssue({ code: 'custom', path: ['version'], message: 'A version goes with a rowId.' })
  if (b.rowId !== undefined && b.version === undefined) ctx.addIssue({ code: 'custom', path: ['version'], message: 'Give the version of the row you read.' })
})
export type SuggestBody = z.input<typeof suggestBody>

// ---- responses ------------------------------------------------------------------------------

export interface PointViolation {
  constraint: ConstraintKind
  detail: string
}

export interface SweepPoint {
  settings: SweepSettings
  busSavingPerTripS: number
  crossExtraDelayPerVehS: number
  /** person-seconds saved per hour, all travellers of both streets (positive: priority pays) */
  personDelayBalanceS: number
  vcAfter: number
  losAfter: LosGrade
  grantsPerHour: number
  violations: PointViolation[]
}

/** Why the recommendation stops where it does. */
export interface BindingConstraint {
  /** the setting held back */
  setting: 'maxExtensionS' | 'maxEarlyGreenS' | 'lockoutCycles' | 'lateOnly' | 'strategy'
  /** the constraint that holds it, or 'sweep-range' when it stops at the grid's cap */
  constraint: ConstraintKind | 'sweep-range'
  /** e.g. "early green capped at 6 s by pedestrian walk + clearance" */
  message: string
  /** the first setting beyond, and what it breaks there */
  detail: string
  /** for several periods: the one where it binds */
  caseLabel: string | null
}

export interface Recommendation {
  objective: Objective
  settings: SweepSettings
  /** person-seconds per hour (one approach) or per day (a row's periods); s per trip, or bus-seconds per day */
  objectiveValue: number
  /** false when no setting keeps every limit (the settings are then "no priority") */
  feasible: boolean
  binding: BindingConstraint[]
  /** one sentence for the engineer */
  summary: string
  /** the recommended point in each case (one period, or each period of the row) */
  cases: { label: string; point: SweepPoint }[]
}

export interface SweepResponse {
  /** first point: no priority; then each strategy over its grid */
  points: SweepPoint[]
  marked: { label: string; point: SweepPoint }[]
  recommendation: Recommendation
  baseline: { vcBefore: number; losBefore: LosGrade; availableGreenS: number; crossMinimumS: number }
  limits: CityLimits
  caution: string
}

export interface SuggestRowResult {
  rowId: string
  intersectionName: string
  /** the row's new version, or null when it was left as it was */
  version: number | null
  applied: boolean
  /** why the row was left (not editable, no plan or volumes...) */
  skipped: string | null
  recommendation: Recommendation | null
}

/** Shown with every sweep and suggestion (the same words as the pages' caution). */
export const SWEEP_CAUTION = 'Planning estimates only. Check every timing change against local codes, pedestrian clearance rules and the licensed engineer responsible for the signal.'

export interface SuggestResponse {
  rows: SuggestRowResult[]
  caution: string
}

