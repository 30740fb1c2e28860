import { Router } from 'express'
import type { createPassport } from '../../auth/passport'
import { resetConfirmSchema, resetRequestSchema, signInSchema, signUpSchema, verifySchema } from '../../../shared/schemas/auth.schema'
import type { AppDeps } from '../../deps'
import { limitPerAccount, limitPerIp, sharedCounters } from '../../middleware/rateLimit'
import { requireAuth } from '../../middleware/requireAuth'
import { validate } from '../../middleware/validate'
import { authController } from './auth.controller'

export function authRoutes(deps: AppDeps, passport: ReturnType<typeof createPassport>, csrfToken: Parameters<typeof authController>[2]) {
  const c = authController(deps, passport, csrfToken)
  const signInLimit = limitPerIp(deps.config.signInLimit, { skipSuccessfulRequests: true, store: sharedCounters(deps, 'signin') })
  const signInAccountLimit = limitPerAccount(deps.config.signInAccountLimit, { store: sharedCounters(deps, 'signin-account') })
  // One counter per route, so asking for links a few times never blocks using one.
  const mailLimit = (name: string) => limitPerIp(deps.config.resetLimit, { store: sharedCounters(deps, name) })
  const router = Router()
  router.get('/csrf', c.csrf)
  router.post('/signup', mailLimit('signup'), validate({ body: signUpSchema }), c.signUp)
  router.post('/signin', signInLimit, signInAccountLimit, validate({ body: signInSchema }), c.signIn)
  router.post('/signout', c.signOut)
  router.post('/signout-everywhere', requireAuth, c.signOutEverywhere)
  router.post('/verify', validate({ body: verifySchema }), c.verify)
  router.post('/verify/resend', requireAuth, mailLimit('verify-resend'), c.resendVerification)
  router.post('/reset/request', mailLimit('reset-request'), validate({ body: resetRequestSchema }), c.requestReset)
  router.post('/reset', mailLimit('reset'), validate({ body: resetConfirmSchema }), c.reset)
  return router
}
