import { Router } from 'express'
import { closeAccountSchema } from '../../../shared/schemas/privacy.schema'
import type { AppDeps } from '../../deps'
import { limitPerIp, sharedCounters } from '../../middleware/rateLimit'
import { requireAuth } from '../../middleware/requireAuth'
import { requireRole } from '../../middleware/requireRole'
import { validate } from '../../middleware/validate'
import { privacyController } from './privacy.controller'

/** Mounted on /api: the person's rights over their server-side data (GDPR Art. 20 download, Art. 17 erasure). */
export function privacyRoutes(deps: AppDeps) {
  const c = privacyController(deps)
  // The password is checked again here, so wrong guesses are limited like sign-in; only failures count.
  const closeLimit = limitPerIp(10, { skipSuccessfulRequests: true, store: sharedCounters(deps, 'close-account') })
  const router = Router()
  router.get('/me/export', requireRole('person'), c.exportAccount)
  router.delete('/me', requireAuth, c.onlyPersonCloses, closeLimit, validate({ body: closeAccountSchema }), c.closeAccount)
  return router
}
