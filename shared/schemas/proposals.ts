// Request bodies and response shapes of /api/proposals: priority proposals, their rows (one per
// corridor approach), the decisions of the cities and the stored evaluation results.
import { z } from 'zod'
import { DAY_TYPES, type DayType } from '../signals/time-of-day'
import type { PlanForCheck } from '../proposals/priority-checks'

export const STRATEGIES = ['none', 'green-extension', 'early-green', 'both'] as const
export type Strategy = (typeof STRATEGIES)[number]

export const STRATEGY_LABELS: Record<Strategy, string> = {
  none: 'No priority',
  'green-extension': 'Green extension',
  'early-green': 'Early green',
  both: 'Extension and early green',
}

export const ROW_STATUSES = ['draft', 'submitted', 'accepted', 'rejected', 'change-requested'] as const
export type RowStatus = (typeof ROW_STATUSES)[number]

/** Words the people in the negotiation see; the API keeps the plain status names. */
export const ROW_STATUS_LABELS: Record<RowStatus, string> = {
  draft: 'Draft',
  submitted: 'Awaiting city',
  accepted: 'Agreed',
  rejected: 'Refused',
  'change-requested': 'Change asked',
}

export const DECISIONS = ['accept', 'reject', 'request-change'] as const
export type Decision = (typeof DECISIONS)[number]

export const ANSWERS = ['accept-counter', 'resubmit'] as const
export type Answer = (typeof ANSWERS)[number]

/** Upper bounds of the inputs; the safety checks against the timing plans are stricter. */
export const MAX_LIMIT_S = 60
export const MAX_LOCKOUT_CYCLES = 5

const limitS = z.number().min(0).max(MAX_LIMIT_S)
const lockout = z.number().int().min(0).max(MAX_LOCKOUT_CYCLES)
export const rowVersion = z.number().int().positive()

export const conditionalSchema = z.strictObject({
  /** Grant priority only to buses running late. */
  onlyLateBuses: z.boolean(),
  /** A bus counts as late beyond this many seconds behind schedule. */
  lateThresholdS: z.number().min(0).max(1800),
  /** Share of buses that are late (0..1), an input until observed data replaces it. */
  lateShare: z.number().min(0).max(1),
})
export type Conditional = z.infer<typeof conditionalSchema>

export const rowSettingsSchema = z.strictObject({
  strategy: z.enum(STRATEGIES),
  maxExtensionS: limitS,
  maxEarlyGreenS: limitS,
  lockoutCycles: lockout,
  conditional: conditionalSchema,
})
export type RowSettings = z.infer<typeof rowSettingsSchema>

/** Typical first proposal: 10 s each way, one cycle of lockout, every bus (common practice). */
export const DEFAULT_ROW_SETTINGS: RowSettings = {
  strategy: 'both',
  maxExtensionS: 10,
  maxEarlyGreenS: 10,
  lockoutCycles: 1,
  conditional: { onlyLateBuses: false, lateThresholdS: 120, lateShare: 0.3 },
}

export const rowSettingsPatch = z.strictObject({
  strategy: z.enum(STRATEGIES).optional(),
  maxExtensionS: limitS.optional(),
  maxEarlyGreenS: limitS.optional(),
  lockoutCycles: lockout.optional(),
  conditional: conditionalSchema.partial().optional(),
})
export type RowSettingsPatch = z.infer<typeof rowSettingsPatch>

export const rowPatchBody = rowSettingsPatch.extend({ version: rowVersion })
export type RowPatchBody = z.infer<typeof rowPatchBody>

/** The values a city may offer instead of the proposed ones. */
export const counterSchema = z.strictObject({
  maxExtensionS: limitS.optional(),
  maxEarlyGreenS: limitS.optional(),
  lockoutCycles: lockout.optional(),
}).refine((c) => c.maxExtensionS !== undefined || c.maxEarlyGreenS !== undefined || c.lockoutCycles !== undefined,
  { message: 'Give at least one counter value.' })
export type Counter = z.infer<typeof counterSchema>

export const decisionBody = z.strictObject({
  decision: z.enum(DECISIONS),
  comment: z.string().trim().max(2000).default(''),
  counter: counterSchema.optional(),
  version: rowVersion,
}).superRefine((b, ctx) => {
  if (b.decision !== 'accept' && !b.comment) {
    ctx.addIssue({ code: 'custom', path: ['comment'], message: 'Say why: a refusal or a request for change needs a comment.' })
  }
  if (b.counter && b.decision !== 'request-change') {
    ctx.addIssue({ code: 'custom', path: ['counter'], message: 'Counter values go with a request for change only.' })
  }
})
export type DecisionBody = z.input<typeof decisionBody>

export const answerBody = z.strictObject({
  action: z.enum(ANSWERS),
  comment: z.string().trim().max(2000).default(''),
  /** With resubmit: revised settings sent back to the city. */
  settings: rowSettingsPatch.optional(),
  version: rowVersion,
}).superRefine((b, ctx) => {
  if (b.settings && b.action !== 'resubmit') {
    ctx.addIssue({ code: 'custom', path: ['settings'], message: 'Revised settings go with a resubmission only.' })
  }
})
export type AnswerBody = z.input<typeof answerBody>

export const proposalCreateBody = z.strictObject({
  corridorId: z.string().min(1).max(100),
  name: z.string().trim().min(3).max(120),
  notes: z.string().trim().max(2000).default(''),
  /** Settings every row starts with; edited row by row afterwards. */
  defaults: rowSettingsSchema.optional(),
  /** Lower each row's limits to what its intersection's timing plans can spare. */
  fitToPlans: z.boolean().default(true),
})
export type ProposalCreateBody = z.input<typeof proposalCreateBody>

