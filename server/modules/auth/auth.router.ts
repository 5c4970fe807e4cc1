/** /api/auth: sign-up, sign-in, sign-out, who am I, CSRF token, password reset. */
import crypto from 'node:crypto'
import type { NextFunction, Request, RequestHandler, Response } from 'express'
import { ipKeyGenerator, rateLimit } from 'express-rate-limit'
import { PostgresHitStore } from '../../lib/rate-limit-store'
import passport from 'passport'
import {
  ChangePasswordSchema,
  ForgotPasswordSchema,
  ResetPasswordSchema,
  SignInSchema,
  SignUpSchema,
  UpdateProfileSchema,
  type MeResponse,
} from '../../../shared/schemas/auth.schema'
import { AppError, UnauthorizedError } from '../../errors/app-error'
import { parse } from '../../lib/parse'
import type { RouteSpec } from '../../policy/access'
import type { User } from '../users/user.entity'
import { forgetUser, users } from '../users/users.repository'
import { myWorkspaces } from '../workspaces/workspaces.service'
import { changePassword, requestPasswordReset, resetPassword, signUp } from './auth.service'

function ensureCsrfToken(req: Request): string {
  req.session.csrfToken ??= crypto.randomBytes(24).toString('base64url')
  return req.session.csrfToken
}

function login(req: Request, user: User): Promise<void> {
  // passport ≥ 0.6 regenerates the session id on login (no fixation).
  return new Promise((resolve, reject) =>
    req.login(user, (err) => {
      if (err) return reject(err)
      // Compared with the user's "sessions valid after" stamp on every request.
      req.session.signedInAt = Date.now()
      resolve()
    }),
  )
}

export async function meResponse(req: Request): Promise<MeResponse> {
  const user = req.user as User
  const workspaces = await myWorkspaces(user.id)
  let current: (typeof workspaces)[number] | null = workspaces.find((w) => w.id === req.session.workspaceId) ?? workspaces[0] ?? null
  if (req.ctx?.viaToken) current = workspaces.find((w) => w.id === req.ctx?.workspaceId) ?? null
  if (current && !req.ctx?.viaToken) req.session.workspaceId = current.id
  return {
    user: { id: user.id, email: user.email, name: user.name, units: user.units === 'us' ? 'us' : 'si' },
    workspace: current ? { id: current.id, name: current.name } : null,
    role: req.ctx?.viaToken ? req.ctx.role : (current?.role ?? null),
    workspaces,
    csrfToken: req.ctx?.viaToken ? '' : ensureCsrfToken(req),
  }
}

/**
 * Ten wrong passwords in a row for one e-mail from one address: the tenth is refused with 429.
 * Counted in PostgreSQL, so the limit holds across every app process.
 */
