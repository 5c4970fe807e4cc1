/** Builders for specification-sheet rows in tests (through the service, like a designer would). */
import { dataSource } from '../../server/data-source'
import { newToken } from '../../server/lib/tokens'
import { ShareLink } from '../../server/modules/sheets/share-link.entity'
import * as sheets from '../../server/modules/sheets/sheets.service'
import type { TestTeam } from './test-app'

/** Pack inputs as a designer types them: a 3 h NiCd converter luminaire. */
export const PACK_INPUTS = {
  chemistry: 'nicd',
  duration: '3 h',
  driver: 'converter',
  load: { power: '2.5 W' },
  driverEfficiency: 0.8,
  ambientMin: '5 °C',
  ambientMax: '25 °C',
}

export function sheetBody(overrides: Record<string, unknown> = {}) {
  return {
    title: 'Stair core B, level 2',
    reference: 'T-001',
    client: 'Invented client',
    site: 'Invented site',
    luminaire: '3 W LED bulkhead, non-maintained',
    inputs: PACK_INPUTS,
    ...overrides,
  }
}

/** A sheet in the team's workspace, written by its designer; issued when asked. */
export async function sheetIn(team: TestTeam, opts: { issued?: boolean; title?: string } = {}) {
  const designer = team.users.designer.id
  let sheet = await sheets.createSheet(team.workspaceId, designer, sheets.contentOf(sheetBody(opts.title ? { title: opts.title } : {})))
  if (opts.issued) sheet = await sheets.issueSheet(team.workspaceId, designer, sheet.id, sheet.version)
  return sheet
}

/** A share link on an issued sheet of the team, with its token. */
export async function shareIn(team: TestTeam, sheetId?: string) {
  const id = sheetId ?? (await sheetIn(team, { issued: true })).id
  const { token, hash } = newToken()
  const link = await dataSource.getRepository(ShareLink).save(
    dataSource.getRepository(ShareLink).create({
      workspaceId: team.workspaceId,
      sheetId: id,
      tokenHash: hash,
      createdBy: team.users.designer.id,
      expiresAt: null,
      revokedAt: null,
      revokedBy: null,
    }),
  )
  return { sheetId: id, shareId: link.id, token }
}
