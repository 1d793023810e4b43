import type { Role } from '../../shared/roles'

// The invented demo scenario: an agency and the two cities its corridor crosses.
export const DEMO_ORGANISATIONS = [
  { id: 'org-lindenmere', name: 'Lindenmere Regional Transit', kind: 'agency', unitSystem: 'metric' },
  { id: 'org-brackenford', name: 'City of Brackenford', kind: 'city', unitSystem: 'metric' },
  { id: 'org-osterfield', name: 'City of Osterfield', kind: 'city', unitSystem: 'metric' },
] as const

export const DEMO_USERS: { id: string; email: string; name: string; role: Role; organisationId: string }[] = [
  { id: 'user-planner', email: 'planner@fanlight.test', name: 'Tova Rasmussen', role: 'planner', organisationId: 'org-lindenmere' },
  { id: 'user-engineer', email: 'engineer@fanlight.test', name: 'Dario Fenwick', role: 'engineer', organisationId: 'org-brackenford' },
  { id: 'user-engineer2', email: 'engineer2@fanlight.test', name: 'Ines Halloran', role: 'engineer', organisationId: 'org-osterfield' },
  { id: 'user-manager', email: 'manager@fanlight.test', name: 'Wendell Achterberg', role: 'manager', organisationId: 'org-lindenmere' },
  { id: 'user-admin', email: 'admin@fanlight.test', name: 'Sam Ortolan', role: 'admin', organisationId: 'org-lindenmere' },
]
