/**
 * A workspace never loses its last owner, even when two owners leave, remove each other or demote
 * each other at the same moment.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { dataSource } from '../../server/data-source'
import { Membership } from '../../server/modules/workspaces/membership.entity'
import { forgetMemberships } from '../../server/modules/workspaces/workspaces.repository'
import { closeTestApp, getTestApp, makeTeam, signIn } from '../helpers/test-app'

let built: BuiltApp
beforeAll(async () => {
  built = await getTestApp()
})
afterAll(closeTestApp)

const ROUNDS = 50
/** Rounds of the races that sign their users out (each needs a fresh team and sign-ins). */
const SHORT_ROUNDS = 20

/** A workspace with two owners (the team's owner and its designer, promoted), both signed in. */
async function twoOwners() {
  const team = await makeTeam('Two owners')
  await dataSource.getRepository(Membership).update({ workspaceId: team.workspaceId, userId: team.users.designer.id }, { role: 'owner' })
  const [a, b] = await Promise.all([signIn(built.app, team.users.owner.email), signIn(built.app, team.users.designer.email)])
  const members = (await a.get('/api/workspace/members')).body.members as Array<{ id: string; userId: string }>
  const idOf = (userId: string) => members.find((m) => m.userId === userId)!.id
  return { team, a, b, aId: idOf(team.users.owner.id), bId: idOf(team.users.designer.id) }
}

async function owners(workspaceId: string) {
  return dataSource.getRepository(Membership).count({ where: { workspaceId, role: 'owner' } })
}

type Setup = Awaited<ReturnType<typeof twoOwners>>

/** Both back as owners, for the next round of a race that leaves the sessions signed in. */
async function restore(setup: Setup) {
  const repo = dataSource.getRepository(Membership)
  await repo.delete({ workspaceId: setup.team.workspaceId, userId: setup.team.users.owner.id })
  await repo.delete({ workspaceId: setup.team.workspaceId, userId: setup.team.users.designer.id })
  await repo.insert({ id: setup.aId, workspaceId: setup.team.workspaceId, userId: setup.team.users.owner.id, role: 'owner' })
  await repo.insert({ id: setup.bId, workspaceId: setup.team.workspaceId, userId: setup.team.users.designer.id, role: 'owner' })
  forgetMemberships()
}

async function race(label: string, rounds: number, act: (x: Setup) => Promise<Array<{ status: number }>>, reuse = false) {
  const outcomes: string[] = []
  let shared: Setup | null = null
  for (let round = 0; round < rounds; round++) {
    if (reuse && shared) await restore(shared)
    const setup: Setup = reuse ? (shared ??= await twoOwners()) : await twoOwners()
    const results = await act(setup)
    const left = await owners(setup.team.workspaceId)
    const statuses = results.map((r) => r.status).sort((x, y) => x - y)
    outcomes.push(statuses.join('/'))
    expect(left, `${label}, round ${round}: ${outcomes.at(-1)}`).toBeGreaterThanOrEqual(1)
    // Exactly one of the two changes went through; the other was refused (409 last owner, or 403 once no longer a member).
    expect(statuses.filter((s) => s < 300).length, `${label}, round ${round}: ${outcomes.at(-1)}`).toBe(1)
  }
}

describe('the last owner under concurrency', () => {
  it(`two owners leaving at once, ${ROUNDS} rounds: one leaves, the other is refused`, async () => {
    await race('leave', ROUNDS, ({ a, b }) => Promise.all([a.post('/api/workspace/leave'), b.post('/api/workspace/leave')]), true)
  }, 120_000)

  it(`two owners removing each other at once, ${SHORT_ROUNDS} rounds: the workspace keeps an owner`, async () => {
    await race('remove', SHORT_ROUNDS, ({ a, b, aId, bId }) =>
      Promise.all([a.delete(`/api/workspace/members/${bId}`), b.delete(`/api/workspace/members/${aId}`)]),
    )
  }, 120_000)

  it(`one owner leaving while the other demotes themself, ${ROUNDS} rounds: the workspace keeps an owner`, async () => {
    await race(
      'leave and demote',
      ROUNDS,
      ({ a, b, bId }) => Promise.all([a.post('/api/workspace/leave'), b.patch(`/api/workspace/members/${bId}`, { role: 'viewer' })]),
      true,
    )
  }, 120_000)
})
