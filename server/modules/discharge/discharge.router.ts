/** /api/discharge: upload a logged duration test, map its columns, analyse, save, list, compare. */
import { AnalyseAnswer, LogComparisonAnswer, LogListAnswer, SavedLogAnswer, UploadPreviewAnswer } from '../../../shared/schemas/answers/discharge'
import fs from 'node:fs'
import type { NextFunction, Request, Response } from 'express'
import multer from 'multer'
import {
  DischargeAnalyseSchema,
  DischargeCompareQuerySchema,
  DischargeListQuerySchema,
  DischargeTextUploadSchema,
  MAX_LOG_BYTES,
} from '../../../shared/schemas/discharge-log.schema'
import { AppError } from '../../errors/app-error'
import { IdParams } from '../../lib/parse'
import { defineRoute, scope, type RouteSpec } from '../../policy/access'
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
      next(
        new AppError(
          413,
          'too_large',
          `The file is larger than ${LIMIT_MB} MB, the most a discharge log may be. Log less often (every few seconds is plenty for a 3 h test) or split the file.`,
          [{ path: 'file', message: `is larger than ${LIMIT_MB} MB` }],
        ),
      )
      return
    }
    next(err as Error | undefined)
  })
}

const WHAT = 'That discharge log'

// Technicians run duration tests, so they upload and save logs; removing one (it may back a test
// record or an issued sheet) is left to designers, like the other records a sheet rests on.
export const dischargeRoutes: RouteSpec[] = [
  defineRoute({
    method: 'post',
    path: '/api/discharge/uploads',
    response: UploadPreviewAnswer,
    access: 'technician',
    upload: true,
    tags: ['discharge'],
    summary: `Upload a discharge log (CSV or TSV, multipart field "file", at most ${LIMIT_MB} MB; or JSON { name, text }): staged, answered with a preview and column guesses`,
    before: [receive],
    body: DischargeTextUploadSchema,
    status: 201,
    handler: ({ body, file }, req) => {
      const s = scope(req)
      if (file) return service.stageUpload(s.workspaceId, s.userId, file.path, file.originalname)
      const staged = service.newStagingPath()
      fs.writeFileSync(staged.file, body!.text)
      return service.stageUpload(s.workspaceId, s.userId, staged.file, body!.name)
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/discharge/logs',
    response: AnalyseAnswer,
    access: 'technician',
    body: DischargeAnalyseSchema,
    tags: ['discharge'],
    summary: 'Analyse an upload (or a stored file) with a column mapping; dryRun answers without storing, otherwise the file and the log are saved',
    handler: async ({ body }, req, res) => {
      const s = scope(req)
      const out = await service.analyseAndMaybeSave(s.workspaceId, s.userId, body)
      res.status(out.saved ? 201 : 200)
      return out
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/discharge/logs',
    response: LogListAnswer,
    access: 'viewer',
    query: DischargeListQuerySchema,
    tags: ['discharge'],
    summary: 'Discharge logs, newest first (by sheet, test record or luminaire)',
    handler: ({ query }, req) => service.listLogs(scope(req).workspaceId, query),
  }),
  defineRoute({
    method: 'get',
    path: '/api/discharge/logs/:id',
    response: SavedLogAnswer,
    access: 'viewer',
    tags: ['discharge'],
    summary: 'One discharge log with its summary, working and down-sampled curve',
    params: IdParams,
    notFound: WHAT,
    handler: ({ params }, req) => service.getLog(scope(req).workspaceId, params.id),
  }),
  defineRoute({
    method: 'delete',
    path: '/api/discharge/logs/:id',
    access: 'designer',
    tags: ['discharge'],
    summary: 'Delete a discharge log (its file goes with its last log; the trail keeps a record)',
    params: IdParams,
    notFound: WHAT,
    produces: 'none',
    handler: async ({ params }, req, res) => {
      const s = scope(req)
      await service.deleteLog(s.workspaceId, s.userId, params.id)
      res.status(204).end()
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/discharge/compare',
    response: LogComparisonAnswer,
    access: 'viewer',
    tags: ['discharge'],
    summary: 'Two discharge logs side by side (?a=&b=), with the change from a to b',
    // Ids that are not ids read like missing logs.
    query: DischargeCompareQuerySchema,
    invalid: { query: 404 },
    notFound: WHAT,
    handler: ({ query }, req) => service.compareLogs(scope(req).workspaceId, query.a, query.b),
  }),
]
