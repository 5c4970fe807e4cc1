/** /api/sites, /api/areas, /api/luminaires, /api/tests: the site register and its test log book. */
import type { Request, Response } from 'express'
import multer from 'multer'
import { z } from 'zod'
import { ImportRequestSchema, LuminairePatchSchema, LuminaireSchema, PackReplacementSchema } from '../../../shared/schemas/luminaire.schema'
import { AreaPatchSchema, AreaSchema, SitePatchSchema, SiteSchema } from '../../../shared/schemas/site.schema'
import { TestBatchSchema } from '../../../shared/schemas/test-record.schema'
import { BadRequestError, NotFoundError } from '../../errors/app-error'
import { idParam, parse } from '../../lib/parse'
import { scope, type RouteSpec } from '../../policy/access'
import { formatPrefsOf } from '../../lib/format-prefs'
import { EXPORT_FILES, exportFile, type ExportFile } from './export.service'
import { commitImport, previewImport } from './import.service'
import * as register from './register.service'
import * as tests from './tests.service'


// Schedules are small text files; 2 MB is far more than any building's register.
const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: 2 * 1024 * 1024, files: 1, fields: 4 } })

/** The CSV from a multipart upload (field "file") or a JSON body { csv }. */
function csvFrom(req: Request): string {
  const file = (req as Request & { file?: Express.Multer.File }).file
  if (file) return file.buffer.toString('utf8')
  return parse(ImportRequestSchema, req.body).csv
}

const DaysQuery = z.object({ days: z.coerce.number().int().min(1).max(366).default(60) })

