// Changes to one row: the planner's edits and answers, the city's decisions. Each names the row
// version it read; the write is a conditional UPDATE ... WHERE version = $v inside the transaction
// that also records the history event, so of two people acting on the same version exactly one
// wins and the other gets 409 with the row as it now is.
import { and, eq, sql } from 'drizzle-orm'
import type { User } from 'lucia'
import type { Db } from '../../db'
import { intersections, organisations, proposalRowEvents, proposalRows, proposals } from '../../db/schema'
import { Conflict, Unprocessable } from '../../errors'
import type { Mailer } from '../mail'
import type {
  AnswerBody, Counter, DecisionBody, FieldChange, ProposalRowDto, RowEventKind, RowSettings, RowStatus,
} from '../../../shared/schemas/proposals'
import { transition, type RowAction } from '../../../shared/proposals/row-state'
import { applyCounter, mergeSettings, settingsChanges } from '../../../shared/proposals/settings'
import { checkPriority } from '../../../shared/proposals/priority-checks'
import { rowDtos } from './dto'
import { evaluateRowNow } from './evaluation'
import { notifyAnswer, notifyDecision } from './notify'
import {
  assertMayDecide, assertMayPlan, proposalRecord, rowRecord, settingsColumns, settingsOf, type ProposalRecord, type RowRecord,
} from './records'

async function rowDto(db: Db, actor: User, p: ProposalRecord, rowId: string): Promise<ProposalRowDto> {
  const [dto] = await rowDtos(db, actor, p, [rowId])
  return dto
}

async function staleConflict(db: Db, actor: User, p: ProposalRecord, rowId: string, message?: string): Promise<Conflict> {
  return new Conflict(message ?? 'Someone changed this row since you opened it. Here is the row as it is now.', { row: await rowDto(db, actor, p, rowId) })
}

async function assertTransition(db: Db, actor: User, p: ProposalRecord, row: RowRecord, action: RowAction, version: number) {
  if (version !== row.version) throw await staleConflict(db, actor, p, row.id)
  const t = transition(row.status, action)
  if (!t.ok) throw await staleConflict(db, actor, p, row.id, t.reason)
  return t
}

/** Refuses settings that break a limit of the intersection's timing plans (422 with the field). */
async function assertWithinLimits(db: Db, intersectionId: string, settings: RowSettings, prefix: (string | number)[]) {
  const dto = await db.query.timingPlans.findMany({ where: (t, { eq: e }) => e(t.intersectionId, intersectionId) })
  const errors = checkPriority(settings, dto).filter((c) => c.severity === 'error')
  if (errors.length) {
    throw new Unprocessable('These settings break a limit of the intersection’s timing plans.', errors.map((c) => ({ path: [...prefix, ...c.path], message: c.message })))
  }
}

interface RowWrite {
  status: RowStatus
  kind: RowEventKind
  settings?: RowSettings
  counter: Counter | null
  comment: string
  changes: FieldChange[]
  /** Record the comment as the row's last comment (decisions and answers do, edits do not). */
  keepComment: boolean
}

/** The conditional write and its history event, in one transaction. Null when the version moved on. */
async function writeRow(db: Db, actor: User, row: RowRecord, expectedVersion: number, w: RowWrite): Promise<number | null> {
  return db.transaction(async (tx) => {
    const [updated] = await tx.update(proposalRows).set({
      ...(w.settings ? settingsColumns(w.settings) : {}),
      status: w.status,
      counter: w.counter,
      ...(w.keepComment ? { lastComment: w.comment } : {}),
      version: sql`${proposalRows.version} + 1`,
      updatedAt: sql`now()`,
      updatedBy: actor.id,
    }).where(and(eq(proposalRows.id, row.id), eq(proposalRows.version, expectedVersion), eq(proposalRows.status, row.status)))
      .returning({ version: proposalRows.version })
    if (!updated) return null
    await tx.insert(proposalRowEvents).values({
      rowId: row.id, proposalId: row.proposalId, rowVersion: updated.version, kind: w.kind, statusFrom: row.status, statusTo: w.status,
      actorId: actor.id, changes: w.changes, comment: w.comment, counter: w.counter,
    })
    // The proposal's version counts changes of settings: stored results name the version they belong to.
    if (w.changes.length) await tx.update(proposals).set({ version: sql`${proposals.version} + 1`, updatedAt: sql`now()` }).where(eq(proposals.id, row.proposalId))
    return updated.version
  })
}