export const proposalListQuery = z.strictObject({ corridorId: z.string().min(1).max(100).optional() })
export const proposalParams = z.object({ id: z.string().min(1).max(100) })
export const proposalRowParams = z.object({ id: z.string().min(1).max(100), rowId: z.string().min(1).max(100) })
export const submitBody = z.strictObject({ comment: z.string().trim().max(2000).default('') })

// ---- responses ------------------------------------------------------------------------------

export interface PersonRef { id: string; name: string }
export interface OrganisationRef { id: string; name: string }

export const ROW_EVENT_KINDS = [
  'created', 'edited', 'submitted', 'accepted', 'rejected', 'change-requested', 'counter-accepted', 'resubmitted',
] as const
export type RowEventKind = (typeof ROW_EVENT_KINDS)[number]

export interface FieldChange { field: string; from: unknown; to: unknown }

export interface RowEventDto {
  id: number
  kind: RowEventKind
  /** Row version after the event. */
  rowVersion: number
  statusFrom: RowStatus | null
  statusTo: RowStatus
  actor: PersonRef & { organisationName: string } | null
  at: string
  changes: FieldChange[]
  comment: string
  counter: Counter | null
}

/** One safety or practice finding about a row's settings against one timing plan. */
export interface RowCheckDto {
  path: (string | number)[]
  message: string
  severity: 'error' | 'warning'
  source: string
  planName: string | null
}

/** The model's figures for one row, one period and one day type. */
export interface PeriodResultDto {
  resultId: number
  periodId: string
  periodName: string
  dayType: DayType
  startTime: string
  endTime: string
  /** Buses crossing the intersection in the period on an average day of the type. */
  tripsPerDay: number
  timingPlanId: string | null
  timingPlanName: string | null
  cycleS: number | null
  busDelayBaselineS: number | null
  busDelayPriorityS: number | null
  savingPerTripS: number | null
  dailyBusHoursSaved: number | null
  grantShare: number | null
  crossExtraDelayPerVehS: number | null
  vcBefore: number | null
  vcAfter: number | null
  losBefore: string | null
  losAfter: string | null
  /** Person-seconds saved over the period on one day, both streets (positive: priority pays). */
  personDelayBalanceS: number | null
  /** Why the period could not be evaluated (no plan in force, a broken limit...). */
  error: string | null
}

export interface RowResultsSummary {
  dayType: DayType
  tripsPerDay: number
  /** Trip-weighted mean over the periods (plain mean where no bus runs). */
  savingPerTripS: number
  dailyBusHoursSaved: number
  /** Worst period. */
  crossExtraDelayPerVehS: number
  vcBeforeMax: number | null
  vcAfterMax: number | null
  losBeforeWorst: string | null
  losAfterWorst: string | null
  /** Person-seconds saved per day over the evaluated periods. */
  personDelayBalanceS: number
}

export interface RowResultsDto {
  evaluationId: string
  variant: 'proposed' | 'counter'
  evaluatedAt: string
  /** Row version the figures were computed for. */
  rowVersion: number
  settings: RowSettings
  /** The settings, timing plans or approach data changed since: evaluate again. */
  stale: boolean
  /** One per day type with evaluated periods. */
  summaries: RowResultsSummary[]
  periods: PeriodResultDto[]
}

export interface RowPermissions { edit: boolean; decide: boolean; answer: boolean }

export interface ProposalRowDto {
  id: string
  position: number
  intersectionId: string
  intersectionName: string
  approachId: string
  distanceM: number | null
  jurisdictionId: string
  jurisdiction: OrganisationRef
  status: RowStatus
  version: number
  settings: RowSettings
  counter: Counter | null
  results: RowResultsDto | null
  counterResults: RowResultsDto | null
  lastComment: string
  checks: RowCheckDto[]
  /** The timing plans of the intersection as the limit checks need them (live checks while editing). */
  plans: PlanForCheck[]
  history: RowEventDto[]
  /** What the signed-in person may do with the row now. */
  may: RowPermissions
  updatedAt: string
}

export type RowCounts = Record<RowStatus, number>

export interface ProposalSummaryDto {
  id: string
  corridorId: string
  corridorName: string
  name: string
  notes: string
  status: 'draft' | 'submitted'
  /** Grows with every change to the settings of a row. */
  version: number
  createdBy: PersonRef | null
  createdAt: string
  submittedAt: string | null
  rowCounts: RowCounts
  jurisdictions: OrganisationRef[]
  lastEvaluation: EvaluationRefDto | null
}

export interface EvaluationRefDto {
  id: string
  jobId: string | null
  proposalVersion: number
  feedId: string | null
  createdAt: string
  createdBy: PersonRef | null
}

export interface CorridorTotalsDto {
  dayType: DayType
  /** Sum over intersections of the trip-weighted saving per trip: what a bus gains end to end. */
  savingPerTripS: number
  dailyBusHoursSaved: number
  /** Person-seconds saved per day. */
  personDelayBalanceS: number
  rowsEvaluated: number
}

export interface ProposalDto extends ProposalSummaryDto {
  rows: ProposalRowDto[]
  totals: CorridorTotalsDto[]
  periods: { id: string; name: string; startTime: string; endTime: string }[]
}

/** The full record behind one stored figure: the exact model input and output. */
export interface StoredResultDto extends PeriodResultDto {
  evaluationId: string
  variant: 'proposed' | 'counter'
  rowVersion: number
  proposalVersion: number
  settings: RowSettings
  inputs: {
    timingPlanVersion: number | null
    approachVersion: number | null
    intersectionVersion: number | null
    feedId: string | null
    model: unknown
  }
  output: unknown
}

export const DAY_TYPE_VALUES = DAY_TYPES
