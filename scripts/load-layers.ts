/**
 * One server of `LOAD_SCENARIOS=layers npm run load`: POST /api/calc/size served through the app's
 * own middleware, added one layer at a time (LAYERS=0…6), so the load run can show what each layer
 * costs per request. Layer 6 is the whole app as createApp builds it.
 */
import express, { type Request, type Response } from 'express'
import passport from 'passport'
import { createApp, noStore, securityHeaders } from '../server/app'
import { config } from '../server/config'
import { dataSource } from '../server/data-source'
import { createSessionMiddleware } from '../server/lib/session'
import { apiTokenAuth } from '../server/middleware/api-token'
import { csrfProtection } from '../server/middleware/csrf'
import { configurePassport } from '../server/modules/auth/passport'
import { tools } from '../shared/engine/registry'
import { runTool } from '../shared/engine/tool'

export const LAYERS = [
  'express.json and a tiny answer',
  '+ the engine and its answer (working included)',
  '+ security headers (helmet, no-store)',
  '+ session (PostgreSQL store, 2 s cache)',
  '+ passport (user from its cache)',
  '+ CSRF check',
  'the whole app (route groups, access check, query schema)',
] as const

async function main() {
  const layers = Number(process.env.LAYERS)
  await dataSource.initialize()
  const cfg = config()
  let app = express()
  if (layers >= 6) {
    app = createApp({ clientDir: null }).app
  } else {
    app.set('etag', false)
    if (layers >= 2) {
      app.use(securityHeaders(cfg))
      app.use('/api', noStore)
    }
    app.use('/api', express.json({ limit: '1mb' }))
    if (layers >= 3) app.use('/api', createSessionMiddleware(cfg).middleware)
    if (layers >= 4) {
      configurePassport()
      app.use('/api', passport.initialize({ compat: false }), passport.session(), apiTokenAuth)
    }
    if (layers >= 5) app.use('/api', csrfProtection(cfg.session.cookieName, cfg.origin))
    app.post('/api/calc/size', (req: Request, res: Response) => {
      if (layers < 1) return res.json({ ok: true })
      const outcome = runTool(tools.size, req.body, { explain: true })
      res.json(outcome.ok ? { tool: 'size', ...outcome.result } : { fields: outcome.fields })
    })
  }
  app.listen(Number(process.env.PORT), '127.0.0.1', () => process.stdout.write('ready\n'))
  process.on('SIGTERM', () => process.exit(0))
}

if (process.env.LAYERS !== undefined) void main()
