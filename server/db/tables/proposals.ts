import { boolean, doublePrecision, index, integer, jsonb, pgTable, text, timestamp } from 'drizzle-orm/pg-core'
import { users } from './auth'
import { jobs } from './jobs'
import { feedVersions } from './gtfs'
import { corridorApproaches, corridors } from './corridors'
import { intersections } from './signals'
import { DAY_TYPES } from '../../../shared/signals/time-of-day'
import { ROW_EVENT_KINDS, ROW_STATUSES, STRATEGIES, type Counter, type FieldChange, type RowSettings } from '../../../shared/schemas/proposals'

// A priority proposal for one corridor: one row per corridor approach, each negotiated on its
// own with the city that owns the intersection. Rows carry `version`; every write names the
// version it read and is a conditional UPDATE, so two people acting at once never both win.
// `proposals.version` grows whenever the settings of any row change: stored results name the
// proposal version and row version they were computed for, and the exact model input.
export const proposals = pgTable('proposals', {
  id: text('id').primaryKey(),
  // No cascade: a corridor with a negotiation on it is not deleted by accident.
  corridorId: text('corridor_id').notNull().references(() => corridors.id),
  name: text('name').notNull(),
  notes: text('notes').notNull().default(''),
  status: text('status', { enum: ['draft', 'submitted'] }).notNull().default('draft'),
  version: integer('version').notNull().default(1),
  createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
  createdAt: timestamp('created_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
  submittedAt: timestamp('submitted_at', { withTimezone: true, mode: 'date' }),
  submittedBy: text('submitted_by').references(() => users.id, { onDelete: 'set null' }),
}, (t) => [index('proposals_corridor_idx').on(t.corridorId)])

export const proposalRows = pgTable('proposal_rows', {
  id: text('id').primaryKey(),
  proposalId: text('proposal_id').notNull().references(() => proposals.id, { onDelete: 'cascade' }),
  // The approach may be removed from the corridor later; the row and its history stay.
  approachId: text('approach_id').references(() => corridorApproaches.id, { onDelete: 'set null' }),
  intersectionId: text('intersection_id').notNull().references(() => intersections.id),
  /** Order along the corridor (1 = first approach). */
  position: integer('position').notNull(),
  strategy: text('strategy', { enum: STRATEGIES }).notNull(),
  maxExtensionS: doublePrecision('max_extension_s').notNull(),
  maxEarlyGreenS: doublePrecision('max_early_green_s').notNull(),
  lockoutCycles: integer('lockout_cycles').notNull(),
  onlyLateBuses: boolean('only_late_buses').notNull(),
  lateThresholdS: doublePrecision('late_threshold_s').notNull(),
  lateShare: doublePrecision('late_share').notNull(),
  status: text('status', { enum: ROW_STATUSES }).notNull().default('draft'),
  version: integer('version').notNull().default(1),
  /** The city's counter values with the last request for change; null otherwise. */
  counter: jsonb('counter').$type<Counter>(),
  lastComment: text('last_comment').notNull().default(''),
  createdAt: timestamp('created_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
  updatedBy: text('updated_by').references(() => users.id, { onDelete: 'set null' }),
}, (t) => [
  index('proposal_rows_proposal_idx').on(t.proposalId),
  index('proposal_rows_intersection_idx').on(t.intersectionId),
])

/** Every change of a row: who, when, what changed, with the comment. Never updated. */
export const proposalRowEvents = pgTable('proposal_row_events', {
  id: integer('id').primaryKey().generatedAlwaysAsIdentity(),
  rowId: text('row_id').notNull().references(() => proposalRows.id, { onDelete: 'cascade' }),
  proposalId: text('proposal_id').notNull().references(() => proposals.id, { onDelete: 'cascade' }),
  /** The row version after the event. */
  rowVersion: integer('row_version').notNull(),
  kind: text('kind', { enum: ROW_EVENT_KINDS }).notNull(),
  statusFrom: text('status_from', { enum: ROW_STATUSES }),
  statusTo: text('status_to', { enum: ROW_STATUSES }).notNull(),
  actorId: text('actor_id').references(() => users.id, { onDelete: 'set null' }),
  at: timestamp('at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
  changes: jsonb('changes').$type<FieldChange[]>().notNull().default([]),
  comment: text('comment').notNull().default(''),
  counter: jsonb('counter').$type<Counter>(),
}, (t) => [index('proposal_row_events_row_idx').on(t.rowId, t.id)])

/**
 * One run of the model: over every row of a proposal (kind 'proposal', from a job), over one
 * row's new settings (kind 'row', when the planner answers the city) or over one row's counter
 * values (kind 'counter', at the decision). Results are written with the run marked succeeded in
 * one transaction, so a failed run leaves none.
 */
export const proposalEvaluations = pgTable('proposal_evaluations', {
  id: text('id').primaryKey(),
  proposalId: text('proposal_id').notNull().references(() => proposals.id, { onDelete: 'cascade' }),
  kind: text('kind', { enum: ['proposal', 'row', 'counter'] }).notNull(),
  /** For a row or counter run: the row it is about. */
  rowId: text('row_id').references(() => proposalRows.id, { onDelete: 'cascade' }),
  proposalVersion: integer('proposal_version').notNull(),
  state: text('state', { enum: ['running', 'succeeded', 'failed'] }).notNull().default('running'),
  jobId: text('job_id').references(() => jobs.id, { onDelete: 'set null' }),
  feedVersionId: integer('feed_version_id').references(() => feedVersions.id, { onDelete: 'set null' }),
  createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
  createdAt: timestamp('created_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
  finishedAt: timestamp('finished_at', { withTimezone: true, mode: 'date' }),
}, (t) => [index('proposal_evaluations_proposal_idx').on(t.proposalId, t.kind, t.createdAt)])

/** The model's figures for one row, period and day type, with everything they were computed from. */
export const proposalResults = pgTable('proposal_results', {
  id: integer('id').primaryKey().generatedAlwaysAsIdentity(),
  evaluationId: text('evaluation_id').notNull().references(() => proposalEvaluations.id, { onDelete: 'cascade' }),
  proposalId: text('proposal_id').notNull().references(() => proposals.id, { onDelete: 'cascade' }),
  rowId: text('row_id').notNull().references(() => proposalRows.id, { onDelete: 'cascade' }),
  rowVersion: integer('row_version').notNull(),
  proposalVersion: integer('proposal_version').notNull(),
  variant: text('variant', { enum: ['proposed', 'counter'] }).notNull(),
  /** The settings evaluated: the row's, or the row's with the counter values in. */
  settings: jsonb('settings').$type<RowSettings>().notNull(),
  // The period is copied: periods may be edited after the run, the figures stay as computed.
  periodId: text('period_id').notNull(),
  periodName: text('period_name').notNull(),
  startTime: text('start_time').notNull(),
  endTime: text('end_time').notNull(),
  dayType: text('day_type', { enum: DAY_TYPES }).notNull(),
  /** Buses crossing the stop line in the period on an average day of the type (from the schedule). */
  tripsPerDay: doublePrecision('trips_per_day').notNull(),
  timingPlanId: text('timing_plan_id'),
  timingPlanName: text('timing_plan_name'),
  timingPlanVersion: integer('timing_plan_version'),
  approachVersion: integer('approach_version'),
  intersectionVersion: integer('intersection_version'),
  cycleS: doublePrecision('cycle_s'),
  busDelayBaselineS: doublePrecision('bus_delay_baseline_s'),
  busDelayPriorityS: doublePrecision('bus_delay_priority_s'),
  savingPerTripS: doublePrecision('saving_per_trip_s'),
  dailyBusHoursSaved: doublePrecision('daily_bus_hours_saved'),
  grantShare: doublePrecision('grant_share'),
  crossExtraDelayPerVehS: doublePrecision('cross_extra_delay_per_veh_s'),
  vcBefore: doublePrecision('vc_before'),
  vcAfter: doublePrecision('vc_after'),
  losBefore: text('los_before'),
  losAfter: text('los_after'),
  /** Person-seconds saved over the period on one day, both streets (positive: priority pays). */
  personDelayBalanceS: doublePrecision('person_delay_balance_s'),
  /** Why the period could not be evaluated; the figures are null then. */
  error: text('error'),
  /** The exact model input (POST /api/model/approach body, defaults filled) and its output. */
  modelInput: jsonb('model_input'),
  modelOutput: jsonb('model_output'),
}, (t) => [
  index('proposal_results_evaluation_idx').on(t.evaluationId),
  index('proposal_results_row_idx').on(t.rowId, t.variant),
])
