import type { Request, RequestHandler } from 'express'
import type { AppDeps } from '../deps'
import { HttpError } from './HttpError'

/** At most one session write a minute per signed-in person, so steady use does not write the session row on every request. */
export const SESSION_WRITE_EVERY_MS = 60_000

const clock = (deps: Pick<AppDeps, 'now'>) => (deps.now?.() ?? new Date()).getTime()

/** The quiet interval between writes: a minute, or a tenth of the idle timeout when that is shorter (tests use seconds). */
export const writeEveryMs = (idleMs: number) => Math.min(SESSION_WRITE_EVERY_MS, Math.max(1, Math.floor(idleMs / 10)))

/** Stamps a freshly signed-in session; called right after passport has regenerated it. */
export function markSignedIn(req: Request, deps: Pick<AppDeps, 'now'>): void {
  const now = clock(deps)
  req.session.signedInAt = now
  req.session.lastSeenAt = now
}

/**
 * Ends a signed-in session that has been idle for longer than SESSION_IDLE_MINUTES or is older than
 * SESSION_ABSOLUTE_HOURS (OWASP ASVS 4.0 3.3.2, level 2: 30 minutes idle and 12 hours; from memory), answering
 * 401 session_expired. lastSeenAt (and with it the cookie and the row's expiry) is written only when it is stale,
 * at most once a minute. Sign-in and sign-out are let through: they replace or end the session anyway.
 */
export function sessionTimeouts(deps: Pick<AppDeps, 'config' | 'now'>): RequestHandler {
  const { sessionIdleMs, sessionAbsoluteMs } = deps.config
  const quiet = writeEveryMs(sessionIdleMs)
  return (req, res, next) => {
    if (!req.user || !req.session || req.path === '/auth/signin' || req.path === '/auth/signout') return next()
    const now = clock(deps)
    const s = req.session
    // A session from before these stamps existed starts counting now.
    const signedInAt = s.signedInAt ?? now
    const lastSeenAt = s.lastSeenAt ?? signedInAt
    if (now - lastSeenAt > sessionIdleMs || now - signedInAt > sessionAbsoluteMs) {
      req.user = undefined
      return s.destroy((err) => {
        if (err) return next(err)
        res.clearCookie('rungs.sid', { path: '/', httpOnly: true, sameSite: 'lax' })
        next(new HttpError(401, 'session_expired', 'You were signed out after a while without use. Sign in again; nothing on this device is lost.'))
      })
    }
    if (s.signedInAt === undefined || now - lastSeenAt >= quiet) {
      s.signedInAt = signedInAt
      // A changed session is saved at the end of the request, which also renews the cookie and the row's expiry.
      s.lastSeenAt = now
    }
    next()
  }
}
