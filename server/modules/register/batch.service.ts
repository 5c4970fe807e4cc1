/**
 * Batches over the register: many sizings in one request (by value or by register luminaire), and
 * many luminaires changed in one request. Each item is answered on its own with the status it would
 * have had alone and its errors located by JSON Pointer into the request body, so a bad item never
 * hides the good ones and an integrator can retry just the failures.
 */
import { z } from 'zod'
import { sizeTool } from '../../../shared/engine/size'
import { runTool } from '../../../shared/engine/tool'
import { ENGINE_VERSION } from '../../../shared/engine/version'
import type { ItemError, LuminaireBulkSchema, SizeBatchSchema } from '../../../shared/schemas/batch.schema'
import { LuminairePatchSchema } from '../../../shared/schemas/luminaire.schema'
import { referencesIn } from '../../../shared/schemas/reference'
import { dataSource } from '../../data-source'
import { AppError } from '../../errors/app-error'
import { checkReferences } from '../../lib/references'
import { LuminaireType } from '../photometry/luminaire-type.entity'
import { LuminaireEntity } from './luminaire.entity'
import { updateLuminaire } from './register.service'
import { SiteEntity } from './site.entity'

/** RFC 6901: "~" and "/" inside a key are escaped so the pointer still splits at every "/". */
export function jsonPointer(parts: Array<string | number>): string {
  return parts.map((p) => '/' + String(p).replace(/~/g, '~0').replace(/\//g, '~1')).join('')
}

/** A dotted field path as the engine and zod write it ("load.power", "(input)") under a prefix. */
function pointerOf(prefix: Array<string | number>, dotted: string): string {
  return jsonPointer(dotted === '(input)' || dotted === '' ? prefix : [...prefix, ...dotted.split('.')])
}

/**
 * The `size` input a register luminaire stands for: its pack (checked as the existing pack), its
 * rated duration and mode, its site's ceiling temperature as the highest ambient, and its type's
 * emergency power as the load. Quantities carry their units, as the engine asks.
 */
function sizeInputOf(l: LuminaireEntity, site: SiteEntity | undefined, type: LuminaireType | undefined): Record<string, unknown> {
  return {
    chemistry: l.chemistry,
    cellsInSeries: l.cellsInSeries,
    capacity: `${l.capacityAh} Ah`,
    duration: `${l.ratedDurationH} h`,
    mode: l.mode,
    ...(site ? { ambientMax: site.ceilingTemperatureC } : {}),
    ...(type ? { load: { power: type.emergencyPowerW } } : {}),
  }
}

type SizeBatch = z.output<typeof SizeBatchSchema>

export async function sizeBatch(workspaceId: string, batch: SizeBatch) {
  // Every luminaire id was checked against the workspace before the handler (server/lib/references.ts); one query each for luminaires, sites and types.
  const ids = [...new Set(batch.items.flatMap((i) => (i.luminaireId ? [i.luminaireId] : [])))]
  const luminaires = ids.length
    ? await dataSource
        .getRepository(LuminaireEntity)
        .createQueryBuilder('l')
        .where('l.workspace_id = :workspaceId AND l.id IN (:...ids)', { workspaceId, ids })
        .getMany()
    : []
  const siteIds = [...new Set(luminaires.map((l) => l.siteId))]
  const typeIds = [...new Set(luminaires.flatMap((l) => (l.luminaireTypeId ? [l.luminaireTypeId] : [])))]
  const sites = siteIds.length
    ? await dataSource
        .getRepository(SiteEntity)
        .createQueryBuilder('s')
        .where('s.workspace_id = :workspaceId AND s.id IN (:...siteIds)', { workspaceId, siteIds })
        .getMany()
    : []
  const types = typeIds.length
    ? await dataSource
        .getRepository(LuminaireType)
        .createQueryBuilder('t')
        .where('t.workspace_id = :workspaceId AND t.id IN (:...typeIds)', { workspaceId, typeIds })
        .getMany()
    : []
  const byId = new Map(luminaires.map((l) => [l.id, l]))
  const siteById = new Map(sites.map((s) => [s.id, s]))
  const typeById = new Map(types.map((t) => [t.id, t]))

  const results = batch.items.map((item, index) => {
    const head = { index, ...(item.ref !== undefined ? { ref: item.ref } : {}), ...(item.luminaireId ? { luminaireId: item.luminaireId } : {}) }
    const l = item.luminaireId ? byId.get(item.luminaireId) : undefined
    const input = l ? { ...sizeInputOf(l, siteById.get(l.siteId), l.luminaireTypeId ? typeById.get(l.luminaireTypeId) : undefined), ...item.input } : item.input
    const outcome = runTool(sizeTool, input, { explain: batch.working })
    if (!outcome.ok) {
      const errors: ItemError[] = outcome.fields.map((f) => ({
        pointer: pointerOf(['items', index, 'input'], f.path),
        code: 'invalid_value',
        detail: f.message,
      }))
      return { ...head, status: 400, ok: false, errors }
    }
    return { ...head, status: 200, ok: true, result: outcome.result as unknown as Record<string, unknown> }
  })
  return { tool: 'size' as const, engineVersion: ENGINE_VERSION, count: results.length, failed: results.filter((r) => !r.ok).length, results }
}

type LuminaireBulk = z.output<typeof LuminaireBulkSchema>

/** The problems of an AppError as item errors under the item's `changes`. */
function appErrorsOf(err: AppError, index: number): ItemError[] {
  const prefix: Array<string | number> = ['items', index, 'changes']
  if (err.fields?.length) return err.fields.map((f) => ({ pointer: pointerOf(prefix, f.path), code: err.code, detail: f.message }))
  return [{ pointer: jsonPointer(['items', index]), code: err.code, detail: err.message }]
}

/**
 * Changes each luminaire on its own, in order, each in its own transaction with its own audit
 * event (as PATCH /api/luminaires/:id does): one item that cannot be done leaves the others done.
 */
export async function updateLuminaires(workspaceId: string, actorId: string, batch: LuminaireBulk) {
  const results = []
  for (const [index, item] of batch.items.entries()) {
    const head = { index, id: item.id, ...(item.ref !== undefined ? { ref: item.ref } : {}) }
    const parsed = LuminairePatchSchema.safeParse(item.changes)
    if (!parsed.success) {
      results.push({
        ...head,
        status: 400,
        ok: false,
        errors: parsed.error.issues.map((i) => ({ pointer: jsonPointer(['items', index, 'changes', ...i.path]), code: 'invalid_value', detail: i.message })),
      })
      continue
    }
    try {
      await checkReferences(workspaceId, referencesIn(LuminairePatchSchema, parsed.data))
      const luminaire = await updateLuminaire(workspaceId, actorId, item.id, parsed.data)
      results.push({ ...head, status: 200, ok: true, luminaire })
    } catch (err) {
      if (!(err instanceof AppError) || err.status >= 500) throw err
      results.push({ ...head, status: err.status, ok: false, errors: appErrorsOf(err, index) })
    }
  }
  return { count: results.length, failed: results.filter((r) => !r.ok).length, results }
}
