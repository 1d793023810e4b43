import { routes, type RouteName } from '@/router/routes'
import type { Role } from '@shared/roles'

export interface NavItem {
  name: RouteName
  label: string
  icon: string
}

/** The sidebar for one role, from the route records' meta. */
export function navFor(role: Role): NavItem[] {
  return routes
    .filter((r) => 'nav' in r.meta && (!('roles' in r.meta) || (r.meta.roles as readonly Role[]).includes(role)))
    .map((r) => ({ name: r.name, ...(r.meta as { nav: { label: string; icon: string; order: number } }).nav }))
    .sort((a, b) => a.order - b.order)
    .map(({ name, label, icon }) => ({ name, label, icon }))
}