export function signInLimiter(windowMs: number): RequestHandler {
  return rateLimit({
    windowMs,
    store: new PostgresHitStore('sign-in|'),
    limit: 9,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '0.0.0.0')}|${String((req.body as { email?: unknown })?.email ?? '').trim().toLowerCase()}`,
    handler: (req, res) => {
      const reset = (req as Request & { rateLimit?: { resetTime?: Date } }).rateLimit?.resetTime ?? new Date(Date.now() + windowMs)
      const seconds = Math.max(1, Math.ceil((reset.getTime() - Date.now()) / 1000))
      const when = seconds >= 120 ? `${Math.ceil(seconds / 60)} minutes` : `${seconds} seconds`
      res.set('Retry-After', String(seconds))
      res.status(429).json({
        error: `Too many failed sign-ins for this e-mail. Try again in ${when} (after ${reset.toISOString().slice(11, 16)} UTC), or reset your password.`,
        code: 'too_many_attempts',
        retryAfterSeconds: seconds,
        retryAt: reset.toISOString(),
      })
    },
  })
}

const signIn: RequestHandler = (req, res, next) => {
  req.body = parse(SignInSchema, req.body)
  passport.authenticate('local', { session: false }, (err: unknown, user: User | false) => {
    if (err) return next(err)
    if (!user) return next(new AppError(401, 'bad_credentials', 'E-mail or password is wrong.'))
    login(req, user)
      .then(async () => {
        req.session.workspaceId = undefined
        res.json(await meResponse(req))
      })
      .catch(next)
  })(req, res, next)
}

async function signUpHandler(req: Request, res: Response) {
  const input = parse(SignUpSchema, req.body)
  const user = await signUp(input)
  await login(req, user)
  res.status(201).json(await meResponse(req))
}

function signOut(req: Request, res: Response, next: NextFunction) {
  req.logout((err) => {
    if (err) return next(err)
    req.session.destroy(() => {
      res.clearCookie('lw.sid')
      res.status(204).end()
    })
  })
}

async function me(req: Request, res: Response) {
  if (!req.user && !req.ctx?.viaToken) throw new UnauthorizedError()
  res.json(await meResponse(req))
}

async function updateMe(req: Request, res: Response) {
  const input = parse(UpdateProfileSchema, req.body)
  const user = req.user as User
  Object.assign(user, input)
  await users().save(user)
  forgetUser(user.id)
  res.json(await meResponse(req))
}

async function changePasswordHandler(req: Request, res: Response) {
  const { currentPassword, newPassword } = parse(ChangePasswordSchema, req.body)
  const user = req.user as User
  await changePassword(user.id, currentPassword, newPassword, req.sessionID)
  // This session goes on: it counts as signed in after the change.
  req.session.signedInAt = Date.now()
  res.json({ message: 'Your password has been changed. You have been signed out everywhere else.' })
}

function csrf(req: Request, res: Response) {
  res.json({ csrfToken: ensureCsrfToken(req) })
}

async function forgot(req: Request, res: Response) {
  const { email } = parse(ForgotPasswordSchema, req.body)
  await requestPasswordReset(email)
  res.status(202).json({ message: 'If an account uses this e-mail, a reset link is on its way. It works once, for one hour.' })
}

async function reset(req: Request, res: Response) {
  const { token, password } = parse(ResetPasswordSchema, req.body)
  await resetPassword(token, password)
  res.json({ message: 'Your password has been changed. You have been signed out everywhere and your API tokens have been revoked. Sign in with the new one.' })
}

export function authRoutes(opts: { signInWindowMs: number }): RouteSpec[] {
  return [
    { method: 'post', path: '/api/auth/sign-up', access: 'public', summary: 'Create an account (and a workspace, or accept an invitation)', body: SignUpSchema, handler: signUpHandler },
    { method: 'post', path: '/api/auth/sign-in', access: 'public', summary: 'Sign in with e-mail and password', body: SignInSchema, handler: [signInLimiter(opts.signInWindowMs), signIn] },
    { method: 'post', path: '/api/auth/sign-out', access: 'public', summary: 'Sign out', handler: signOut },
    { method: 'get', path: '/api/auth/me', access: 'signed-in', summary: 'The user, the current workspace and role', handler: me },
    { method: 'patch', path: '/api/auth/me', access: 'signed-in', summary: 'Change name or unit preference', body: UpdateProfileSchema, handler: updateMe },
    { method: 'post', path: '/api/auth/password', access: 'signed-in', summary: 'Change my password (ends my other sessions)', body: ChangePasswordSchema, handler: changePasswordHandler },
    { method: 'get', path: '/api/auth/csrf', access: 'public', summary: 'A CSRF token for the X-CSRF-Token header', handler: csrf },
    { method: 'post', path: '/api/auth/forgot-password', access: 'public', summary: 'E-mail a single-use password reset link', body: ForgotPasswordSchema, handler: forgot },
    { method: 'post', path: '/api/auth/reset-password', access: 'public', summary: 'Set a new password with a reset token', body: ResetPasswordSchema, handler: reset },
  ]
}
