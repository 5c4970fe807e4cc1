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
    label: 'Design',
    items: [
      { route: 'replace-pack', label: 'Replace a pack', role: 'viewer' },
      { route: 'pack-bench', label: 'Pack bench', role: 'viewer' },
      { route: 'charger-check', label: 'Charger check', role: 'viewer' },
      { route: 'retrofit-planner', label: 'Retrofit planner', role: 'viewer' },
      { route: 'sheets', label: 'Spec sheets', role: 'viewer' },
    ],
  },
  {
    label: 'Route spacing',
    items: [
      { route: 'route-spacing', label: 'Spacing calculator', role: 'viewer' },
      { route: 'type-selector', label: 'Type selector', role: 'viewer' },
      { route: 'luminaire-types', label: 'Luminaire types', role: 'viewer' },
      { route: 'photometry', label: 'Photometric files', role: 'viewer' },
    ],
  },
  {
    label: 'Checks',
    items: [
      { route: 'claim-check', label: 'Claim check', role: 'viewer' },
      { route: 'discharge-logs', label: 'Discharge logs', role: 'viewer' },
    ],
  },
  {
    label: 'Upkeep',
    items: [
      { route: 'sites', label: 'Sites', role: 'viewer' },
      { route: 'portfolio', label: 'Portfolio', role: 'viewer' },
      { route: 'rounds', label: 'Test rounds', role: 'technician' },
    ],
  },
  {
    label: 'Workspace',
    items: [
      { route: 'team', label: 'Team', role: 'viewer' },
      { route: 'outbox', label: 'Outbox', role: 'owner' },
    ],
  },
  {
    label: 'Help',
    items: [
      { route: 'glossary', label: 'Glossary', role: 'viewer' },
      { route: 'cautions', label: 'Cautions', role: 'viewer' },
      { route: 'api-docs', label: 'API', role: 'viewer' },
    ],
  },
]
