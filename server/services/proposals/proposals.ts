// Proposals as a whole: list, read, create (one row per corridor approach) and submit.
import { randomUUID } from 'node:crypto'
import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm'
import type { User } from 'lucia'
import type { Db } from '../../db'
import {
  corridorApproaches, corridorPeriods, corridors, intersections, organisations, proposalEvaluations, proposalRowEvents, proposalRows,
  proposals, timingPlans, users,
} from '../../db/schema'
import { Conflict, NotFound, Unprocessable } from '../../errors'
import type { Mailer } from '../mail'
import {
  DEFAULT_ROW_SETTINGS, ROW_STATUSES, type EvaluationRefDto, type ProposalCreateBody, type ProposalDto, type ProposalSummaryDto,
  type RowCounts,
} from '../../../shared/schemas/proposals'
import { corridorTotals } from '../../../shared/proposals/summary'
import { transition } from '../../../shared/proposals/row-state'
import { fitToPlans } from '../../../shared/proposals/priority-checks'
import { settingsChanges } from '../../../shared/proposals/settings'
import { rowDtos } from './dto'
import { assertMayPlan, mayView, proposalRecord, settingsColumns, type DbOrTx, type ProposalRecord } from './records'
import { notifySubmitted } from './notify'

const zeroCounts = (): RowCounts => Object.fromEntries(ROW_STATUSES.map((s) => [s, 0])) as RowCounts

async function evaluationRef(db: DbOrTx, proposalId: string): Promise<EvaluationRefDto | null> {
  const [e] = await db.select({ e: proposalEvaluations, name: users.name }).from(proposalEvaluations)
    .leftJoin(users, eq(proposalEvaluations.createdBy, users.id))
    .where(and(eq(proposalEvaluations.proposalId, proposalId), eq(proposalEvaluations.kind, 'proposal'), eq(proposalEvaluations.state, 'succeeded')))
    .orderBy(desc(proposalEvaluations.createdAt)).limit(1)
  if (!e) return null
  return {
    id: e.e.id, jobId: e.e.jobId, proposalVersion: e.e.proposalVersion, feedId: e.e.feedVersionId === null ? null : String(e.e.feedVersionId),
    createdAt: e.e.createdAt.toISOString(), createdBy: e.e.createdBy && e.name ? { id: e.e.createdBy, name: e.name } : null,
  }
}

export async function listProposals(db: Db, actor: User, filter: { corridorId?: string } = {}): Promise<ProposalSummaryDto[]> {
  const list = await db.select({ p: proposals, corridorName: corridors.name, createdByName: users.name })
    .from(proposals).innerJoin(corridors, eq(proposals.corridorId, corridors.id))
    .leftJoin(users, eq(proposals.createdBy, users.id))
    .where(filter.corridorId ? eq(proposals.corridorId, filter.corridorId) : undefined)
    .orderBy(desc(proposals.createdAt))
  if (!list.length) return []
  const ids = list.map((x) => x.p.id)
  const counts = await db.select({ proposalId: proposalRows.proposalId, status: proposalRows.status, cityId: intersections.jurisdictionId, cityName: organisations.name, n: sql<number>`count(*)::int` })
    .from(proposalRows)
    .innerJoin(intersections, eq(proposalRows.intersectionId, intersections.id))
    .innerJoin(organisations, eq(intersections.jurisdictionId, organisations.id))
    .where(inArray(proposalRows.proposalId, ids))
    .groupBy(proposalRows.proposalId, proposalRows.status, intersections.jurisdictionId, organisations.name)
  const out: ProposalSummaryDto[] = []
  for (const { p, corridorName, createdByName } of list) {
    const mine = counts.filter((c) => c.proposalId === p.id)
    const cities = [...new Map(mine.map((c) => [c.cityId, { id: c.cityId, name: c.cityName }])).values()].sort((a, b) => a.name.localeCompare(b.name))
    if (!mayView(actor, p, cities.map((c) => c.id))) continue
    const rowCounts = zeroCounts()
    for (const c of mine) rowCounts[c.status] += c.n
    out.push({
      id: p.id, corridorId: p.corridorId, corridorName, name: p.name, notes: p.notes, status: p.status, version: p.version,
      createdBy: p.createdBy && createdByName ? { id: p.createdBy, name: createdByName } : null,
      createdAt: p.createdAt.toISOString(), submittedAt: p.submittedAt?.toISOString() ?? null,
      rowCounts, jurisdictions: cities, lastEvaluation: await evaluationRef(db, p.id),
    })
  }
  return out
}

/** The proposal with its rows, as this reader may see it; 404 for a reader who may not. */
export async function getProposal(db: DbOrTx, actor: User, id: string): Promise<ProposalDto> {
  const p = await proposalRecord(db, id)
  const rows = await rowDtos(db, actor, p)
  if (!mayView(actor, p, rows.map((r) => r.jurisdictionId))) throw new NotFound('Proposal')
  return proposalDto(db, p, rows)
}

