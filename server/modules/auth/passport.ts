import passport from 'passport'
import { Strategy as LocalStrategy } from 'passport-local'
import type { Request } from 'express'
import { sessionStillValid, sessionsValidAfter } from '../users/sessions'
import { findUserById } from '../users/users.repository'
import { verifyCredentials } from './auth.service'

/** passport-local on e-mail + password; the session stores only the user id. */
export function configurePassport() {
  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      verifyCredentials(email.trim().toLowerCase(), password).then((u) => done(null, u ?? false), done)
    }),
  )
  passport.serializeUser((user, done) => done(null, (user as { id: string }).id))
  // Every request: the user, and whether this session began after the user's last reset, password
  // change or removal. A void session is signed out (passport drops the user from it).
  passport.deserializeUser((req: Request, id: string, done: (err: unknown, user?: Express.User | false) => void) => {
    Promise.all([findUserById(id), sessionsValidAfter(id)]).then(([u, validAfter]) => {
      done(null, u && sessionStillValid(req.session?.signedInAt, validAfter) ? u : false)
    }, done)
  })
  return passport
}
