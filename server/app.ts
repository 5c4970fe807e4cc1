/** Builds the Express app (no listening here: tests drive it with supertest). */
import fs from 'node:fs'
import path from 'node:path'
import express, { Router, type Express, type RequestHandler } from 'express'
import compression from 'compression'
import helmet from 'helmet'
import passport from 'passport'
import { config, type AppConfig } from './config'
import { apiTokenAuth } from './middleware/api-token'
import { apiVersion } from './middleware/api-version'
import { tokenRateLimit } from './middleware/token-rate-limit'
import { csrfProtection } from './middleware/csrf'
import { errorHandler, notFoundApi } from './middleware/error-handler'
import { methodNotAllowed } from './middleware/method-not-allowed'
import { requestLog } from './middleware/request-log'
import { authorize, type RouteSpec } from './policy/access'
import { routeChain, tokenScopeOf } from './policy/route'
import { configurePassport } from './modules/auth/passport'
import { buildRouteTable } from './routes'
import { DEFAULT_LIMITS, type Limits } from './lib/limits'
import { setMailLimit } from './modules/mail/mail.service'
import { createSessionMiddleware } from './lib/session'

export interface AppOptions {
  /** Window of the failed sign-in limit (15 minutes by default; tests shorten it). */
  signInWindowMs?: number
  /** Limits on sign-up, reset, mail sends and failed sign-ins per address (server/lib/limits.ts). */
  limits?: Partial<Limits>
  /** Folder of the built client; served with a fallback to index.html for client routes. */
  clientDir?: string | null
  /** Reverse-proxy hops to trust for the client address (TRUST_PROXY by default; tests send X-Forwarded-For). */
  trustProxy?: number
}

export interface BuiltApp {
  app: Express
  routeTable: RouteSpec[]
  close: () => Promise<void>
}

/** helmet's headers with the content security policy the client really works under. */
export function securityHeaders(cfg: AppConfig) {
  return helmet({
    contentSecurityPolicy: {
      useDefaults: true,
      directives: {
        'default-src': ["'self'"],
        'script-src': ["'self'"],
        // naive-ui injects its component styles at run time.
        'style-src': ["'self'", "'unsafe-inline'"],
        'img-src': ["'self'", 'data:', 'blob:'],
        'font-src': ["'self'", 'data:'],
        'connect-src': ["'self'"],
        'object-src': ["'none'"],
        'frame-ancestors': ["'none'"],
        'upgrade-insecure-requests': cfg.https ? [] : null,
      },
    },
    // HSTS only makes sense when the app is really served over HTTPS.
    strictTransportSecurity: cfg.https ? { maxAge: 15552000, includeSubDomains: true } : false,
    crossOriginEmbedderPolicy: false,
  })
}

/** Every /api answer: private to the signed-in team and never cached. */
export const noStore: RequestHandler = (_req, res, next) => {
  res.setHeader('Cache-Control', 'private, no-store')
  next()
}

export function createApp(opts: AppOptions = {}): BuiltApp {
  const cfg = config()
  const app = express()
  app.disable('x-powered-by')
  app.set('trust proxy', opts.trustProxy ?? cfg.trustProxy)
  app.set('query parser', 'simple')

  app.use(securityHeaders(cfg))
  app.use(apiVersion)
  // gzip or deflate when the client accepts it (answers over 1 kB: lists, OpenAPI, CSV, the bundle).
  app.use(compression())
  // API answers are private to the signed-in team and never stored by caches; a weak ETag still
  // lets a script that kept an answer ask "If-None-Match" and get 304 without the body again.
  app.set('etag', 'weak')
  app.use('/api', noStore)
  if (cfg.logLevel !== 'silent') app.use('/api', requestLog)
  app.use('/api', express.json({ limit: '1mb', strict: true }))
  const session = createSessionMiddleware(cfg)
  app.use('/api', session.middleware)
  configurePassport()
  const limits: Limits = { ...DEFAULT_LIMITS, ...opts.limits }
  app.use('/api', passport.initialize({ compat: false }), passport.session(), apiTokenAuth, tokenRateLimit(limits.tokenRequests))
  app.use('/api', csrfProtection(cfg.session.cookieName, cfg.origin))

  setMailLimit(limits.mailPerRecipient)
  const routeTable = buildRouteTable({ signInWindowMs: opts.signInWindowMs ?? 15 * 60 * 1000, limits })
  // One router per resource (/api/sheets, /api/calc, …): a request is matched against its own
  // group's routes, not against every route of the API in turn.
  const groups = new Map<string, Router>()
  for (const route of routeTable) {
    const prefix = route.path.split('/').slice(0, 3).join('/')
    let group = groups.get(prefix)
    if (!group) {
      group = Router()
      groups.set(prefix, group)
      app.use(prefix, group)
    }
    group[route.method](
      route.path.slice(prefix.length) || '/',
      authorize(route.access, { tokens: route.tokens, scope: tokenScopeOf(route) }),
      ...routeChain(route),
    )
  }
  app.use('/api', methodNotAllowed(routeTable), notFoundApi)

  const clientDir = opts.clientDir === undefined ? path.resolve('dist') : opts.clientDir
  if (clientDir && fs.existsSync(path.join(clientDir, 'index.html'))) {
    app.use(
      express.static(clientDir, {
        index: false,
        maxAge: '1h',
        setHeaders: (res, file) => {
          if (file.includes(`${path.sep}assets${path.sep}`)) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable')
        },
      }),
    )
    app.get('/{*splat}', (_req, res) => res.sendFile(path.join(clientDir, 'index.html')))
  }
  app.use(errorHandler)
  return { app, routeTable, close: session.close }
}
