export const ROLES = ['planner', 'engineer', 'manager', 'admin'] as const
export type Role = (typeof ROLES)[number]

export const ROLE_LABELS: Record<Role, string> = {
  planner: 'Transit planner',
  engineer: 'Traffic engineer',
  manager: 'Manager',
  admin: 'Administrator',
}

export type OrganisationKind = 'agency' | 'city'
