/**
 * The local outbox shows a workspace owner only mail sent on behalf of that workspace or addressed
 * to them; account mail (password reset, e-mail confirmation) is never shown through the app.
 */
import supertest from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { closeTestApp, getTestApp, mailTo, makeTeam, signIn } from '../helpers/test-app'

let built: BuiltApp
beforeAll(async () => {
  built = await getTestApp()
})
afterAll(closeTestApp)

async function waitForMail(address: string, count = 1) {
  for (let i = 0; i < 50; i++) {
    const mail = mailTo(address)
    if (mail.length >= count) return mail
    await new Promise((r) => setTimeout(r, 100))
  }
  return mailTo(address)
}

type Shown = { to: string[]; subject: string; text: string }

describe('outbox', () => {
  it("never shows another user's password-reset mail to the owner of another workspace", async () => {
    const victim = await makeTeam('Victim team')
    const attacker = await makeTeam('Attacker team')
    const reset = await supertest(built.app).post('/api/auth/forgot-password').send({ email: victim.users.designer.email })
    expect(reset.status).toBe(202)
    await waitForMail(victim.users.designer.email)
    const owner = await signIn(built.app, attacker.users.owner.email)
    const res = await owner.get('/api/outbox')
    expect(res.status).toBe(200)
    const shown = res.body.messages as Shown[]
    expect(shown.filter((m) => m.to.includes(victim.users.designer.email))).toEqual([])
    expect(shown.some((m) => /reset-password\?token=/.test(m.text))).toBe(false)
  })

  it('never shows account mail, even to its own addressee', async () => {
    const team = await makeTeam()
    await supertest(built.app).post('/api/auth/forgot-password').send({ email: team.users.owner.email })
    await waitForMail(team.users.owner.email)
    const owner = await signIn(built.app, team.users.owner.email)
    const shown = (await owner.get('/api/outbox')).body.messages as Shown[]
    expect(shown.some((m) => /reset-password\?token=/.test(m.text))).toBe(false)
  })

  it("shows a workspace's own invitations to its owners, and nobody else's", async () => {
    const inviting = await makeTeam('Inviting team')
    const bystander = await makeTeam('Bystander team')
    const owner = await signIn(built.app, inviting.users.owner.email)
    const invitee = `invitee-${Date.now()}@test.example`
    expect((await owner.post('/api/workspace/invitations', { email: invitee, role: 'viewer' })).status).toBe(201)
    await waitForMail(invitee)

    const own = (await owner.get('/api/outbox')).body.messages as Shown[]
    expect(own.some((m) => m.to.includes(invitee))).toBe(true)

    const other = await signIn(built.app, bystander.users.owner.email)
    const theirs = (await other.get('/api/outbox')).body.messages as Shown[]
    expect(theirs.some((m) => m.to.includes(invitee))).toBe(false)
    expect(theirs.some((m) => /invitation\?token=/.test(m.text))).toBe(false)
  })

  it('shows an invitation from another workspace to the person it is addressed to', async () => {
    const inviting = await makeTeam('Inviting team')
    const invited = await makeTeam('Invited person team')
    const owner = await signIn(built.app, inviting.users.owner.email)
    const address = invited.users.owner.email
    expect((await owner.post('/api/workspace/invitations', { email: address, role: 'viewer' })).status).toBe(201)
    await waitForMail(address)
    const addressee = await signIn(built.app, address)
    const shown = (await addressee.get('/api/outbox')).body.messages as Shown[]
    expect(shown.some((m) => m.to.includes(address) && /invitation\?token=/.test(m.text))).toBe(true)
  })
})
