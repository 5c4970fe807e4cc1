/** /api/auth: sign-up, sign-in, sign-out, who am I, CSRF token, password reset. */
import type { Request } from 'express'
import passport from 'passport'
import { z } from 'zod'
import {
  ChangePasswordSchema,
  ConfirmEmailSchema,
  ForgotPasswordSchema,
  ResetPasswordSchema,
  SignInSchema,
  SignUpSchema,
  UpdateProfileSchema,
} from '../../../shared/schemas/auth.schema'
import { AppError, UnauthorizedError } from '../../errors/app-error'
import { defineRoute, type RouteSpec } from '../../policy/access'
import type { User } from '../users/user.entity'
import { forgetUser, users } from '../users/users.repository'
import {
  changePassword,
  confirmEmail,
  mailConfirmationLink,
  requestPasswordReset,
  resetPassword,
  SIGN_UP_ANSWER,
  signUp,
  signUpWithInvitation,
} from './auth.service'
import { afterAnswer } from '../../lib/after-answer'
import { perAddress, perEmail, type Limits } from '../../lib/limits'
import { signInGate, signInSucceeded, stillLocked } from './sign-in-gate'
import { ensureCsrfToken, meResponse } from './me.service'
import { CsrfAnswer, MeAnswer, SessionAnswer } from '../../../shared/schemas/answers/accounts'
import { MessageSchema } from '../../../shared/schemas/answers/common'

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

