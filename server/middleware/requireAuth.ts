import type { RequestHandler } from 'express'
import { HttpError } from './HttpError'

export const requireAuth: RequestHandler = (req, _res, next) => {
  if (!req.user) throw new HttpError(401, 'unauthenticated', 'Please sign in.')
  next()
}

/** For actions that need a confirmed address: sharing and linking. */
export const requireVerified: RequestHandler = (req, _res, next) => {
  if (!req.user) throw new HttpError(401, 'unauthenticated', 'Please sign in.')
  if (!req.user.emailVerifiedAt) throw new HttpError(403, 'email_unverified', 'Please confirm your e-mail address first; we sent you a link.')
  next()
}
