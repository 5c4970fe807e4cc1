/** /api/sites, /api/areas, /api/luminaires, /api/tests: the site register and its test log book. */
import {
  AreaAnswer,
  ExportAnswer,
  ImportPreviewAnswer,
  ImportResultAnswer,
  LogBookAnswer,
  LogBookEntryAnswer,
  LuminaireAnswer,
  LuminaireDetailAnswer,
  RegisterOverviewAnswer,
  RegimeHistoryAnswer,
  RegisterSettingsAnswer,
  RoundSignOffAnswer,
  SiteAnswer,
  SiteStatusAnswer,
  TestBatchAnswer,
} from '../../../shared/schemas/answers/register'
import multer from 'multer'
import { z } from 'zod'
import { ImportRequestSchema, IsoDateSchema, LuminairePatchSchema, LuminaireSchema, PackReplacementSchema } from '../../../shared/schemas/luminaire.schema'
import { AreaPatchSchema, AreaSchema, RegisterSettingsPatchSchema, SitePatchSchema, SiteSchema } from '../../../shared/schemas/site.schema'
import { RecordedInErrorSchema, RoundSignOffSchema, TestBatchSchema } from '../../../shared/schemas/test-record.schema'
import { IdParams, Uuid } from '../../lib/parse'
import { defineRoute, scope, type RouteSpec } from '../../policy/access'
import { formatPrefsOf } from '../../lib/format-prefs'
import { EXPORT_FILES, exportFile } from './export.service'
import { commitImport, previewImport } from './import.service'
import { roundRecordPdf } from './round-record'
import { findPlan, listPlans, makePlan } from './test-plans.service'
import { workOrderPdf } from './work-order-pdf'
import { TestPlanRequestSchema } from '../../../shared/schemas/test-plan.schema'
import { TestPlanAnswer, TestPlanListAnswer } from '../../../shared/schemas/answers/test-plans'
import * as register from './register.service'
import * as areas from './areas.service'
import * as tests from './tests.service'
import { regimeHistory } from './regime-history.service'

// Schedules are small text files; 2 MB is far more than any building's register.
const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: 2 * 1024 * 1024, files: 1, fields: 4 } })

const DaysQuery = z.object({ days: z.coerce.number().int().min(1).max(366).default(60) })
const SiteExportParams = z.object({ id: Uuid, file: z.enum(EXPORT_FILES) })
const RoundParams = z.object({ id: Uuid, roundId: Uuid })
const PlanParams = z.object({ id: Uuid, planId: Uuid })
const ExportQuery = z
  .object({
    as: z.enum(['json'], { message: 'must be "json" or left out' }).optional(),
    /** The log book files only: first and last day of the tests to include. */
    from: IsoDateSchema.optional(),
    to: IsoDateSchema.optional(),
  })
  .refine((q) => !q.from || !q.to || q.from <= q.to, { path: ['to'], message: 'must not be before from' })

/** The CSV of an import: the uploaded file (field "file"), else the JSON body's `csv`. */
function csvOf(input: { file?: Express.Multer.File; body?: { csv: string } }): string {
  return input.file ? input.file.buffer.toString('utf8') : input.body!.csv
}

