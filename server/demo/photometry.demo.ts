/**
 * Demo photometry and luminaire types: three invented luminaires whose intensity tables come
 * from a simple cosine-power model (not from any measurement), written out as LM-63 text and
 * stored like an upload. Idempotent: a file already stored (same text) and a type whose name
 * exists are skipped.
 */
import crypto from 'node:crypto'
import type { EntityManager } from 'typeorm'
import { LuminaireTypeSchema } from '../../shared/schemas/photometry.schema'
import { LuminaireType } from '../modules/photometry/luminaire-type.entity'
import { PhotometricFile } from '../modules/photometry/photometric-file.entity'
import { parseUpload } from '../modules/photometry/photometry.service'
import type { DemoContext } from './accounts.demo'
import { DEMO, demoText } from './photometry.demo-data'

export async function seedPhotometry(m: EntityManager, ctx: DemoContext): Promise<void> {
  const files = m.getRepository(PhotometricFile)
  const types = m.getRepository(LuminaireType)
  const author = ctx.users.designer ?? null
  for (const d of DEMO) {
    const text = demoText(d.file)
    const sha256 = crypto.createHash('sha256').update(text, 'utf8').digest('hex')
    let file = await files.findOne({ where: { workspaceId: ctx.workspaceId, sha256 }, select: { id: true } })
    file ??= await files.save(
      files.create({ workspaceId: ctx.workspaceId, name: d.file.name, rawText: text, sha256, parsed: parseUpload(text), createdBy: author }),
    )
    const input = LuminaireTypeSchema.parse({ ...d.type, photometricFileId: file.id })
    const existing = await types
      .createQueryBuilder('t')
      .where('t.workspace_id = :ws AND lower(t.name) = lower(:name)', { ws: ctx.workspaceId, name: input.name })
      .getOne()
    if (existing) continue
    await types.save(
      types.create({
        workspaceId: ctx.workspaceId,
        name: input.name,
        photometricFileId: file.id,
        emergencyOutputFactor: input.emergencyOutputFactor,
        ratedDurationS: input.ratedDuration,
        modes: input.modes,
        chemistry: input.chemistry,
        cellsInSeries: input.cellsInSeries,
        capacityAh: input.capacityAh,
        emergencyPowerW: input.emergencyPower,
        inputPowerW: input.inputPower,
        notes: input.notes,
        createdBy: author,
      }),
    )
  }
}

export { demoPhotometryTexts } from './photometry.demo-data'
