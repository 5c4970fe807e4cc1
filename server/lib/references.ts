/**
 * Every id a request body names (fields made with `referenceId` in shared/schemas) must be a record
 * of the caller's workspace. Checked once, before the handler, for every route that declares its
 * body: another workspace's id and an id that exists nowhere both answer 404 naming the field, so
 * a foreign id can neither be linked nor probed, and a made-up one never reaches a foreign key.
 */
import type { NextFunction, Request, RequestHandler, Response } from 'express'
import type { EntityManager } from 'typeorm'
import type { ZodTypeAny } from 'zod'
import { idFieldsOf, referencesIn, type ReferenceInValue, type ReferenceKind } from '../../shared/schemas/reference'
import { dataSource } from '../data-source'
import { AppError } from '../errors/app-error'

/** Where each kind lives and what people call it; every one of these tables has workspace_id. */
export const REFERENCE_TABLES: Record<ReferenceKind, { table: string; what: string; hint?: string }> = {
  site: { table: 'sites', what: 'site' },
  area: { table: 'areas', what: 'area' },
  luminaire: { table: 'luminaires', what: 'luminaire' },
  testRecord: { table: 'test_records', what: 'test record' },
  specSheet: { table: 'spec_sheets', what: 'specification sheet' },
  luminaireType: { table: 'luminaire_types', what: 'luminaire type' },
  photometricFile: { table: 'photometric_files', what: 'photometric file' },
  dischargeLog: { table: 'discharge_logs', what: 'discharge log' },
  dischargeFile: { table: 'discharge_files', what: 'stored log file' },
  stagedUpload: { table: 'staged_uploads', what: 'upload', hint: 'uploads wait an hour to be saved; upload the file again' },
  wattageAudit: { table: 'wattage_audits', what: 'wattage audit' },
}

/** Extra condition per kind (e.g. staged uploads count only until they expire). */
const STILL_VALID: Partial<Record<ReferenceKind, string>> = {
  stagedUpload: 'expires_at > now()',
}

export class ReferenceNotFoundError extends AppError {
  constructor(missing: ReferenceInValue[]) {
    const first = REFERENCE_TABLES[missing[0].kind]
    super(
      404,
      'not_found',
      missing.length === 1
        ? `That ${first.what} (${missing[0].path}) was not found in this workspace${first.hint ? ` (${first.hint})` : ''}.`
        : `${missing.length} of the records this names were not found in this workspace: ${missing.map((m) => m.path).join(', ')}.`,
      missing.map((m) => ({
        path: m.path,
        message: `is not ${/^[aeiou]/.test(REFERENCE_TABLES[m.kind].what) ? 'an' : 'a'} ${REFERENCE_TABLES[m.kind].what} of this workspace`,
      })),
    )
  }
}

/** Throws a 404 naming every reference that is not a record of the workspace. One query per kind. */
export async function checkReferences(workspaceId: string, refs: ReferenceInValue[], m: EntityManager = dataSource.manager): Promise<void> {
  if (!refs.length) return
  const byKind = new Map<ReferenceKind, ReferenceInValue[]>()
  for (const r of refs) byKind.set(r.kind, [...(byKind.get(r.kind) ?? []), r])
  const missing: ReferenceInValue[] = []
  for (const [kind, list] of byKind) {
    const { table } = REFERENCE_TABLES[kind]
    const extra = STILL_VALID[kind] ? ` AND ${STILL_VALID[kind]}` : ''
    const ids = [...new Set(list.map((r) => r.id))]
    const found: Array<{ id: string }> = await m.query(`SELECT id FROM ${table} WHERE workspace_id = $1 AND id = ANY($2::uuid[])${extra}`, [workspaceId, ids])
    const have = new Set(found.map((f) => f.id))
    missing.push(...list.filter((r) => !have.has(r.id)))
  }
  if (missing.length) throw new ReferenceNotFoundError(missing)
}

/**
 * Middleware for a route's body schema, or null when the schema names no record. It runs after the
 * route's validation (server/policy/route.ts), so `req.body` is the parsed body; routes without a
 * workspace (signed-in only) have nothing to check against.
 */
export function referenceCheck(schema: ZodTypeAny | undefined): RequestHandler | null {
  if (!schema || !idFieldsOf(schema).some((f) => f.kind !== null)) return null
  return (req: Request, _res: Response, next: NextFunction) => {
    const workspaceId = req.ctx?.workspaceId
    if (!workspaceId) return next()
    checkReferences(workspaceId, referencesIn(schema, req.body)).then(() => next(), next)
  }
}
