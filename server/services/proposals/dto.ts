// Rows of a proposal as the API returns them: settings, checks against the current timing plans,
// the latest stored results (proposed and counter), the history and what the reader may do.
import { and, asc, desc, eq, inArray } from 'drizzle-orm'
import type { User } from 'lucia'
import {
  corridorApproaches, corridorPeriods, intersections, organisations, proposalEvaluations, proposalResults, proposalRowEvents,
  proposalRows, timingPlans, users,
} from '../../db/schema'
import { DAY_TYPES } from '../../../shared/signals/time-of-day'
import { minutesOfDay } from '../../../shared/signals/time-of-day'
import type {
  PeriodResultDto, ProposalRowDto, RowEventDto, RowResultsDto, RowSettings,
} from '../../../shared/schemas/proposals'
import { checkPriority, type PlanForCheck } from '../../../shared/proposals/priority-checks'
import { rowPermissions } from '../../../shared/proposals/permissions'
import { applyCounter, sameSettings } from '../../../shared/proposals/settings'
import { summariseRow } from '../../../shared/proposals/summary'
import { settingsOf, type DbOrTx, type ProposalRecord } from './records'

type ResultRecord = Omit<typeof proposalResults.$inferSelect, 'modelInput' | 'modelOutput'>
type EvaluationRecord = typeof proposalEvaluations.$inferSelect

// Every column but the model's input and output, which only the traceability route returns.
export const resultSummaryColumns = {
  id: proposalResults.id, evaluationId: proposalResults.evaluationId, proposalId: proposalResults.proposalId, rowId: proposalResults.rowId,
  rowVersion: proposalResults.rowVersion, proposalVersion: proposalResults.proposalVersion, variant: proposalResults.variant,
  settings: proposalResults.settings, periodId: proposalResults.periodId, periodName: proposalResults.periodName,
  startTime: proposalResults.startTime, endTime: proposalResults.endTime, dayType: proposalResults.dayType,
  tripsPerDay: proposalResults.tripsPerDay, timingPlanId: proposalResults.timingPlanId, timingPlanName: proposalResults.timingPlanName,
  timingPlanVersion: proposalResults.timingPlanVersion, approachVersion: proposalResults.approachVersion,
  intersectionVersion: proposalResults.intersectionVersion, cycleS: proposalResults.cycleS,
  busDelayBaselineS: proposalResults.busDelayBaselineS, busDelayPriorityS: proposalResults.busDelayPriorityS,
  savingPerTripS: proposalResults.savingPerTripS, dailyBusHoursSaved: proposalResults.dailyBusHoursSaved,
  grantShare: proposalResults.grantShare, crossExtraDelayPerVehS: proposalResults.crossExtraDelayPerVehS,
  vcBefore: proposalResults.vcBefore, vcAfter: proposalResults.vcAfter, losBefore: proposalResults.losBefore,
  losAfter: proposalResults.losAfter, personDelayBalanceS: proposalResults.personDelayBalanceS, error: proposalResults.error,
}

export function periodResultDto(r: ResultRecord): PeriodResultDto {
  return {
    resultId: r.id, periodId: r.periodId, periodName: r.periodName, dayType: r.dayType, startTime: r.startTime, endTime: r.endTime,
    tripsPerDay: r.tripsPerDay, timingPlanId: r.timingPlanId, timingPlanName: r.timingPlanName, cycleS: r.cycleS,
    busDelayBaselineS: r.busDelayBaselineS, busDelayPriorityS: r.busDelayPriorityS, savingPerTripS: r.savingPerTripS,
    dailyBusHoursSaved: r.dailyBusHoursSaved, grantShare: r.grantShare, crossExtraDelayPerVehS: r.crossExtraDelayPerVehS,
    vcBefore: r.vcBefore, vcAfter: r.vcAfter, losBefore: r.losBefore, losAfter: r.losAfter,
    personDelayBalanceS: r.personDelayBalanceS, error: r.error,
  }
}

/**
 * Which stored run holds the current figures of each row: the newest succeeded run that covered
 * the row (a whole-proposal run, or a run of that row alone), and for a counter the newest
 * counter run of the row.
 */
