/** The only reader of import.meta.env on the client. */
export const CONFIG = {
  /** API base path; the dev server proxies it to Express. */
  apiBase: '/api',
  isDev: import.meta.env.DEV,
}
