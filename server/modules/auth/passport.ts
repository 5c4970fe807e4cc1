import passport from 'passport'
import { Strategy as LocalStrategy } from 'passport-local'
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
  passport.deserializeUser((id: string, done) => {
    findUserById(id).then((u) => done(null, u ?? false), done)
  })
  return passport
}
