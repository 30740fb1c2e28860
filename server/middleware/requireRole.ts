import type { RequestHandler } from 'express'
import type { Role } from '../../shared/schemas/auth.schema'
import { HttpError } from './HttpError'

/** Lets through only signed-in users holding one of the roles; everyone else gets 401 or 403. */
export function requireRole(...roles: Role[]): RequestHandler {
  return (req, _res, next) => {
    if (!req.user) throw new HttpError(401, 'unauthenticated', 'Please sign in.')
    if (!roles.includes(req.user.role)) throw new HttpError(403, 'forbidden', 'Your account cannot do that.')
    next()
  }
}

/** For therapist actions that touch people: only after an admin has approved the therapist. */
export const requireApprovedTherapist: RequestHandler = (req, _res, next) => {
  if (!req.user) throw new HttpError(401, 'unauthenticated', 'Please sign in.')
  if (req.user.role !== 'therapist') throw new HttpError(403, 'forbidden', 'Your account cannot do that.')
  if (!req.user.therapistProfile?.approvedAt) throw new HttpError(403, 'not_approved', 'An admin has not approved this therapist account yet.')
  next()
}
