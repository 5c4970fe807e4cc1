/** Rows of the site register made straight in the database, for API tests and route examples. */
import crypto from 'node:crypto'
import { dataSource } from '../../server/data-source'
import { AreaEntity } from '../../server/modules/register/area.entity'
import { LuminaireEntity } from '../../server/modules/register/luminaire.entity'
import { SiteEntity } from '../../server/modules/register/site.entity'

export async function siteIn(workspaceId: string, over: Partial<SiteEntity> = {}) {
  return dataSource
    .getRepository(SiteEntity)
    .save(
      dataSource
        .getRepository(SiteEntity)
        .create({ workspaceId, name: `Test building ${crypto.randomBytes(3).toString('hex')}`, regime: 'en50172', ceilingTemperatureC: 25, ...over }),
    )
}

export async function areaIn(workspaceId: string, siteId: string, name = `Area ${crypto.randomBytes(3).toString('hex')}`) {
  return dataSource.getRepository(AreaEntity).save(dataSource.getRepository(AreaEntity).create({ workspaceId, siteId, name }))
}

export async function luminaireIn(workspaceId: string, siteId: string, over: Partial<LuminaireEntity> = {}) {
  return dataSource.getRepository(LuminaireEntity).save(
    dataSource.getRepository(LuminaireEntity).create({
      workspaceId,
      siteId,
      areaId: null,
      tag: `L-${crypto.randomBytes(3).toString('hex')}`,
      location: 'Corridor',
      purpose: 'escape-route',
      mode: 'non-maintained',
      ratedDurationH: 3,
      chemistry: 'nicd',
      cellsInSeries: 3,
      capacityAh: 1.6,
      packFittedOn: '2024-01-15',
      ...over,
    }),
  )
}

/** A site with one luminaire in it. */
export async function siteWithLuminaire(workspaceId: string) {
  const site = await siteIn(workspaceId)
  const luminaire = await luminaireIn(workspaceId, site.id)
  return { site, luminaire }
}

/** Inserts a test record directly (bypassing the API), e.g. to build history. */
export async function testIn(
  workspaceId: string,
  luminaireId: string,
  t: { kind: 'functional' | 'duration'; testedOn: string; passed?: boolean; achievedDurationH?: number | null; faults?: string },
) {
  const rows: Array<{ id: string }> = await dataSource.query(
    `INSERT INTO test_records (workspace_id, luminaire_id, client_id, kind, tested_on, passed, achieved_duration_h, faults) VALUES ($1,$2,$3,$4,$5,$6,$7,$8) RETURNING id`,
    [workspaceId, luminaireId, crypto.randomUUID(), t.kind, t.testedOn, t.passed ?? true, t.achievedDurationH ?? null, t.faults ?? ''],
  )
  return rows[0].id
}

export const CSV_OK = [
  'tag,area,location,type,purpose,mode,rated_duration_h,chemistry,cells,capacity_ah,pack_fitted_on',
  'R-1,Ground floor,Main exit,Bulkhead,escape-route,non-maintained,3,nicd,3,1.6,2024-02-01',
  'R-2,Ground floor,Reading room,Bulkhead,open-area,maintained,3,nimh,3,2.2,2024-02-01',
].join('\n')
