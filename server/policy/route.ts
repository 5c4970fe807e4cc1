/**
 * The contract of one /api route: who may call it, the zod schemas of its path parameters, query
 * string and JSON body, and the shape of its answer. `validateRequest` checks the three request
 * parts before the handler runs, so a handler only ever sees typed, parsed values; the OpenAPI
 * document, the fuzzer and the access-control tests read the same declarations.
 */
import type { NextFunction, Request, RequestHandler, Response } from 'express'
import { z, type ZodError, type ZodTypeAny } from 'zod'
import type { Role } from '../../shared/schemas/roles'
import type { TokenScope } from '../../shared/schemas/token.schema'
import { strictSchema } from '../../shared/lib/strict-schema'
import { AppError, NotFoundError } from '../errors/app-error'
import { InvalidInputError } from '../errors/problem'
import { referenceCheck } from '../lib/references'
import { idempotency } from '../middleware/idempotency'

/** public: anyone; signed-in: any signed-in user; a role: that role or higher in the current workspace. */
export type Access = 'public' | 'signed-in' | Role

export type Method = 'get' | 'post' | 'put' | 'patch' | 'delete'

type Schema = ZodTypeAny | undefined
type Parsed<S> = S extends ZodTypeAny ? z.output<S> : undefined
/** What a handler may return: the answer's shape when the route declares one (sent as JSON), or nothing when it answered itself. */
type Answer<R> = R extends ZodTypeAny ? z.input<R> : unknown

/** The parsed request parts a handler receives. */
export interface RouteInput<P extends Schema, Q extends Schema, B extends Schema | false> {
  params: Parsed<P>
  query: Parsed<Q>
  /** The parsed body; on an upload route, undefined when a file came instead. */
  body: B extends ZodTypeAny ? z.output<B> : undefined
  /** The uploaded file of an upload route (multer's field "file"). */
  file?: Express.Multer.File
}