async function proposalDto(db: DbOrTx, p: ProposalRecord, rows: ProposalDto['rows']): Promise<ProposalDto> {
  const rowCounts = zeroCounts()
  for (const r of rows) rowCounts[r.status]++
  const [creator] = p.createdBy ? await db.select({ name: users.name }).from(users).where(eq(users.id, p.createdBy)) : []
  const periods = await db.select().from(corridorPeriods).where(eq(corridorPeriods.corridorId, p.corridorId)).orderBy(asc(corridorPeriods.sortOrder))
  return {
    id: p.id, corridorId: p.corridorId, corridorName: p.corridorName, name: p.name, notes: p.notes, status: p.status, version: p.version,
    createdBy: p.createdBy && creator ? { id: p.createdBy, name: creator.name } : null,
    createdAt: p.createdAt.toISOString(), submittedAt: p.submittedAt?.toISOString() ?? null,
    rowCounts,
    jurisdictions: [...new Map(rows.map((r) => [r.jurisdiction.id, r.jurisdiction])).values()].sort((a, b) => a.name.localeCompare(b.name)),
    lastEvaluation: await evaluationRef(db, p.id),
    rows,
    totals: corridorTotals(rows.map((r) => ({ summaries: r.results?.summaries ?? [] }))),
    periods: periods.map((x) => ({ id: x.id, name: x.name, startTime: x.startTime, endTime: x.endTime })),
  }
}

/** A draft with one row per approach of the corridor, in order along it, all with the same settings. */
export async function createProposal(db: Db, actor: User, body: ProposalCreateBody & { notes: string; fitToPlans?: boolean }): Promise<ProposalDto> {
  const [corridor] = await db.select().from(corridors).where(eq(corridors.id, body.corridorId))
  if (!corridor) throw new Unprocessable('No such corridor.', [{ path: ['corridorId'], message: `No corridor with id "${body.corridorId}".` }])
  assertMayPlan(actor, corridor)
  const approaches = await db.select().from(corridorApproaches).where(eq(corridorApproaches.corridorId, corridor.id)).orderBy(asc(corridorApproaches.distanceM))
  if (!approaches.length) {
    throw new Unprocessable('The corridor has no signalised approaches yet.', [{ path: ['corridorId'], message: 'Place the corridor’s signals (approaches) first.' }])
  }
  const defaults = body.defaults ?? DEFAULT_ROW_SETTINGS
  const plans = await db.select().from(timingPlans).where(inArray(timingPlans.intersectionId, approaches.map((a) => a.intersectionId)))
  const id = randomUUID()
  await db.transaction(async (tx) => {
    await tx.insert(proposals).values({ id, corridorId: corridor.id, name: body.name, notes: body.notes, createdBy: actor.id })
    const rows = approaches.map((a, i) => {
      const settings = body.fitToPlans === false ? defaults : fitToPlans(defaults, plans.filter((p) => p.intersectionId === a.intersectionId))
      return {
        id: randomUUID(), proposalId: id, approachId: a.id, intersectionId: a.intersectionId, position: i + 1,
        ...settingsColumns(settings), updatedBy: actor.id, changes: settingsChanges(defaults, settings),
      }
    })
    await tx.insert(proposalRows).values(rows.map(({ changes: _changes, ...r }) => r))
    // What was fitted is in the history, against the defaults asked for.
    await tx.insert(proposalRowEvents).values(rows.map((r) => ({
      rowId: r.id, proposalId: id, rowVersion: 1, kind: 'created' as const, statusFrom: null, statusTo: 'draft' as const, actorId: actor.id,
      changes: r.changes, comment: r.changes.length ? 'Limits lowered to what the timing plans can spare.' : '',
    })))
  })
  return getProposal(db, actor, id)
}

/**
 * Sends every draft row to its city: the proposal becomes visible to the engineers of each city it
 * touches, and each of them gets an e-mail. Refused while a row breaks a limit of its timing plans
 * or the stored figures are not those of the current version (the cities decide with them).
 */
export async function submitProposal(db: Db, mailer: Mailer, actor: User, id: string, comment: string, baseUrl: string): Promise<ProposalDto> {
  const p = await proposalRecord(db, id)
  assertMayPlan(actor, p)
  const rows = await rowDtos(db, actor, p)
  const drafts = rows.filter((r) => transition(r.status, { type: 'submit' }).ok)
  if (!drafts.length) throw new Conflict('Nothing to submit: no row of this proposal is a draft.')
  const broken = drafts.flatMap((r) => r.checks.filter((c) => c.severity === 'error').map((c) => ({
    path: ['rows', rows.indexOf(r), ...c.path], message: `${r.intersectionName}: ${c.message}`,
  })))
  if (broken.length) throw new Unprocessable('Some rows break a limit of their timing plans; fix them before submitting.', broken)
  const evaluation = await evaluationRef(db, p.id)
  if (!evaluation || evaluation.proposalVersion !== p.version || drafts.some((r) => !r.results || r.results.stale)) {
    throw new Conflict('Evaluate the proposal first: the cities decide with the figures of the current settings.')
  }
  await db.transaction(async (tx) => {
    for (const r of drafts) {
      const [updated] = await tx.update(proposalRows)
        .set({ status: 'submitted', version: sql`${proposalRows.version} + 1`, lastComment: comment, updatedAt: sql`now()`, updatedBy: actor.id })
        .where(and(eq(proposalRows.id, r.id), eq(proposalRows.version, r.version), eq(proposalRows.status, 'draft')))
        .returning({ version: proposalRows.version })
      if (!updated) throw new Conflict('A row changed while the proposal was being submitted; nothing was sent. Try again.')
      await tx.insert(proposalRowEvents).values({
        rowId: r.id, proposalId: p.id, rowVersion: updated.version, kind: 'submitted', statusFrom: 'draft', statusTo: 'submitted', actorId: actor.id, comment,
      })
    }
    await tx.update(proposals).set({ status: 'submitted', submittedAt: sql`now()`, submittedBy: actor.id, updatedAt: sql`now()` }).where(eq(proposals.id, p.id))
  })
  const after = await getProposal(db, actor, id)
  await notifySubmitted(db, mailer, after, drafts.map((r) => r.id), actor, comment, baseUrl)
  return after
}
