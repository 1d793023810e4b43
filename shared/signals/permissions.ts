import type { Role } from '../roles'

export interface Actor { role: Role; organisationId: string }

/** Signal assets and timing are kept by the engineers of the city that owns them (and by admins). */
export function mayEditSignal(actor: Actor, jurisdictionId: string): boolean {
  return actor.role === 'admin' || (actor.role === 'engineer' && actor.organisationId === jurisdictionId)
}