export function authRoutes(opts: { signInWindowMs: number; limits: Limits }): RouteSpec[] {
  const L = opts.limits
  const linkLimit = perAddress('link', L.linkPerAddress, 'Too many link attempts from your network.')
  return [
    defineRoute({
      method: 'post',
      path: '/api/auth/sign-up',
      response: z.union([MeAnswer, MessageSchema]),
      access: 'public',
      summary: 'Create an account (and a workspace, or accept an invitation)',
      before: [
        perAddress('sign-up', L.signUpPerAddress, 'Too many sign-ups from your network.'),
        perEmail('sign-up-email', L.signUpPerEmail, 'Too many sign-ups for this e-mail address.'),
      ],
      body: SignUpSchema,
      handler: async ({ body }, req, res) => {
        if (body.invitation) {
          // The invitation proves the address: confirmed, joined and signed in at once.
          const user = await signUpWithInvitation({ ...body, invitation: body.invitation })
          await login(req, user)
          res.status(201).json(await meResponse(req))
          return
        }
        // New or taken address alike: 202 and a mail; the account can sign in once confirmed.
        await signUp(body)
        res.status(202).json(SIGN_UP_ANSWER)
      },
    }),
    defineRoute({
      method: 'post',
      path: '/api/auth/confirm-email',
      response: MessageSchema,
      access: 'public',
      summary: 'Confirm an e-mail address with the link from the mail',
      before: [linkLimit],
      body: ConfirmEmailSchema,
      handler: async ({ body }) => {
        await confirmEmail(body.token)
        return { message: 'Your e-mail address is confirmed. You can sign in now.' }
      },
    }),
    defineRoute({
      method: 'post',
      path: '/api/auth/sign-in',
      response: MeAnswer,
      access: 'public',
      summary: 'Sign in with e-mail and password',
      // The gate counts failed attempts, including bodies that fail the schema (sign-in-gate.ts).
      before: [signInGate(opts.signInWindowMs, L)],
      body: SignInSchema,
      handler: (_input, req, res, next) => {
        // passport's local strategy reads the parsed body (e-mail trimmed and lower-cased).
        passport.authenticate('local', { session: false }, (err: unknown, user: User | false) => {
          if (err) return next(err)
          if (!user) return next(stillLocked(res) ?? new AppError(401, 'bad_credentials', 'E-mail or password is wrong.'))
          if (!user.emailConfirmedAt) {
            // Only someone who knows the password learns the account is waiting: send a fresh link.
            afterAnswer('confirmation mail', () => mailConfirmationLink(user))
            return next(new AppError(403, 'email_unconfirmed', 'Confirm your e-mail address first: we have sent a new link to it.'))
          }
          login(req, user)
            .then(async () => {
              await signInSucceeded(res)
              req.session.workspaceId = undefined
              res.json(await meResponse(req))
            })
            .catch(next)
        })(req, res, next)
      },
    }),
    defineRoute({
      method: 'post',
      path: '/api/auth/sign-out',
      access: 'public',
      summary: 'Sign out',
      body: false,
      produces: 'none',
      handler: (_input, req, res, next) => {
        req.logout((err) => {
          if (err) return next(err)
          req.session.destroy(() => {
            res.clearCookie('lw.sid')
            res.status(204).end()
          })
        })
      },
    }),
    defineRoute({
      method: 'get',
      path: '/api/auth/me',
      response: MeAnswer,
      access: 'signed-in',
      summary: 'The user, the current workspace and role',
      // A token sees itself: its user, its one workspace and its role.
      tokens: true,
      handler: (_input, req) => {
        if (!req.user && !req.ctx?.viaToken) throw new UnauthorizedError()
        return meResponse(req)
      },
    }),
    defineRoute({
      method: 'get',
      path: '/api/auth/session',
      response: SessionAnswer,
      access: 'public',
      summary: 'The signed-in user, or none: a page checks this on load without a failed request when signed out',
      handler: async (_input, req) => ({ me: req.user ? await meResponse(req) : null }),
    }),
    defineRoute({
      method: 'patch',
      path: '/api/auth/me',
      response: MeAnswer,
      access: 'signed-in',
      summary: 'Change name or unit preference',
      body: UpdateProfileSchema,
      handler: async ({ body }, req) => {
        const user = req.user as User
        Object.assign(user, body)
        await users().save(user)
        forgetUser(user.id)
        return meResponse(req)
      },
    }),
    defineRoute({
      method: 'post',
      path: '/api/auth/password',
      response: MessageSchema,
      access: 'signed-in',
      summary: 'Change my password (ends my other sessions)',
      body: ChangePasswordSchema,
      handler: async ({ body }, req) => {
        await changePassword((req.user as User).id, body.currentPassword, body.newPassword, req.sessionID)
        // This session goes on: it counts as signed in after the change.
        req.session.signedInAt = Date.now()
        return { message: 'Your password has been changed. You have been signed out everywhere else.' }
      },
    }),
    defineRoute({
      method: 'get',
      path: '/api/auth/csrf',
      response: CsrfAnswer,
      access: 'public',
      summary: 'A CSRF token for the X-CSRF-Token header',
      handler: (_input, req) => ({ csrfToken: ensureCsrfToken(req) }),
    }),
    defineRoute({
      method: 'post',
      path: '/api/auth/forgot-password',
      response: MessageSchema,
      access: 'public',
      summary: 'E-mail a single-use password reset link',
      before: [
        perAddress('forgot', L.forgotPerAddress, 'Too many reset requests from your network.'),
        perEmail('forgot-email', L.forgotPerEmail, 'Too many reset requests for this e-mail address.'),
      ],
      body: ForgotPasswordSchema,
      status: 202,
      handler: async ({ body }) => {
        // Answered before any work, so a known and an unknown address take the same time.
        afterAnswer('password reset', () => requestPasswordReset(body.email))
        return { message: 'If an account uses this e-mail, a reset link is on its way. It works once, for one hour.' }
      },
    }),
    defineRoute({
      method: 'post',
      path: '/api/auth/reset-password',
      response: MessageSchema,
      access: 'public',
      summary: 'Set a new password with a reset token',
      before: [linkLimit],
      body: ResetPasswordSchema,
      handler: async ({ body }) => {
        await resetPassword(body.token, body.password)
        return {
          message: 'Your password has been changed. You have been signed out everywhere and your API tokens have been revoked. Sign in with the new one.',
        }
      },
    }),
  ]
}