export function latestRuns(evaluations: readonly EvaluationRecord[], rowId: string) {
  const sorted = [...evaluations].filter((e) => e.state === 'succeeded').sort((a, b) => b.createdAt.getTime() - a.createdAt.getTime())
  return {
    proposed: sorted.find((e) => e.kind === 'proposal' || (e.kind === 'row' && e.rowId === rowId)) ?? null,
    counter: sorted.find((e) => e.kind === 'counter' && e.rowId === rowId) ?? null,
  }
}

interface CurrentInputs {
  planVersions: Map<string, number>
  approachVersion: number | null
  intersectionVersion: number
  periodIds: Set<string>
}

/** Stale when the settings, a timing plan, the approach, the intersection or the periods moved on. */
function isStale(results: readonly ResultRecord[], settings: RowSettings, now: CurrentInputs): boolean {
  if (!results.length) return false
  if (!sameSettings(results[0].settings, settings)) return true
  const periodsRun = new Set(results.map((r) => r.periodId))
  if (periodsRun.size !== now.periodIds.size || [...periodsRun].some((p) => !now.periodIds.has(p))) return true
  return results.some((r) =>
    (r.timingPlanId !== null && now.planVersions.get(r.timingPlanId) !== r.timingPlanVersion)
    || (r.approachVersion !== null && r.approachVersion !== now.approachVersion)
    || (r.intersectionVersion !== null && r.intersectionVersion !== now.intersectionVersion))
}

function resultsDto(e: EvaluationRecord, results: ResultRecord[], settings: RowSettings, now: CurrentInputs, periodOrder: Map<string, number>): RowResultsDto {
  const periods = results.map(periodResultDto).sort((a, b) =>
    DAY_TYPES.indexOf(a.dayType) - DAY_TYPES.indexOf(b.dayType)
    || (periodOrder.get(a.periodId) ?? 99) - (periodOrder.get(b.periodId) ?? 99)
    || minutesOfDay(a.startTime) - minutesOfDay(b.startTime))
  return {
    evaluationId: e.id,
    variant: results[0]?.variant ?? (e.kind === 'counter' ? 'counter' : 'proposed'),
    evaluatedAt: (e.finishedAt ?? e.createdAt).toISOString(),
    rowVersion: results[0]?.rowVersion ?? 0,
    settings: results[0]?.settings ?? settings,
    stale: isStale(results, settings, now),
    summaries: summariseRow(periods),
    periods,
  }
}

