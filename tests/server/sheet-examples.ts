/** Route examples for /api/sheets and /api/shared (merged into route-examples.ts). */
import { sheetBody, sheetIn, shareIn } from '../helpers/sheets'
import { uniqueEmail } from '../helpers/test-app'
import type { ExampleContext, Example } from './route-examples'

type ExampleFn = (ctx: ExampleContext) => Promise<Example>

export const sheetRouteExamples: Record<string, ExampleFn> = {
  'get /api/sheets': async () => ({ path: '/api/sheets?page=1&pageSize=5&sort=title&order=asc' }),
  'get /api/sheets/authors': async () => ({ path: '/api/sheets/authors' }),
  'post /api/sheets': async () => ({ path: '/api/sheets', body: sheetBody() }),
  'get /api/sheets/:id': async ({ team, other }) => ({
    path: `/api/sheets/${(await sheetIn(team)).id}`,
    foreignPath: `/api/sheets/${(await sheetIn(other)).id}`,
  }),
  'put /api/sheets/:id': async ({ team, other }) => ({
    path: `/api/sheets/${(await sheetIn(team)).id}`,
    body: { ...sheetBody({ title: 'Saved again' }), version: 1 },
    foreignPath: `/api/sheets/${(await sheetIn(other)).id}`,
  }),
  'get /api/sheets/:id/revisions': async ({ team, other }) => ({
    path: `/api/sheets/${(await sheetIn(team)).id}/revisions`,
    foreignPath: `/api/sheets/${(await sheetIn(other)).id}/revisions`,
  }),
  'get /api/sheets/:id/revisions/:n': async ({ team, other }) => ({
    path: `/api/sheets/${(await sheetIn(team)).id}/revisions/1`,
    foreignPath: `/api/sheets/${(await sheetIn(other)).id}/revisions/1`,
  }),
  'post /api/sheets/:id/issue': async ({ team, other }) => ({
    path: `/api/sheets/${(await sheetIn(team)).id}/issue`,
    body: { version: 1 },
    foreignPath: `/api/sheets/${(await sheetIn(other)).id}/issue`,
  }),
  'post /api/sheets/:id/clone': async ({ team, other }) => ({
    path: `/api/sheets/${(await sheetIn(team)).id}/clone`,
    foreignPath: `/api/sheets/${(await sheetIn(other)).id}/clone`,
  }),
  'post /api/sheets/:id/archive': async ({ team, other }) => ({
    path: `/api/sheets/${(await sheetIn(team)).id}/archive`,
    foreignPath: `/api/sheets/${(await sheetIn(other)).id}/archive`,
  }),
  'post /api/sheets/:id/restore': async ({ team, other }) => ({
    path: `/api/sheets/${(await sheetIn(team)).id}/restore`,
    foreignPath: `/api/sheets/${(await sheetIn(other)).id}/restore`,
  }),
  'get /api/sheets/:id/pdf': async ({ team, other }) => ({
    path: `/api/sheets/${(await sheetIn(team)).id}/pdf`,
    foreignPath: `/api/sheets/${(await sheetIn(other)).id}/pdf`,
  }),
  'post /api/sheets/:id/shares': async ({ team, other }) => ({
    path: `/api/sheets/${(await sheetIn(team, { issued: true })).id}/shares`,
    body: {},
    foreignPath: `/api/sheets/${(await sheetIn(other, { issued: true })).id}/shares`,
  }),
  'get /api/sheets/:id/shares': async ({ team, other }) => ({
    path: `/api/sheets/${(await shareIn(team)).sheetId}/shares`,
    foreignPath: `/api/sheets/${(await shareIn(other)).sheetId}/shares`,
  }),
  'delete /api/sheets/:id/shares/:shareId': async ({ team, other }) => {
    const mine = await shareIn(team)
    const theirs = await shareIn(other)
    return { path: `/api/sheets/${mine.sheetId}/shares/${mine.shareId}`, foreignPath: `/api/sheets/${theirs.sheetId}/shares/${theirs.shareId}` }
  },
  'post /api/sheets/:id/shares/:shareId/email': async ({ team, other }) => {
    const mine = await shareIn(team)
    const theirs = await shareIn(other)
    return {
      path: `/api/sheets/${mine.sheetId}/shares/${mine.shareId}/email`,
      body: { to: uniqueEmail('reader'), message: 'For your review.', token: mine.token },
      foreignPath: `/api/sheets/${theirs.sheetId}/shares/${theirs.shareId}/email`,
    }
  },
  'get /api/shared/:token': async ({ team }) => ({ path: `/api/shared/${(await shareIn(team)).token}` }),
  'get /api/shared/:token/pdf': async ({ team }) => ({ path: `/api/shared/${(await shareIn(team)).token}/pdf` }),
}
