/** /api/photometry (LM-63 files), /api/luminaire-types (the catalogue) and /api/route-spacing (choosing a type for a route). */
import type { Request, Response } from 'express'
import multer from 'multer'
import {
  LuminaireTypePatchSchema,
  LuminaireTypeSchema,
  MAX_LM63_BYTES,
  PhotometryUploadSchema,
  PickSchema,
  RouteNeedSchema,
} from '../../../shared/schemas/photometry.schema'
import { BadRequestError } from '../../errors/app-error'
import { idParam, parse } from '../../lib/parse'
import { scope, type RouteSpec } from '../../policy/access'
import * as service from './photometry.service'


const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: MAX_LM63_BYTES, files: 1, fields: 2 } })

/** The file from a multipart upload (field "file", optional field "name") or a JSON body { name, text }. */
function uploadFrom(req: Request): { name?: string; text: string; field: string } {
  const file = (req as Request & { file?: Express.Multer.File }).file
  if (file) {
    const text = new TextDecoder('utf-8', { fatal: false }).decode(file.buffer)
    const name = typeof req.body?.name === 'string' && req.body.name.trim() ? req.body.name.trim().slice(0, 120) : file.originalname.replace(/\.(ies|txt)$/i, '').slice(0, 120) || undefined
    return { name, text, field: 'file' }
  }
  if (req.is('multipart/form-data')) throw new BadRequestError('Attach the LM-63 file in the form field "file".', [{ path: 'file', message: 'is required' }])
  const body = parse(PhotometryUploadSchema, req.body)
  return { name: body.name, text: body.text, field: 'text' }
}

export const photometryRoutes: RouteSpec[] = [
  {
    method: 'get', path: '/api/photometry', access: 'viewer', summary: 'Photometric files of the workspace (newest first)',
    handler: async (req: Request, res: Response) => {
      res.json({ files: await service.listFiles(scope(req).workspaceId) })
    },
  },
  {
    method: 'post', path: '/api/photometry', access: 'designer', upload: true,
    summary: 'Upload an IES LM-63 file (multipart field "file", or JSON { name, text }); a malformed file is refused naming the line',
    handler: [upload.single('file'), async (req: Request, res: Response) => {
      const s = scope(req)
      const u = uploadFrom(req)
      res.status(201).json(await service.createFile(s.workspaceId, s.userId, u.name, u.text, u.field))
    }],
  },
  {
    method: 'get', path: '/api/photometry/:id', access: 'viewer', summary: 'A photometric file: its header, intensity table and text',
    handler: async (req, res) => {
      res.json(await service.getFile(scope(req).workspaceId, idParam(req)))
    },
  },
  {
    method: 'delete', path: '/api/photometry/:id', access: 'designer', summary: 'Delete a photometric file (types that used it keep no photometry)',
    handler: async (req, res) => {
      const s = scope(req)
      await service.deleteFile(s.workspaceId, s.userId, idParam(req))
      res.status(204).end()
    },
  },
  {
    method: 'get', path: '/api/luminaire-types', access: 'viewer', summary: "The workspace's luminaire types",
    handler: async (req, res) => {
      res.json({ types: await service.listTypes(scope(req).workspaceId) })
    },
  },
  {
    method: 'post', path: '/api/luminaire-types', access: 'designer', summary: 'Add a luminaire type', body: LuminaireTypeSchema,
    handler: async (req, res) => {
      const s = scope(req)
      res.status(201).json(await service.createType(s.workspaceId, s.userId, parse(LuminaireTypeSchema, req.body)))
    },
  },
  {
    method: 'get', path: '/api/luminaire-types/:id', access: 'viewer', summary: 'One luminaire type',
    handler: async (req, res) => {
      res.json(await service.getType(scope(req).workspaceId, idParam(req)))
    },
  },
  {
    method: 'patch', path: '/api/luminaire-types/:id', access: 'designer', summary: 'Change a luminaire type', body: LuminaireTypePatchSchema,
    handler: async (req, res) => {
      const s = scope(req)
      const id = idParam(req)
      res.json(await service.updateType(s.workspaceId, s.userId, id, parse(LuminaireTypePatchSchema, req.body)))
    },
  },
  {
    method: 'delete', path: '/api/luminaire-types/:id', access: 'designer', summary: 'Delete a luminaire type (luminaires that named it keep their other data)',
    handler: async (req, res) => {
      const s = scope(req)
      await service.deleteType(s.workspaceId, s.userId, idParam(req))
      res.status(204).end()
    },
  },
  {
    method: 'post', path: '/api/route-spacing/select', access: 'viewer', summary: 'Luminaire types for a route: count, spacing, standby power and pack of each', body: RouteNeedSchema,
    handler: async (req, res) => {
      res.json(await service.selectTypes(scope(req).workspaceId, parse(RouteNeedSchema, req.body)))
    },
  },
  {
    method: 'post', path: '/api/route-spacing/pick', access: 'designer', summary: 'Put a luminaire type that meets a route on a specification sheet (new draft, or a new revision)', body: PickSchema,
    handler: async (req, res) => {
      const s = scope(req)
      const input = parse(PickSchema, req.body)
      const out = await service.pickIntoSheet(s.workspaceId, s.userId, input)
      res.status(input.sheetId ? 200 : 201).json(out)
    },
  },
]
