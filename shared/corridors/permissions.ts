import type { Actor } from '../signals/permissions'

/** Corridors and their approach data are kept by the agency's planners (and by admins). */
export function mayEditCorridor(actor: Actor, agencyId: string): boolean {
  return actor.role === 'admin' || (actor.role === 'planner' && actor.organisationId === agencyId)
}