export async function rowDtos(db: DbOrTx, actor: User, proposal: ProposalRecord, onlyRowIds?: readonly string[]): Promise<ProposalRowDto[]> {
  const rows = await db.select({
    r: proposalRows,
    i: { name: intersections.name, jurisdictionId: intersections.jurisdictionId, version: intersections.version },
    cityName: organisations.name,
    a: { distanceM: corridorApproaches.distanceM, version: corridorApproaches.version },
  }).from(proposalRows)
    .innerJoin(intersections, eq(proposalRows.intersectionId, intersections.id))
    .innerJoin(organisations, eq(intersections.jurisdictionId, organisations.id))
    .leftJoin(corridorApproaches, eq(proposalRows.approachId, corridorApproaches.id))
    .where(onlyRowIds ? and(eq(proposalRows.proposalId, proposal.id), inArray(proposalRows.id, [...onlyRowIds])) : eq(proposalRows.proposalId, proposal.id))
    .orderBy(asc(proposalRows.position))
  if (!rows.length) return []
  const rowIds = rows.map((x) => x.r.id)
  const intersectionIds = [...new Set(rows.map((x) => x.r.intersectionId))]

  const [plans, events, evaluations, periods] = await Promise.all([
    db.select().from(timingPlans).where(inArray(timingPlans.intersectionId, intersectionIds)).orderBy(asc(timingPlans.startTime)),
    db.select({ e: proposalRowEvents, actorName: users.name, orgName: organisations.name })
      .from(proposalRowEvents)
      .leftJoin(users, eq(proposalRowEvents.actorId, users.id))
      .leftJoin(organisations, eq(users.organisationId, organisations.id))
      .where(inArray(proposalRowEvents.rowId, rowIds)).orderBy(asc(proposalRowEvents.id)),
    db.select().from(proposalEvaluations).where(eq(proposalEvaluations.proposalId, proposal.id)).orderBy(desc(proposalEvaluations.createdAt)),
    db.select({ id: corridorPeriods.id, sortOrder: corridorPeriods.sortOrder }).from(corridorPeriods).where(eq(corridorPeriods.corridorId, proposal.corridorId)),
  ])
  const periodOrder = new Map(periods.map((p) => [p.id, p.sortOrder]))
  const periodIds = new Set(periods.map((p) => p.id))

  const runs = new Map(rowIds.map((id) => [id, latestRuns(evaluations, id)]))
  const evalIds = [...new Set([...runs.values()].flatMap((r) => [r.proposed?.id, r.counter?.id]).filter((x): x is string => !!x))]
  const results = evalIds.length
    ? await db.select(resultSummaryColumns).from(proposalResults)
      .where(and(inArray(proposalResults.evaluationId, evalIds), inArray(proposalResults.rowId, rowIds)))
    : []

  return rows.map(({ r, i, cityName, a }) => {
    const settings = settingsOf(r)
    const myPlans = plans.filter((p) => p.intersectionId === r.intersectionId)
    const forCheck: PlanForCheck[] = myPlans.map((p) => ({
      name: p.name, cycleS: p.cycleS, busGreenS: p.busGreenS, yellowS: p.yellowS, redClearanceS: p.redClearanceS,
      crossMinGreenS: p.crossMinGreenS, pedWalkS: p.pedWalkS, pedClearanceS: p.pedClearanceS, pedConcurrent: p.pedConcurrent,
    }))
    const now: CurrentInputs = { planVersions: new Map(myPlans.map((p) => [p.id, p.version])), approachVersion: a?.version ?? null, intersectionVersion: i.version, periodIds }
    const run = runs.get(r.id)!
    const mine = run.proposed ? results.filter((x) => x.evaluationId === run.proposed!.id && x.rowId === r.id && x.variant === 'proposed') : []
    const theirs = run.counter && r.counter ? results.filter((x) => x.evaluationId === run.counter!.id && x.rowId === r.id && x.variant === 'counter') : []
    const history: RowEventDto[] = events.filter((e) => e.e.rowId === r.id).map(({ e, actorName, orgName }) => ({
      id: e.id, kind: e.kind, rowVersion: e.rowVersion, statusFrom: e.statusFrom, statusTo: e.statusTo,
      actor: e.actorId && actorName ? { id: e.actorId, name: actorName, organisationName: orgName ?? '' } : null,
      at: e.at.toISOString(), changes: e.changes, comment: e.comment, counter: e.counter,
    }))
    const may = rowPermissions(actor, { status: r.status, jurisdictionId: i.jurisdictionId, counter: r.counter })
    const ownAgency = actor.organisationId === proposal.agencyId
    return {
      id: r.id,
      position: r.position,
      intersectionId: r.intersectionId,
      intersectionName: i.name,
      approachId: r.approachId ?? '',
      distanceM: a?.distanceM ?? null,
      jurisdictionId: i.jurisdictionId,
      jurisdiction: { id: i.jurisdictionId, name: cityName },
      status: r.status,
      version: r.version,
      settings,
      counter: r.counter,
      results: mine.length ? resultsDto(run.proposed!, mine, settings, now, periodOrder) : null,
      counterResults: theirs.length && r.counter ? resultsDto(run.counter!, theirs, applyCounter(settings, r.counter), now, periodOrder) : null,
      lastComment: r.lastComment,
      checks: checkPriority(settings, forCheck),
      plans: forCheck,
      history,
      may: { edit: may.edit && ownAgency, decide: may.decide, answer: may.answer && ownAgency },
      updatedAt: r.updatedAt.toISOString(),
    }
  })
}