export interface RouteDefinition<P extends Schema, Q extends Schema, B extends Schema | false, R extends Schema> {
  method: Method
  /** Express path under /api, e.g. "/api/sheets/:id". */
  path: string
  access: Access
  summary: string
  /** Grouping in the API docs. */
  tags?: string[]
  /** Path parameters (a z.object keyed by the `:names` in the path). */
  params?: P
  /** The query string (a z.object; values arrive as strings). */
  query?: Q
  /**
   * The JSON body. Every POST, PUT and PATCH route declares one; `false` says the route takes no
   * body, and then reading `req.body` in its handler is a programming error caught by the tests.
   */
  body?: B
  /** The JSON answer on success; the handler's return value is typed by it. */
  response?: R
  /** Status of a successful answer when the handler returns a value (200 unless set). */
  status?: number
  /** What the success answer is when it is not JSON (documents only). */
  produces?: 'application/pdf' | 'text/csv' | 'none'
  /** The body is multipart/form-data with a file in field "file" (the JSON `body` is the alternative). */
  upload?: boolean
  /**
   * A request part that fails its schema answers 400 with the fields, except path parameters,
   * which answer 404 like a missing record so ids cannot be probed. Override per part here.
   */
  invalid?: { params?: 400 | 404; query?: 400 | 404 }
  /** Names the record in that 404 ("That discharge log"); a function sees the raw path parameters. */
  notFound?: string | ((params: Record<string, string>) => string)
  /**
   * An API token may call this `signed-in` route. Other `signed-in` routes are account-level
   * (profile, password, workspaces, invitations) and refuse tokens: they need a signed-in session.
   */
  tokens?: boolean
  /** The API token scope this route needs; by default read for GET and write for every other method. */
  scope?: TokenScope
  /**
   * The answer carries a secret shown once (a token, a share link): it is never stored, so an
   * Idempotency-Key on this POST is refused instead of honoured.
   */
  secretAnswer?: boolean
  /** Express middleware run before validation (uploads, rate limits). */
  before?: RequestHandler[]
  handler: (input: RouteInput<P, Q, B>, req: Request, res: Response, next: NextFunction) => Answer<R> | void | Promise<Answer<R> | void>
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
export type RouteSpec = RouteDefinition<any, any, any, any>

/** Declares a route; the handler's input and answer are typed from the schemas. */
export function defineRoute<P extends Schema = undefined, Q extends Schema = undefined, B extends Schema | false = undefined, R extends Schema = undefined>(
  spec: RouteDefinition<P, Q, B, R>,
): RouteSpec {
  return spec as RouteSpec
}

const INPUT = Symbol('route input')
type WithInput = Request & { [INPUT]?: RouteInput<Schema, Schema, Schema> }

function guardUndeclaredBody(req: Request, route: RouteSpec) {
  Object.defineProperty(req, 'body', {
    configurable: true,
    enumerable: true,
    get() {
      throw new Error(`${route.method.toUpperCase()} ${route.path} declares no body schema but its handler read req.body.`)
    },
    set() {
      /* body parsers may still assign it; the guard stays */
    },
  })
}

function failPart(route: RouteSpec, part: 'params' | 'query', error: ZodError, raw: Record<string, string>): never {
  const answer = route.invalid?.[part] ?? (part === 'params' ? 404 : 400)
  if (answer === 400) throw part === 'query' ? new InvalidInputError(error, 'query') : error
  const what = typeof route.notFound === 'function' ? route.notFound(raw) : route.notFound
  throw new NotFoundError(what)
}

/** A route without a query schema reads no query parameters: any that come are refused. */
const NO_QUERY = z.object({})

const JSON_TYPES = ['application/json', '+json']

/**
 * A body in a media type the route does not read is refused with 415 before anything else is
 * said about it (express.json leaves such a body unread, so it would otherwise look empty).
 */
function checkMediaType(route: RouteSpec, req: Request, res: Response) {
  if (!route.body || req.is(route.upload ? [...JSON_TYPES, 'multipart/form-data'] : JSON_TYPES) !== false) return
  const accepted = route.upload ? 'application/json, multipart/form-data' : 'application/json'
  if (route.method === 'patch') res.set('Accept-Patch', accepted)
  else res.set('Accept-Post', accepted)
  throw new AppError(415, 'unsupported_media_type', `This route reads a body of type ${accepted}, not ${req.get('content-type') ?? 'an unnamed type'}.`, [
    { path: 'Content-Type', pointer: '/Content-Type', in: 'header', code: 'not_allowed', message: `must be ${accepted}` },
  ])
}

/**
 * Checks params, query and body against the route's schemas (in that order: a malformed id
 * answers 404 before anything about the body is said) and keeps the parsed values for the handler.
 * Query and body are checked strictly: a name the schema does not declare is refused with its
 * pointer, never dropped, so a misspelt field cannot be accepted and ignored.
 */
export function validateRequest(route: RouteSpec): RequestHandler {
  const query = strictSchema((route.query as ZodTypeAny | undefined) ?? NO_QUERY)
  const body = route.body ? strictSchema(route.body as ZodTypeAny) : null
  return (req: Request, res: Response, next: NextFunction) => {
    const params = req.params as Record<string, string>
    const input: RouteInput<Schema, Schema, Schema> = { params: undefined, query: undefined, body: undefined }
    if (route.params) {
      const r = (route.params as ZodTypeAny).safeParse(params)
      if (!r.success) failPart(route, 'params', r.error, params)
      input.params = r.data
    }
    const q = query.safeParse(req.query ?? {})
    if (!q.success) failPart(route, 'query', q.error, params)
    if (route.query) input.query = q.data
    checkMediaType(route, req, res)
    const file = (req as Request & { file?: Express.Multer.File }).file
    if (file) input.file = file
    if (body) {
      if (!(route.upload && file)) {
        const b = body.safeParse(req.body ?? {})
        if (!b.success) throw new InvalidInputError(b.error, 'body')
        input.body = b.data
        req.body = input.body
      }
    } else {
      guardUndeclaredBody(req, route)
    }
    ;(req as WithInput)[INPUT] = input
    next()
  }
}

/** Runs the handler with the parsed input; a returned value is the JSON answer. */
export function runHandler(route: RouteSpec): RequestHandler {
  return async (req: Request, res: Response, next: NextFunction) => {
    const input = (req as WithInput)[INPUT] ?? { params: undefined, query: undefined, body: undefined }
    if (route.status) res.status(route.status)
    const answer = await route.handler(input, req, res, next)
    if (answer !== undefined && !res.headersSent) res.json(answer)
  }
}

/** The API token scope a route needs. */
export function tokenScopeOf(route: RouteSpec): TokenScope {
  return route.scope ?? (route.method === 'get' ? 'read' : 'write')
}

/** A POST by a signed-in caller may carry an Idempotency-Key (server/middleware/idempotency.ts). */
export function takesIdempotencyKey(route: RouteSpec): boolean {
  return route.method === 'post' && route.access !== 'public'
}

/**
 * The Express handler chain of a route after access: its own middleware, validation, the check that
 * every id in the body names a record of the caller's workspace (server/lib/references.ts), the
 * Idempotency-Key replay on POST, the handler.
 */
export function routeChain(route: RouteSpec): RequestHandler[] {
  const references = route.body ? referenceCheck(route.body as ZodTypeAny) : null
  const replay = takesIdempotencyKey(route) ? [idempotency({ secret: route.secretAnswer })] : []
  return [...(route.before ?? []), validateRequest(route), ...(references ? [references] : []), ...replay, runHandler(route)]
}

/** Routes whose method carries a body must say what body they take (a schema, or false for none). */
export function takesBody(route: RouteSpec): boolean {
  return route.method === 'post' || route.method === 'put' || route.method === 'patch'
}
