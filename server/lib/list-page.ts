/**
 * Cursor pages for every list: the cursor is the sort key of the last item given, base64url JSON,
 * so a page never repeats or skips a row when rows are added meanwhile (unlike an offset). The next
 * page's URL goes in an RFC 8288 Link header with the same filters.
 */
import type { Request, Response } from 'express'
import { BadRequestError } from '../errors/app-error'

export type CursorKey = Array<string | number>

export function encodeCursor(key: CursorKey): string {
  return Buffer.from(JSON.stringify(key), 'utf8').toString('base64url')
}

/** The key in a cursor this API gave, with `parts` entries; anything else is a 400 naming `cursor`. */
export function decodeCursor(cursor: string | undefined, parts: number): CursorKey | null {
  if (cursor === undefined) return null
  try {
    const key: unknown = JSON.parse(Buffer.from(cursor, 'base64url').toString('utf8'))
    if (Array.isArray(key) && key.length === parts && key.every((k) => typeof k === 'string' || typeof k === 'number')) return key
  } catch {
    /* answered below */
  }
  throw new BadRequestError('The cursor is not one this API gave: send back nextCursor unchanged.', [
    { path: 'cursor', message: 'is not a cursor this API gave' },
  ])
}

/** The first `limit` items and the cursor after the last of them (null on the last page). */
export function pageOf<T>(sorted: T[], limit: number, keyOf: (item: T) => CursorKey): { items: T[]; nextCursor: string | null } {
  const items = sorted.slice(0, limit)
  const more = sorted.length > limit
  return { items, nextCursor: more && items.length ? encodeCursor(keyOf(items[items.length - 1]!)) : null }
}

/** Sets `Link: <same path and filters, next cursor>; rel="next"` when there is a next page. */
export function linkNext(req: Request, res: Response, nextCursor: string | null): void {
  if (!nextCursor) return
  const url = new URL(req.originalUrl, 'http://placeholder')
  url.searchParams.set('cursor', nextCursor)
  res.setHeader('Link', `<${url.pathname}${url.search}>; rel="next"`)
}
