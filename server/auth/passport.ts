import type { IncomingMessage } from 'node:http'
import { Passport } from 'passport'
import { Strategy as LocalStrategy } from 'passport-local'
import type { Models } from '../db/associations'
import { randomBytes } from 'node:crypto'
import { sessionUsers, type SessionUsers } from './loadSessionUser'
import { hashPassword, verifyPassword } from './password'


/** A passport instance of the app's own: the session holds only the user id, and the user is loaded on every request. */
export function createPassport(models: Models, scryptCost: number, users: SessionUsers = sessionUsers(models)) {
  const passport = new Passport()
  // Checking an unknown address against a real hash of the same cost makes it answer as slowly as a wrong password.
  let dummyHash: Promise<string> | undefined
  const dummy = () => (dummyHash ??= hashPassword(randomBytes(16).toString('hex'), scryptCost))
  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password', session: true }, (email, password, done) => {
      models.User.findOne({ where: { email }, include: [{ model: models.TherapistProfile, as: 'therapistProfile' }] })
        .then(async (user) => {
          const ok = await verifyPassword(password, user?.passwordHash ?? (await dummy())).catch(() => false)
          if (!user || !ok || user.disabledAt) return done(null, false)
          return done(null, user)
        })
        .catch(done)
    }),
  )
  passport.serializeUser((user, done) => done(null, user.id))
  // Three parameters: passport then passes the request first, so the user the session read brought along can be used.
  passport.deserializeUser((req: IncomingMessage, id: string, done: (err: unknown, user?: Express.User | false) => void) => {
    const handed = users.take((req as { sessionID?: string }).sessionID, id)
    if (handed) return done(null, handed.disabledAt ? false : handed)
    users.load(id)
      // false signs the session out: a disabled or deleted account loses its rights on the next request.
      .then((user) => done(null, user && !user.disabledAt ? user : false))
      .catch(done)
  })
  return passport
}
