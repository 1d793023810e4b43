// Running the model over a proposal (a job, for all rows) or over one row at once (a counter, or
// the planner's answer). Results and the run's success are written in one transaction.
import { randomUUID } from 'node:crypto'
import { and, asc, eq, inArray } from 'drizzle-orm'
import type { User } from 'lucia'
import type { Db } from '../../db'
import { proposalEvaluations, proposalResults, proposalRows } from '../../db/schema'
import { Conflict } from '../../errors'
import { createJob, runJob, type ReportProgress } from '../jobs'
import type { RowSettings } from '../../../shared/schemas/proposals'
import { computeRowResults, loadEvaluationContext, type ResultInsert, type RowToEvaluate } from './evaluation-context'
import { assertMayPlan, proposalRecord, settingsOf, type DbOrTx, type ProposalRecord } from './records'

export interface EvaluationSummary {
  evaluationId: string
  proposalVersion: number
  rows: number
  periodsEvaluated: number
  periodsFailed: number
}

async function storeResults(db: Db, evaluationId: string, proposalVersion: number, results: ResultInsert[]) {
  await db.transaction(async (tx) => {
    // Keep each statement's parameter count well inside PostgreSQL's limit.
    for (let i = 0; i < results.length; i += 200) await tx.insert(proposalResults).values(results.slice(i, i + 200))
    await tx.update(proposalEvaluations).set({ state: 'succeeded', proposalVersion, finishedAt: new Date() }).where(eq(proposalEvaluations.id, evaluationId))
  })
}

async function markFailed(db: DbOrTx, evaluationId: string) {
  await db.update(proposalEvaluations).set({ state: 'failed', finishedAt: new Date() }).where(eq(proposalEvaluations.id, evaluationId))
}

/** Evaluates every row of the proposal with its current settings. Used by the job and the demo seed. */
export async function evaluateProposalNow(db: Db, proposalId: string, evaluationId: string, report: ReportProgress = async () => {}): Promise<EvaluationSummary> {
  try {
    // Read the version and the rows together, so the figures belong to exactly that version.
    const { p, rows } = await db.transaction(async (tx) => ({
      p: await proposalRecord(tx, proposalId),
      rows: await tx.select().from(proposalRows).where(eq(proposalRows.proposalId, proposalId)).orderBy(asc(proposalRows.position)),
    }))
    await report({ progress: 0.05, stage: 'loading', message: 'Reading the schedule, the timing plans and the approaches' })
    const ctx = await loadEvaluationContext(db, p.corridorId)
    const results: ResultInsert[] = []
    for (const [i, r] of rows.entries()) {
      await report({ progress: 0.1 + (0.8 * i) / rows.length, stage: 'evaluating', message: `Intersection ${i + 1} of ${rows.length}` })
      results.push(...computeRowResults(ctx, r, settingsOf(r), { evaluationId, proposalId, proposalVersion: p.version, variant: 'proposed' }))
    }
    await report({ progress: 0.95, stage: 'storing', message: `Storing ${results.length} results` })
    await storeResults(db, evaluationId, p.version, results)
    const failed = results.filter((x) => x.error).length
    return { evaluationId, proposalVersion: p.version, rows: rows.length, periodsEvaluated: results.length - failed, periodsFailed: failed }
  } catch (err) {
    await markFailed(db, evaluationId)
    throw err
  }
}

export async function newEvaluation(db: DbOrTx, p: ProposalRecord, kind: 'proposal' | 'row' | 'counter', createdBy: string | null, extra: { jobId?: string; rowId?: string } = {}) {
  const id = randomUUID()
  await db.insert(proposalEvaluations).values({
    id, proposalId: p.id, kind, rowId: extra.rowId ?? null, jobId: extra.jobId ?? null, proposalVersion: p.version,
    feedVersionId: p.feedVersionId, createdBy,
  })
  return id
}

/** Starts the job; the client follows it at GET /api/jobs/:id like any other. */
export async function startEvaluation(db: Db, actor: User, proposalId: string): Promise<{ jobId: string; evaluationId: string }> {
  const p = await proposalRecord(db, proposalId)
  assertMayPlan(actor, p)
  const [running] = await db.select({ jobId: proposalEvaluations.jobId }).from(proposalEvaluations)
    .where(and(eq(proposalEvaluations.proposalId, proposalId), eq(proposalEvaluations.kind, 'proposal'), inArray(proposalEvaluations.state, ['running'])))
  if (running) throw new Conflict('This proposal is being evaluated already.', { jobId: running.jobId })
  const jobId = await createJob(db, 'proposal-evaluation', actor.id)
  const evaluationId = await newEvaluation(db, p, 'proposal', actor.id, { jobId })
  void runJob(db, jobId, (report) => evaluateProposalNow(db, proposalId, evaluationId, report))
  return { jobId, evaluationId }
}

/**
 * Evaluates one row at once with the given settings: the city's counter (shown beside the
 * proposal) or the planner's new settings. The row is read as it is now.
 */
export async function evaluateRowNow(db: Db, proposalId: string, rowId: string, settings: RowSettings, kind: 'row' | 'counter', createdBy: string | null): Promise<string> {
  const p = await proposalRecord(db, proposalId)
  const [row] = await db.select().from(proposalRows).where(eq(proposalRows.id, rowId))
  const evaluationId = await newEvaluation(db, p, kind, createdBy, { rowId })
  try {
    const ctx = await loadEvaluationContext(db, p.corridorId)
    const target: RowToEvaluate = { id: row.id, version: row.version, approachId: row.approachId, intersectionId: row.intersectionId }
    const results = computeRowResults(ctx, target, settings, { evaluationId, proposalId, proposalVersion: p.version, variant: kind === 'counter' ? 'counter' : 'proposed' })
    await storeResults(db, evaluationId, p.version, results)
    return evaluationId
  } catch (err) {
    await markFailed(db, evaluationId)
    throw err
  }
}
