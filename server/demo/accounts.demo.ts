import type { EntityManager } from 'typeorm'
import bcrypt from 'bcryptjs'
import { DEMO_PASSWORD, DEMO_USERS, DEMO_WORKSPACE } from '../scripts/demo-users'
import { BCRYPT_COST } from '../modules/auth/auth.service'
import { User } from '../modules/users/user.entity'
import { Membership } from '../modules/workspaces/membership.entity'
import { Workspace } from '../modules/workspaces/workspace.entity'

export interface DemoContext {
  workspaceId: string
  users: Record<string, string>
}

/** The demo contractor and its four users. Returns ids for the later demo steps. */
export async function seedAccounts(m: EntityManager): Promise<DemoContext> {
  let ws = await m.getRepository(Workspace).findOne({ where: { name: DEMO_WORKSPACE } })
  ws ??= await m.getRepository(Workspace).save(m.getRepository(Workspace).create({ name: DEMO_WORKSPACE }))
  const hash = await bcrypt.hash(DEMO_PASSWORD, BCRYPT_COST)
  const users: Record<string, string> = {}
  for (const u of DEMO_USERS) {
    let user = await m.getRepository(User).findOne({ where: { email: u.email } })
    user ??= await m.getRepository(User).save(m.getRepository(User).create({ email: u.email, name: u.name, passwordHash: hash, emailConfirmedAt: new Date() }))
    // The demo users are confirmed, so anyone can sign in with them straight away.
    if (!user.emailConfirmedAt) await m.getRepository(User).update({ id: user.id }, { emailConfirmedAt: new Date() })
    users[u.role] = user.id
    const member = await m.getRepository(Membership).findOne({ where: { workspaceId: ws.id, userId: user.id } })
    if (!member) await m.getRepository(Membership).insert({ workspaceId: ws.id, userId: user.id, role: u.role })
  }
  return { workspaceId: ws.id, users }
}
