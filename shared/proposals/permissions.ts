// Who may act on a proposal row. Route guards declare the role; these add the data-dependent part
// (the row's city) and are used by the client to show only the actions that will succeed.
import type { Actor } from '../signals/permissions'
import type { RowStatus, Counter } from '../schemas/proposals'
import { canTransition } from './row-state'

/** Proposals are drafted, submitted and answered by the agency's planners. */
export function mayPlan(actor: Actor): boolean {
  return actor.role === 'planner'
}

/** Only an engineer of the city that owns the intersection decides its row. */
export function mayDecideRow(actor: Actor, jurisdictionId: string): boolean {
  return actor.role === 'engineer' && actor.organisationId === jurisdictionId
}

export function rowPermissions(actor: Actor, row: { status: RowStatus; jurisdictionId: string; counter: Counter | null }) {
  const planner = mayPlan(actor)
  return {
    edit: planner && canTransition(row.status, { type: 'edit' }),
    decide: mayDecideRow(actor, row.jurisdictionId) && row.status === 'submitted',
    answer: planner && (canTransition(row.status, { type: 'answer', answer: 'resubmit', hasCounter: row.counter !== null })),
  }
}
