// The traceability view of one row: every stored figure of its current results, proposed and
// counter, with the exact model input and output and the versions of what they were computed from.
import { and, eq, inArray } from 'drizzle-orm'
import type { User } from 'lucia'
import type { Db } from '../../db'
import { proposalEvaluations, proposalResults } from '../../db/schema'
import { NotFound } from '../../errors'
import type { StoredResultDto } from '../../../shared/schemas/proposals'
import { latestRuns, periodResultDto, rowDtos } from './dto'
import { mayView, proposalRecord } from './records'

export async function storedResults(db: Db, actor: User, proposalId: string, rowId: string): Promise<StoredResultDto[]> {
  const p = await proposalRecord(db, proposalId)
  const rows = await rowDtos(db, actor, p)
  if (!mayView(actor, p, rows.map((r) => r.jurisdictionId))) throw new NotFound('Proposal')
  const row = rows.find((r) => r.id === rowId)
  if (!row) throw new NotFound('Proposal row')
  const evaluations = await db.select().from(proposalEvaluations).where(eq(proposalEvaluations.proposalId, proposalId))
  const runs = latestRuns(evaluations, rowId)
  const ids = [runs.proposed?.id, row.counter ? runs.counter?.id : undefined].filter((x): x is string => !!x)
  if (!ids.length) return []
  const results = await db.select().from(proposalResults)
    .where(and(eq(proposalResults.rowId, rowId), inArray(proposalResults.evaluationId, ids)))
  const byId = new Map(evaluations.map((e) => [e.id, e]))
  return results
    .filter((r) => (r.variant === 'proposed' ? r.evaluationId === runs.proposed?.id : r.evaluationId === runs.counter?.id))
    .map((r) => ({
      ...periodResultDto(r),
      evaluationId: r.evaluationId,
      variant: r.variant,
      rowVersion: r.rowVersion,
      proposalVersion: r.proposalVersion,
      settings: r.settings,
      inputs: {
        timingPlanVersion: r.timingPlanVersion,
        approachVersion: r.approachVersion,
        intersectionVersion: r.intersectionVersion,
        feedId: byId.get(r.evaluationId)?.feedVersionId?.toString() ?? null,
        model: r.modelInput,
      },
      output: r.modelOutput,
    }))
}