export const registerRoutes: RouteSpec[] = [
  // sites
  {
    method: 'get', path: '/api/sites', access: 'viewer', summary: 'Sites with their due counts, and tests falling due soon',
    handler: async (req: Request, res: Response) => {
      const { days } = parse(DaysQuery, req.query)
      res.json(await register.overview(scope(req).workspaceId, days))
    },
  },
  {
    method: 'post', path: '/api/sites', access: 'designer', summary: 'Add a site',
    handler: async (req, res) => {
      const s = scope(req)
      res.status(201).json(await register.createSite(s.workspaceId, s.userId, parse(SiteSchema, req.body)))
    },
  },
  {
    method: 'get', path: '/api/sites/:id', access: 'viewer', summary: 'A site with its areas, luminaires, due dates and pack forecast',
    handler: async (req, res) => {
      res.json(await register.siteStatus(scope(req).workspaceId, idParam(req)))
    },
  },
  {
    method: 'patch', path: '/api/sites/:id', access: 'designer', summary: 'Change a site',
    handler: async (req, res) => {
      const s = scope(req)
      res.json(await register.updateSite(s.workspaceId, s.userId, idParam(req), parse(SitePatchSchema, req.body)))
    },
  },
  {
    method: 'delete', path: '/api/sites/:id', access: 'designer', summary: 'Delete a site with its register and log book',
    handler: async (req, res) => {
      const s = scope(req)
      await register.deleteSite(s.workspaceId, s.userId, idParam(req))
      res.status(204).end()
    },
  },
  // areas
  {
    method: 'post', path: '/api/sites/:id/areas', access: 'designer', summary: 'Add an area to a site',
    handler: async (req, res) => {
      const s = scope(req)
      res.status(201).json(await register.createArea(s.workspaceId, s.userId, idParam(req), parse(AreaSchema, req.body)))
    },
  },
  {
    method: 'patch', path: '/api/areas/:id', access: 'designer', summary: 'Rename an area',
    handler: async (req, res) => {
      const s = scope(req)
      res.json(await register.updateArea(s.workspaceId, s.userId, idParam(req), parse(AreaPatchSchema, req.body)))
    },
  },
  {
    method: 'delete', path: '/api/areas/:id', access: 'designer', summary: 'Delete an area (its luminaires stay, without an area)',
    handler: async (req, res) => {
      const s = scope(req)
      await register.deleteArea(s.workspaceId, s.userId, idParam(req))
      res.status(204).end()
    },
  },
  // luminaires
  {
    method: 'post', path: '/api/sites/:id/luminaires', access: 'designer', summary: 'Add a luminaire to a site',
    handler: async (req, res) => {
      const s = scope(req)
      res.status(201).json(await register.createLuminaire(s.workspaceId, s.userId, idParam(req), parse(LuminaireSchema, req.body)))
    },
  },
  {
    method: 'get', path: '/api/luminaires/:id', access: 'viewer', summary: 'A luminaire with its due dates and pack forecast',
    handler: async (req, res) => {
      res.json(await register.luminaireDetail(scope(req).workspaceId, idParam(req)))
    },
  },
  {
    method: 'patch', path: '/api/luminaires/:id', access: 'designer', summary: 'Change a luminaire',
    handler: async (req, res) => {
      const s = scope(req)
      res.json(await register.updateLuminaire(s.workspaceId, s.userId, idParam(req), parse(LuminairePatchSchema, req.body)))
    },
  },
  {
    method: 'delete', path: '/api/luminaires/:id', access: 'designer', summary: 'Remove a luminaire and its tests',
    handler: async (req, res) => {
      const s = scope(req)
      await register.deleteLuminaire(s.workspaceId, s.userId, idParam(req))
      res.status(204).end()
    },
  },
  {
    method: 'post', path: '/api/luminaires/:id/pack', access: 'technician', summary: 'Record a new battery pack fitted to a luminaire',
    handler: async (req, res) => {
      const s = scope(req)
      res.json(await register.replacePack(s.workspaceId, s.userId, idParam(req), parse(PackReplacementSchema, req.body)))
    },
  },
  {
    method: 'get', path: '/api/luminaires/:id/tests', access: 'viewer', summary: "A luminaire's tests, newest first",
    handler: async (req, res) => {
      res.json({ tests: await tests.luminaireLogBook(scope(req).workspaceId, idParam(req)) })
    },
  },
  // tests
  {
    method: 'post', path: '/api/tests', access: 'technician', summary: 'Record tests (one or a round); retries with the same clientId never duplicate',
    handler: async (req, res) => {
      const s = scope(req)
      const { records } = parse(TestBatchSchema, req.body)
      const saved = await tests.recordTests(s.workspaceId, s.userId, records)
      res.status(saved.some((r) => r.outcome === 'created') ? 201 : 200).json({ records: saved })
    },
  },
  {
    method: 'delete', path: '/api/tests/:id', access: 'designer', summary: 'Remove a test recorded in error (kept in the audit trail)',
    handler: async (req, res) => {
      const s = scope(req)
      await tests.deleteTest(s.workspaceId, s.userId, idParam(req))
      res.status(204).end()
    },
  },
  {
    method: 'get', path: '/api/sites/:id/tests', access: 'viewer', summary: "A site's log book, newest first",
    handler: async (req, res) => {
      res.json({ tests: await tests.siteLogBook(scope(req).workspaceId, idParam(req)) })
    },
  },
  // import and export
  {
    method: 'post', path: '/api/sites/:id/import/preview', access: 'designer', summary: 'Check a luminaire schedule (CSV) row by row without storing it',
    handler: [upload.single('file'), async (req, res) => {
      res.json(await previewImport(scope(req).workspaceId, idParam(req), csvFrom(req)))
    }],
  },
  {
    method: 'post', path: '/api/sites/:id/import', access: 'designer', summary: 'Import a luminaire schedule (CSV): every row or none',
    handler: [upload.single('file'), async (req, res) => {
      const s = scope(req)
      res.status(201).json(await commitImport(s.workspaceId, s.userId, idParam(req), csvFrom(req)))
    }],
  },
  {
    method: 'get', path: '/api/sites/:id/export/:file', access: 'viewer', summary: 'Download the register or log book as CSV or PDF (?as=json wraps it in JSON)',
    handler: async (req, res) => {
      const file = String(req.params.file) as ExportFile
      if (!EXPORT_FILES.includes(file)) throw new NotFoundError(`The export "${file}"`)
      const as = req.query.as
      if (as !== undefined && as !== 'json') throw new BadRequestError('as must be "json" or left out.', [{ path: 'as', message: 'must be "json" or left out' }])
      const out = await exportFile(scope(req).workspaceId, idParam(req), file, formatPrefsOf(req))
      if (as === 'json') {
        const text = out.mediaType.startsWith('text/')
        res.json({ filename: out.filename, mediaType: out.mediaType, encoding: text ? 'utf8' : 'base64', content: out.body.toString(text ? 'utf8' : 'base64') })
        return
      }
      res.setHeader('Content-Type', out.mediaType)
      res.setHeader('Content-Disposition', `attachment; filename="${out.filename}"`)
      res.setHeader('X-Content-Type-Options', 'nosniff')
      res.send(out.body)
    },
  },
]
