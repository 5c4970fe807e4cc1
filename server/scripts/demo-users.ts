/** The invented demo team: one user per role. Printed by `npm start` and listed in the README. */
import type { Role } from '../../shared/schemas/roles'

export const DEMO_WORKSPACE = 'Tallowmere Facilities (demo)'
export const DEMO_PASSWORD = 'lamp-demo-2026'

export const DEMO_USERS: Array<{ email: string; name: string; role: Role }> = [
  { email: 'owner@tallowmere.example', name: 'Orla Penhallow', role: 'owner' },
  { email: 'designer@tallowmere.example', name: 'Dev Castellan', role: 'designer' },
  { email: 'technician@tallowmere.example', name: 'Bram Okonjo', role: 'technician' },
  { email: 'viewer@tallowmere.example', name: 'Ines Marwood', role: 'viewer' },
]
