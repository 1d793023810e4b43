// The rows of the proposal tables as services read them, and the access rules that depend on data.
import { and, eq, inArray } from 'drizzle-orm'
import type { User } from 'lucia'
import type { Db, Tx } from '../../db'
import { corridors, proposalRows, proposals, users } from '../../db/schema'
import { Forbidden, NotFound } from '../../errors'
import type { RowSettings } from '../../../shared/schemas/proposals'
import { mayDecideRow } from '../../../shared/proposals/permissions'

export type DbOrTx = Db | Tx
export type ProposalRecord = typeof proposals.$inferSelect & { corridorName: string; agencyId: string; feedVersionId: number }
export type RowRecord = typeof proposalRows.$inferSelect

export async function proposalRecord(db: DbOrTx, id: string): Promise<ProposalRecord> {
  const [row] = await db.select({ p: proposals, corridorName: corridors.name, agencyId: corridors.agencyId, feedVersionId: corridors.feedVersionId })
    .from(proposals).innerJoin(corridors, eq(proposals.corridorId, corridors.id)).where(eq(proposals.id, id))
  if (!row) throw new NotFound('Proposal')
  return { ...row.p, corridorName: row.corridorName, agencyId: row.agencyId, feedVersionId: row.feedVersionId }
}

export async function rowRecord(db: DbOrTx, proposalId: string, rowId: string): Promise<RowRecord> {
  const [row] = await db.select().from(proposalRows).where(and(eq(proposalRows.id, rowId), eq(proposalRows.proposalId, proposalId)))
  if (!row) throw new NotFound('Proposal row')
  return row
}

export function settingsOf(r: RowRecord): RowSettings {
  return {
    strategy: r.strategy,
    maxExtensionS: r.maxExtensionS,
    maxEarlyGreenS: r.maxEarlyGreenS,
    lockoutCycles: r.lockoutCycles,
    conditional: { onlyLateBuses: r.onlyLateBuses, lateThresholdS: r.lateThresholdS, lateShare: r.lateShare },
  }
}

export function settingsColumns(s: RowSettings) {
  return {
    strategy: s.strategy,
    maxExtensionS: s.maxExtensionS,
    maxEarlyGreenS: s.maxEarlyGreenS,
    lockoutCycles: s.lockoutCycles,
    onlyLateBuses: s.conditional.onlyLateBuses,
    lateThresholdS: s.conditional.lateThresholdS,
    lateShare: s.conditional.lateShare,
  }
}

/**
 * Drafts are the agency's own business; once submitted, a proposal is visible to the engineers
 * of every city it has a row in. Agency roles and admins see every proposal.
 */
export function mayView(actor: User, p: { status: 'draft' | 'submitted' }, jurisdictionIds: readonly string[]): boolean {
  if (actor.role !== 'engineer') return true
  return p.status === 'submitted' && jurisdictionIds.includes(actor.organisationId)
}

/** Planners of the agency that owns the corridor draft, submit and answer. */
export function assertMayPlan(actor: User, p: { agencyId: string }): void {
  if (actor.role !== 'planner' || actor.organisationId !== p.agencyId) {
    throw new Forbidden('Only the planners of the agency that owns this corridor may change its proposals.')
  }
}

export function assertMayDecide(actor: User, jurisdictionId: string, cityName: string): void {
  if (!mayDecideRow(actor, jurisdictionId)) throw new Forbidden(`Only traffic engineers of ${cityName} may decide this row.`)
}

export async function activeEngineersOf(db: DbOrTx, cityIds: readonly string[]) {
  if (!cityIds.length) return []
  return db.select({ id: users.id, email: users.email, name: users.name, organisationId: users.organisationId }).from(users)
    .where(and(eq(users.role, 'engineer'), eq(users.active, true), inArray(users.organisationId, [...cityIds])))
}

export async function userById(db: DbOrTx, id: string | null) {
  if (!id) return null
  const [u] = await db.select({ id: users.id, email: users.email, name: users.name, active: users.active }).from(users).where(eq(users.id, id))
  return u ?? null
}
