import type { RequestHandler } from 'express'
import type { createPassport } from '../../auth/passport'
import type { User } from '../../db/models/User'
import type { AppDeps } from '../../deps'
import { HttpError } from '../../middleware/HttpError'
import { markSignedIn } from '../../middleware/sessionTimeouts'
import { presentMe } from '../me/presentMe'
import * as auth from './auth.service'

type TokenFor = (req: Parameters<RequestHandler>[0], overwrite?: boolean) => string

const SENT = 'If that address can be used, we have sent it a message. Check your inbox (and spam folder).'

export function authController(deps: AppDeps, passport: ReturnType<typeof createPassport>, csrfToken: TokenFor) {
  const signIn: RequestHandler = (req, res, next) => {
    passport.authenticate('local', (err: unknown, user: User | false) => {
      if (err) return next(err)
      // One message for unknown addresses, wrong passwords and disabled accounts: answers never reveal an account.
      if (!user) return next(new HttpError(401, 'bad_credentials', 'That e-mail and password do not match. Check them, or reset your password.'))
      req.logIn(user, (loginErr) => {
        if (loginErr) return next(loginErr)
        markSignedIn(req, deps)
        presentMe(deps.models, user)
          // The session was regenerated at sign-in, so the old CSRF token is gone: hand out the new one.
          .then((me) => res.json({ user: me, csrfToken: csrfToken(req, true) }))
          .catch(next)
      })
    })(req, res, next)
  }

  const signOut: RequestHandler = (req, res, next) => {
    req.logout((err) => {
      if (err) return next(err)
      res.json({ csrfToken: csrfToken(req, true) })
    })
  }

  // Every row goes, this one included; destroying the request's session stops express-session from saving it back.
  const signOutEverywhere: RequestHandler = async (req, res, next) => {
    await auth.signOutEverywhere(deps, req.user!.id)
    req.session.destroy((err) => {
      if (err) return next(err)
      res.clearCookie('rungs.sid', { path: '/', httpOnly: true, sameSite: 'lax' })
      res.json({ message: 'You are signed out on every device. The journal on this device stays here.' })
    })
  }

  return {
    csrf: ((req, res) => {
      res.json({ csrfToken: csrfToken(req) })
    }) satisfies RequestHandler,
    signUp: (async (req, res) => {
      await auth.signUp(deps, req.body)
      res.status(202).json({ message: SENT })
    }) satisfies RequestHandler,
    verify: (async (req, res) => {
      await auth.verifyEmail(deps, req.body.token)
      res.json({ message: 'Thank you, your e-mail address is confirmed.' })
    }) satisfies RequestHandler,
    resendVerification: (async (req, res) => {
      await auth.resendVerification(deps, req.user!.id)
      res.status(202).json({ message: SENT })
    }) satisfies RequestHandler,
    requestReset: (async (req, res) => {
      await auth.requestReset(deps, req.body.email)
      res.status(202).json({ message: SENT })
    }) satisfies RequestHandler,
    reset: (async (req, res) => {
      await auth.resetPassword(deps, req.body.token, req.body.password)
      res.json({ message: 'Your password has been changed. Please sign in with it.' })
    }) satisfies RequestHandler,
    signIn,
    signOut,
    signOutEverywhere,
  }
}