export async function patchRow(db: Db, actor: User, proposalId: string, rowId: string, body: { version: number } & Parameters<typeof mergeSettings>[1]): Promise<ProposalRowDto> {
  const p = await proposalRecord(db, proposalId)
  assertMayPlan(actor, p)
  const row = await rowRecord(db, proposalId, rowId)
  const t = await assertTransition(db, actor, p, row, { type: 'edit' }, body.version)
  const { version, ...patch } = body
  const next = mergeSettings(settingsOf(row), patch)
  const changes = settingsChanges(settingsOf(row), next)
  if (!changes.length) return rowDto(db, actor, p, rowId)
  await assertWithinLimits(db, row.intersectionId, next, [])
  const written = await writeRow(db, actor, row, version, { status: t.to, kind: 'edited', settings: next, counter: row.counter, comment: '', changes, keepComment: false })
  if (written === null) throw await staleConflict(db, actor, p, rowId)
  return rowDto(db, actor, p, rowId)
}

export async function decideRow(db: Db, mailer: Mailer, actor: User, proposalId: string, rowId: string, body: DecisionBody & { comment: string }, baseUrl: string): Promise<ProposalRowDto> {
  const p = await proposalRecord(db, proposalId)
  const row = await rowRecord(db, proposalId, rowId)
  const [city] = await db.select({ id: intersections.jurisdictionId, name: organisations.name }).from(intersections)
    .innerJoin(organisations, eq(intersections.jurisdictionId, organisations.id)).where(eq(intersections.id, row.intersectionId))
  assertMayDecide(actor, city.id, city.name)
  const t = await assertTransition(db, actor, p, row, { type: 'decide', decision: body.decision }, body.version)
  const counter = body.decision === 'request-change' ? body.counter ?? null : null
  if (counter) await assertWithinLimits(db, row.intersectionId, applyCounter(settingsOf(row), counter), ['counter'])
  const written = await writeRow(db, actor, row, body.version, { status: t.to, kind: t.kind, counter, comment: body.comment, changes: [], keepComment: true })
  if (written === null) throw await staleConflict(db, actor, p, rowId)
  // A counter is evaluated at once, so the planner sees its price beside the proposal.
  if (counter) await evaluateRowNow(db, proposalId, rowId, applyCounter(settingsOf(row), counter), 'counter', actor.id)
  const dto = await rowDto(db, actor, p, rowId)
  await notifyDecision(db, mailer, p, dto, actor, city.name, body.comment, baseUrl)
  return dto
}

export async function answerRow(db: Db, mailer: Mailer, actor: User, proposalId: string, rowId: string, body: AnswerBody & { comment: string }, baseUrl: string): Promise<ProposalRowDto> {
  const p = await proposalRecord(db, proposalId)
  assertMayPlan(actor, p)
  const row = await rowRecord(db, proposalId, rowId)
  const t = await assertTransition(db, actor, p, row, { type: 'answer', answer: body.action, hasCounter: row.counter !== null }, body.version)
  const before = settingsOf(row)
  const next = body.action === 'accept-counter' ? applyCounter(before, row.counter!) : mergeSettings(before, body.settings)
  const changes = settingsChanges(before, next)
  if (body.action === 'resubmit' && changes.length) await assertWithinLimits(db, row.intersectionId, next, ['settings'])
  const written = await writeRow(db, actor, row, body.version, { status: t.to, kind: t.kind, settings: next, counter: null, comment: body.comment, changes, keepComment: true })
  if (written === null) throw await staleConflict(db, actor, p, rowId)
  if (changes.length) await evaluateRowNow(db, proposalId, rowId, next, 'row', actor.id)
  const dto = await rowDto(db, actor, p, rowId)
  await notifyAnswer(db, mailer, p, dto, actor, body.comment, baseUrl)
  return dto
}
