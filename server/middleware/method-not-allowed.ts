/**
 * A request whose path is an API route but whose method is not one of that path's answers 405
 * with `Allow` listing the methods that path takes (RFC 9110 §15.5.6), instead of a 404 that
 * would suggest the path does not exist.
 */
import type { RequestHandler } from 'express'
import { sendProblem } from '../errors/problem'
import type { RouteSpec } from '../policy/route'

function pathPattern(path: string): RegExp {
  const escaped = path.split('/').map((segment) => (segment.startsWith(':') ? '[^/]+' : segment.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')))
  return new RegExp(`^${escaped.join('/')}/?$`)
}

export function methodNotAllowed(routeTable: RouteSpec[]): RequestHandler {
  const byPath = new Map<string, { pattern: RegExp; methods: Set<string> }>()
  for (const route of routeTable) {
    const entry = byPath.get(route.path) ?? { pattern: pathPattern(route.path), methods: new Set<string>() }
    entry.methods.add(route.method.toUpperCase())
    if (route.method === 'get') entry.methods.add('HEAD')
    byPath.set(route.path, entry)
  }
  const entries = [...byPath.values()]
  return (req, res, next) => {
    // The path as routed (an /api/v1 path is read as its /api twin).
    const path = req.baseUrl + req.path
    const allowed = new Set<string>()
    for (const e of entries) if (e.pattern.test(path)) for (const m of e.methods) allowed.add(m)
    if (!allowed.size || allowed.has(req.method)) return next()
    const list = [...allowed].sort().join(', ')
    res.set('Allow', list)
    sendProblem(res, {
      status: 405,
      code: 'method_not_allowed',
      detail: `${req.method} is not allowed on ${path}; this path takes ${list}.`,
      extra: { allow: [...allowed].sort() },
    })
  }
}
