/** /api/photometry (LM-63 files), /api/luminaire-types (the catalogue) and /api/route-spacing (choosing a type for a route). */
import {
  LuminaireTypeAnswer,
  LuminaireTypeListAnswer,
  PhotometryFileAnswer,
  PhotometryFileListAnswer,
  PickAnswer,
  TypeSelectionAnswer,
} from '../../../shared/schemas/answers/photometry'
import type { Request, RequestHandler } from 'express'
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
import { IdParams } from '../../lib/parse'
import { defineRoute, scope, type RouteSpec } from '../../policy/access'
import * as service from './photometry.service'

const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: MAX_LM63_BYTES, files: 1, fields: 2 } })

/** A multipart upload must carry the file; a JSON body { name, text } is the alternative. */
const requireFile: RequestHandler = (req, _res, next) => {
  const file = (req as Request & { file?: Express.Multer.File }).file
  if (!file && req.is('multipart/form-data'))
    return next(new BadRequestError('Attach the LM-63 file in the form field "file".', [{ path: 'file', message: 'is required' }]))
  next()
}

/** The name of an uploaded file: the form field "name", else the file name without its extension. */
function uploadName(req: Request, file: Express.Multer.File): string | undefined {
  const field = (req.body as { name?: unknown } | undefined)?.name
  return typeof field === 'string' && field.trim() ? field.trim().slice(0, 120) : file.originalname.replace(/\.(ies|txt)$/i, '').slice(0, 120) || undefined
}

export const photometryRoutes: RouteSpec[] = [
  defineRoute({
    method: 'get',
    path: '/api/photometry',
    response: PhotometryFileListAnswer,
    access: 'viewer',
    summary: 'Photometric files of the workspace (newest first)',
    handler: async (_input, req) => ({ files: await service.listFiles(scope(req).workspaceId) }),
  }),
  defineRoute({
    method: 'post',
    path: '/api/photometry',
    response: PhotometryFileAnswer,
    access: 'designer',
    upload: true,
    summary: 'Upload an IES LM-63 or EULUMDAT (.ldt) file (multipart field "file", or JSON { name, text }); a malformed file is refused naming the line',
    before: [upload.single('file'), requireFile],
    body: PhotometryUploadSchema,
    status: 201,
    handler: ({ body, file }, req) => {
      const s = scope(req)
      if (file)
        return service.createFile(s.workspaceId, s.userId, uploadName(req, file), new TextDecoder('utf-8', { fatal: false }).decode(file.buffer), 'file')
      return service.createFile(s.workspaceId, s.userId, body!.name, body!.text, 'text')
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/photometry/:id',
    response: PhotometryFileAnswer,
    access: 'viewer',
    summary: 'A photometric file: its header, intensity table and text',
    params: IdParams,
    handler: ({ params }, req) => service.getFile(scope(req).workspaceId, params.id),
  }),
  defineRoute({
    method: 'delete',
    path: '/api/photometry/:id',
    access: 'designer',
    summary: 'Delete a photometric file (types that used it keep no photometry)',
    params: IdParams,
    produces: 'none',
    handler: async ({ params }, req, res) => {
      const s = scope(req)
      await service.deleteFile(s.workspaceId, s.userId, params.id)
      res.status(204).end()
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/luminaire-types',
    response: LuminaireTypeListAnswer,
    access: 'viewer',
    summary: "The workspace's luminaire types",
    handler: async (_input, req) => ({ types: await service.listTypes(scope(req).workspaceId) }),
  }),
  defineRoute({
    method: 'post',
    path: '/api/luminaire-types',
    response: LuminaireTypeAnswer,
    access: 'designer',
    summary: 'Add a luminaire type',
    body: LuminaireTypeSchema,
    status: 201,
    handler: ({ body }, req) => {
      const s = scope(req)
      return service.createType(s.workspaceId, s.userId, body)
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/luminaire-types/:id',
    response: LuminaireTypeAnswer,
    access: 'viewer',
    summary: 'One luminaire type',
    params: IdParams,
    handler: ({ params }, req) => service.getType(scope(req).workspaceId, params.id),
  }),
  defineRoute({
    method: 'patch',
    path: '/api/luminaire-types/:id',
    response: LuminaireTypeAnswer,
    access: 'designer',
    summary: 'Change a luminaire type',
    params: IdParams,
    body: LuminaireTypePatchSchema,
    handler: ({ params, body }, req) => {
      const s = scope(req)
      return service.updateType(s.workspaceId, s.userId, params.id, body)
    },
  }),
  defineRoute({
    method: 'delete',
    path: '/api/luminaire-types/:id',
    access: 'designer',
    summary: 'Delete a luminaire type (luminaires that named it keep their other data)',
    params: IdParams,
    produces: 'none',
    handler: async ({ params }, req, res) => {
      const s = scope(req)
      await service.deleteType(s.workspaceId, s.userId, params.id)
      res.status(204).end()
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/route-spacing/select',
    response: TypeSelectionAnswer,
    access: 'viewer',
    summary: 'Luminaire types for a route: count, spacing, standby power and pack of each',
    body: RouteNeedSchema,
    handler: ({ body }, req) => service.selectTypes(scope(req).workspaceId, body),
  }),
  defineRoute({
    method: 'post',
    path: '/api/route-spacing/pick',
    response: PickAnswer,
    access: 'designer',
    summary: 'Put a luminaire type that meets a route on a specification sheet (new draft, or a new revision)',
    body: PickSchema,
    handler: async ({ body }, req, res) => {
      const s = scope(req)
      const out = await service.pickIntoSheet(s.workspaceId, s.userId, body)
      res.status(body.sheetId ? 200 : 201)
      return out
    },
  }),
]