export const registerRoutes: RouteSpec[] = [
  // the workspace's log-book rules
  defineRoute({
    method: 'get',
    path: '/api/register/settings',
    response: RegisterSettingsAnswer,
    access: 'viewer',
    summary: "The workspace's log-book rules (repair window for retests)",
    handler: (_input, req) => register.registerSettings(scope(req).workspaceId),
  }),
  defineRoute({
    method: 'patch',
    path: '/api/register/settings',
    response: RegisterSettingsAnswer,
    access: 'owner',
    summary: "Change the workspace's log-book rules",
    body: RegisterSettingsPatchSchema,
    handler: ({ body }, req) => {
      const s = scope(req)
      return register.updateRegisterSettings(s.workspaceId, s.userId, body)
    },
  }),
  // sites
  defineRoute({
    method: 'get',
    path: '/api/sites',
    response: RegisterOverviewAnswer,
    access: 'viewer',
    summary: 'Sites with their due counts, and tests falling due soon',
    query: DaysQuery,
    handler: ({ query }, req) => register.overview(scope(req).workspaceId, query.days),
  }),
  defineRoute({
    method: 'post',
    path: '/api/sites',
    response: SiteAnswer,
    access: 'designer',
    summary: 'Add a site',
    body: SiteSchema,
    status: 201,
    handler: ({ body }, req) => {
      const s = scope(req)
      return register.createSite(s.workspaceId, s.userId, body)
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/sites/:id',
    response: SiteStatusAnswer,
    access: 'viewer',
    summary: 'A site with its areas, luminaires, due dates and pack forecast',
    params: IdParams,
    handler: ({ params }, req) => register.siteStatus(scope(req).workspaceId, params.id),
  }),
  defineRoute({
    method: 'patch',
    path: '/api/sites/:id',
    response: SiteAnswer,
    access: 'designer',
    summary: 'Change a site',
    params: IdParams,
    body: SitePatchSchema,
    handler: ({ params, body }, req) => {
      const s = scope(req)
      return register.updateSite(s.workspaceId, s.userId, params.id, body)
    },
  }),
  defineRoute({
    method: 'delete',
    path: '/api/sites/:id',
    access: 'designer',
    summary: 'Delete a site with its register and log book',
    params: IdParams,
    produces: 'none',
    handler: async ({ params }, req, res) => {
      const s = scope(req)
      await register.deleteSite(s.workspaceId, s.userId, params.id)
      res.status(204).end()
    },
  }),
  // areas
  defineRoute({
    method: 'post',
    path: '/api/sites/:id/areas',
    response: AreaAnswer,
    access: 'designer',
    summary: 'Add an area to a site',
    params: IdParams,
    body: AreaSchema,
    status: 201,
    handler: ({ params, body }, req) => {
      const s = scope(req)
      return areas.createArea(s.workspaceId, s.userId, params.id, body)
    },
  }),
  defineRoute({
    method: 'patch',
    path: '/api/areas/:id',
    response: AreaAnswer,
    access: 'designer',
    summary: 'Rename an area',
    params: IdParams,
    body: AreaPatchSchema,
    handler: ({ params, body }, req) => {
      const s = scope(req)
      return areas.updateArea(s.workspaceId, s.userId, params.id, body)
    },
  }),
  defineRoute({
    method: 'delete',
    path: '/api/areas/:id',
    access: 'designer',
    summary: 'Delete an area (its luminaires stay, without an area)',
    params: IdParams,
    produces: 'none',
    handler: async ({ params }, req, res) => {
      const s = scope(req)
      await areas.deleteArea(s.workspaceId, s.userId, params.id)
      res.status(204).end()
    },
  }),
  // luminaires
  defineRoute({
    method: 'post',
    path: '/api/sites/:id/luminaires',
    response: LuminaireAnswer,
    access: 'designer',
    summary: 'Add a luminaire to a site',
    params: IdParams,
    body: LuminaireSchema,
    status: 201,
    handler: ({ params, body }, req) => {
      const s = scope(req)
      return register.createLuminaire(s.workspaceId, s.userId, params.id, body)
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/luminaires/:id',
    response: LuminaireDetailAnswer,
    access: 'viewer',
    summary: 'A luminaire with its due dates and pack forecast',
    params: IdParams,
    handler: ({ params }, req) => register.luminaireDetail(scope(req).workspaceId, params.id),
  }),
  defineRoute({
    method: 'patch',
    path: '/api/luminaires/:id',
    response: LuminaireAnswer,
    access: 'designer',
    summary: 'Change a luminaire',
    params: IdParams,
    body: LuminairePatchSchema,
    handler: ({ params, body }, req) => {
      const s = scope(req)
      return register.updateLuminaire(s.workspaceId, s.userId, params.id, body)
    },
  }),
  defineRoute({
    method: 'delete',
    path: '/api/luminaires/:id',
    access: 'designer',
    summary: 'Remove a luminaire and its tests',
    params: IdParams,
    produces: 'none',
    handler: async ({ params }, req, res) => {
      const s = scope(req)
      await register.deleteLuminaire(s.workspaceId, s.userId, params.id)
      res.status(204).end()
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/luminaires/:id/pack',
    response: LuminaireAnswer,
    access: 'technician',
    summary: 'Record a new battery pack fitted to a luminaire',
    params: IdParams,
    body: PackReplacementSchema,
    handler: ({ params, body }, req) => {
      const s = scope(req)
      return register.replacePack(s.workspaceId, s.userId, params.id, body)
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/luminaires/:id/tests',
    response: LogBookAnswer,
    access: 'viewer',
    summary: "A luminaire's tests, newest first",
    params: IdParams,
    handler: async ({ params }, req) => ({ tests: await tests.luminaireLogBook(scope(req).workspaceId, params.id) }),
  }),
  // tests
  defineRoute({
    method: 'post',
    path: '/api/tests',
    response: TestBatchAnswer,
    access: 'technician',
    summary: 'Record tests (one or a round); retries with the same clientId never duplicate',
    body: TestBatchSchema,
    handler: async ({ body }, req, res) => {
      const s = scope(req)
      const saved = await tests.recordTests(s.workspaceId, s.userId, body.records)
      res.status(saved.some((r) => r.outcome === 'created') ? 201 : 200)
      return { records: saved }
    },
  }),
  defineRoute({
    method: 'delete',
    path: '/api/tests/:id',
    access: 'designer',
    summary: 'Remove a test recorded in error (kept in the audit trail)',
    params: IdParams,
    produces: 'none',
    handler: async ({ params }, req, res) => {
      const s = scope(req)
      await tests.deleteTest(s.workspaceId, s.userId, params.id)
      res.status(204).end()
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/tests/:id/recorded-in-error',
    access: 'technician',
    summary: 'Mark a test as recorded in error: kept in the log book struck through, left out of the state',
    params: IdParams,
    body: RecordedInErrorSchema,
    response: LogBookEntryAnswer,
    handler: ({ params, body }, req) => {
      const s = scope(req)
      return tests.markRecordedInError(s.workspaceId, s.userId, params.id, body.reason)
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/sites/:id/regime-history',
    access: 'viewer',
    summary: "A site's testing regimes over time, oldest first",
    params: IdParams,
    response: RegimeHistoryAnswer,
    handler: async ({ params }, req) => {
      const workspaceId = scope(req).workspaceId
      await register.findSite(workspaceId, params.id)
      return { changes: await regimeHistory(workspaceId, params.id) }
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/sites/:id/tests',
    response: LogBookAnswer,
    access: 'viewer',
    summary: "A site's log book, newest first",
    params: IdParams,
    handler: async ({ params }, req) => {
      const workspaceId = scope(req).workspaceId
      return { tests: await tests.siteLogBook(workspaceId, params.id), packChanges: await tests.sitePackChanges(workspaceId, params.id) }
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/sites/:id/rounds',
    access: 'technician',
    summary: 'Sign off a round by name and date; answers with the failures recorded on it',
    params: IdParams,
    body: RoundSignOffSchema,
    response: RoundSignOffAnswer,
    handler: async ({ params, body }, req, res) => {
      const s = scope(req)
      const out = await tests.signOffRound(s.workspaceId, s.userId, params.id, body)
      res.status(out.created ? 201 : 200)
      return out
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/sites/:id/rounds/:roundId/record.pdf',
    access: 'viewer',
    summary: 'The printable record of a signed-off round (PDF)',
    params: RoundParams,
    produces: 'application/pdf',
    notFound: 'That round',
    handler: async ({ params }, req, res) => {
      const out = await roundRecordPdf(scope(req).workspaceId, params.id, params.roundId, formatPrefsOf(req))
      res.setHeader('Content-Type', 'application/pdf')
      res.setHeader('Content-Disposition', `attachment; filename="${out.filename}"`)
      res.setHeader('Cache-Control', 'private, no-store')
      res.send(out.body)
    },
  }),
  // planning the full-duration tests
  defineRoute({
    method: 'post',
    path: '/api/sites/:id/test-plans',
    access: 'designer',
    summary: "Plan a site's full-duration tests in groups that leave no area dark",
    params: IdParams,
    body: TestPlanRequestSchema,
    response: TestPlanAnswer,
    status: 201,
    handler: ({ params, body }, req) => {
      const s = scope(req)
      return makePlan(s.workspaceId, s.userId, params.id, body)
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/sites/:id/test-plans',
    access: 'viewer',
    summary: "A site's test plans, newest first",
    params: IdParams,
    response: TestPlanListAnswer,
    handler: async ({ params }, req) => ({ plans: await listPlans(scope(req).workspaceId, params.id) }),
  }),
  defineRoute({
    method: 'get',
    path: '/api/sites/:id/test-plans/:planId',
    access: 'viewer',
    summary: 'One test plan with its groups and times',
    params: PlanParams,
    response: TestPlanAnswer,
    notFound: 'That test plan',
    handler: ({ params }, req) => findPlan(scope(req).workspaceId, params.id, params.planId),
  }),
  defineRoute({
    method: 'get',
    path: '/api/sites/:id/test-plans/:planId/work-order.pdf',
    access: 'viewer',
    summary: 'A test plan printed as a work order (PDF)',
    params: PlanParams,
    produces: 'application/pdf',
    notFound: 'That test plan',
    handler: async ({ params }, req, res) => {
      const out = await workOrderPdf(scope(req).workspaceId, params.id, params.planId, formatPrefsOf(req))
      res.setHeader('Content-Type', 'application/pdf')
      res.setHeader('Content-Disposition', `attachment; filename="${out.filename}"`)
      res.setHeader('Cache-Control', 'private, no-store')
      res.send(out.body)
    },
  }),
  // import and export
  defineRoute({
    method: 'post',
    path: '/api/sites/:id/import/preview',
    response: ImportPreviewAnswer,
    access: 'designer',
    summary: 'Check a luminaire schedule (CSV) row by row without storing it',
    upload: true,
    before: [upload.single('file')],
    params: IdParams,
    body: ImportRequestSchema,
    handler: (input, req) => previewImport(scope(req).workspaceId, input.params.id, csvOf(input)),
  }),
  defineRoute({
    method: 'post',
    path: '/api/sites/:id/import',
    response: ImportResultAnswer,
    access: 'designer',
    summary: 'Import a luminaire schedule (CSV): every row or none; runs again safely (rows match by external_id, else tag, and update)',
    upload: true,
    before: [upload.single('file')],
    params: IdParams,
    body: ImportRequestSchema,
    status: 201,
    handler: async (input, req, res) => {
      const s = scope(req)
      const out = await commitImport(s.workspaceId, s.userId, input.params.id, csvOf(input))
      // 201 when the import added a luminaire; 200 when it only updated or found nothing to change.
      if (!out.imported) res.status(200)
      return out
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/sites/:id/export/:file',
    response: ExportAnswer,
    access: 'viewer',
    summary: 'Download the register or log book as CSV or PDF (?as=json wraps it in JSON; from/to limit the log book to those days)',
    params: SiteExportParams,
    query: ExportQuery,
    notFound: (raw) => ((EXPORT_FILES as readonly string[]).includes(raw.file ?? '') ? 'That record' : `The export "${raw.file}"`),
    handler: async ({ params, query }, req, res) => {
      const out = await exportFile(scope(req).workspaceId, params.id, params.file, formatPrefsOf(req), { from: query.from, to: query.to })
      if (query.as === 'json') {
        const text = out.mediaType.startsWith('text/')
        return {
          filename: out.filename,
          mediaType: out.mediaType,
          encoding: text ? ('utf8' as const) : ('base64' as const),
          content: out.body.toString(text ? 'utf8' : 'base64'),
        }
      }
      res.setHeader('Content-Type', out.mediaType)
      res.setHeader('Content-Disposition', `attachment; filename="${out.filename}"`)
      res.setHeader('X-Content-Type-Options', 'nosniff')
      res.send(out.body)
    },
  }),
]
