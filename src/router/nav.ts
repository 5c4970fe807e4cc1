/** The side navigation, grouped by the work people do. Each entry names a route in routes.ts. */
import type { Role } from '@shared/schemas/roles'

export interface NavItem {
  route: string
  label: string
  /** Least role that sees the entry. */
  role: Role
}

export interface NavGroup {
  label: string
  items: NavItem[]
}

export const NAV: NavGroup[] = [
  { label: 'Start', items: [{ route: 'home', label: 'Home', role: 'viewer' }] },
  {
    label: 'Workspace',
    items: [
      { route: 'team', label: 'Team', role: 'viewer' },
      { route: 'outbox', label: 'Outbox', role: 'owner' },
    ],
  },
]
