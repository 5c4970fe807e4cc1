/** /api/discharge: upload a logged duration test, map its columns, analyse, save, list, compare. */
import fs from 'node:fs'
import type { NextFunction, Request, Response } from 'express'
import multer from 'multer'
import { DischargeAnalyseSchema, DischargeCompareQuerySchema, DischargeListQuerySchema, DischargeTextUploadSchema, MAX_LOG_BYTES } from '../../../shared/schemas/discharge-log.schema'
import { AppError, NotFoundError } from '../../errors/app-error'
import { idParam, parse } from '../../lib/parse'
import { scope, type RouteSpec } from '../../policy/access'
import { assertRoomFor } from '../storage/storage.service'
import * as service from './discharge.service'


// Straight to the staging folder on disk: a 50 MB log never sits in memory whole.
const upload = multer({
  storage: multer.diskStorage({
    destination: (_req, _file, cb) => cb(null, service.stagingDir()),
    filename: (_req, _file, cb) => cb(null, `${service.newStagingPath().uploadId}.upload`),
  }),
  limits: { fileSize: MAX_LOG_BYTES, files: 1, fields: 4, parts: 5 },
})

const LIMIT_MB = Math.round(MAX_LOG_BYTES / (1024 * 1024))

/** Room for the body the client announces, checked before a byte of it is read (the exact size is checked again once it is on disk). */
async function roomFirst(req: Request) {
  const announced = Number(req.headers['content-length'] ?? 0)
  // A multipart envelope adds well under 64 KB to the file itself.
  const fileAtLeast = Number.isFinite(announced) ? Math.max(0, Math.min(announced, MAX_LOG_BYTES) - 64 * 1024) : 0
  await assertRoomFor(scope(req).workspaceId, fileAtLeast)
}

async function receive(req: Request, res: Response, next: NextFunction) {
  try {
    await roomFirst(req)
  } catch (err) {
    // Answer without reading the body; close the connection so the client stops sending it.
    res.setHeader('Connection', 'close')
    next(err)
    return
  }
  upload.single('file')(req, res, (err: unknown) => {
    if ((err as { code?: string } | undefined)?.code === 'LIMIT_FILE_SIZE') {
      next(new AppError(413, 'too_large', `The file is larger than ${LIMIT_MB} MB, the most a discharge log may be. Log less often (every few seconds is plenty for a 3 h test) or split the file.`, [{ path: 'file', message: `is larger than ${LIMIT_MB} MB` }]))
      return
    }
    next(err as Error | undefined)
  })
}

async function uploadLog(req: Request, res: Response) {
  const s = scope(req)
  const file = (req as Request & { file?: Express.Multer.File }).file
  if (file) {
    res.status(201).json(await service.stageUpload(s.workspaceId, s.userId, file.path, file.originalname))
    return
  }
  const body = parse(DischargeTextUploadSchema, req.body)
  const staged = service.newStagingPath()
  fs.writeFileSync(staged.file, body.text)
  res.status(201).json(await service.stageUpload(s.workspaceId, s.userId, staged.file, body.name))
}

async function analyse(req: Request, res: Response) {
  const s = scope(req)
  const body = parse(DischargeAnalyseSchema, req.body)
  const out = await service.analyseAndMaybeSave(s.workspaceId, s.userId, body)
  res.status(out.saved ? 201 : 200).json(out)
}

async function list(req: Request, res: Response) {
  res.json(await service.listLogs(scope(req).workspaceId, parse(DischargeListQuerySchema, req.query)))
}

async function read(req: Request, res: Response) {
  res.json(await service.getLog(scope(req).workspaceId, idParam(req, 'That discharge log')))
}

async function remove(req: Request, res: Response) {
  const s = scope(req)
  await service.deleteLog(s.workspaceId, s.userId, idParam(req, 'That discharge log'))
  res.status(204).end()
}

async function compare(req: Request, res: Response) {
  const q = DischargeCompareQuerySchema.safeParse(req.query)
  // Ids that are not ids read like missing logs.
  if (!q.success) throw new NotFoundError('That discharge log')
  res.json(await service.compareLogs(scope(req).workspaceId, q.data.a, q.data.b))
}

// Technicians run duration tests, so they upload and save logs; removing one (it may back a test
// record or an issued sheet) is left to designers, like the other records a sheet rests on.
export const dischargeRoutes: RouteSpec[] = [
  {
    method: 'post', path: '/api/discharge/uploads', access: 'technician', upload: true, tags: ['discharge'],
    summary: `Upload a discharge log (CSV or TSV, multipart field "file", at most ${LIMIT_MB} MB; or JSON { name, text }): staged, answered with a preview and column guesses`,
    handler: [receive, uploadLog],
  },
  {
    method: 'post', path: '/api/discharge/logs', access: 'technician', body: DischargeAnalyseSchema, tags: ['discharge'],
    summary: 'Analyse an upload (or a stored file) with a column mapping; dryRun answers without storing, otherwise the file and the log are saved',
    handler: analyse,
  },
  { method: 'get', path: '/api/discharge/logs', access: 'viewer', query: DischargeListQuerySchema, tags: ['discharge'], summary: 'Discharge logs, newest first (by sheet, test record or luminaire)', handler: list },
  { method: 'get', path: '/api/discharge/logs/:id', access: 'viewer', tags: ['discharge'], summary: 'One discharge log with its summary, working and down-sampled curve', handler: read },
  { method: 'delete', path: '/api/discharge/logs/:id', access: 'designer', tags: ['discharge'], summary: 'Delete a discharge log (its file goes with its last log; the trail keeps a record)', handler: remove },
  { method: 'get', path: '/api/discharge/compare', access: 'viewer', query: DischargeCompareQuerySchema, tags: ['discharge'], summary: 'Two discharge logs side by side (?a=&b=), with the change from a to b', handler: compare },
]
