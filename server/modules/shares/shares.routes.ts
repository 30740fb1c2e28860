import { Router } from 'express'
import { linkIdParamSchema } from '../../../shared/schemas/link.schema'
import { shareDeleteQuerySchema, shareParamsSchema, sharePutSchema } from '../../../shared/schemas/share.schema'
import type { AppDeps } from '../../deps'
import { requireVerified } from '../../middleware/requireAuth'
import { requireRole } from '../../middleware/requireRole'
import { validate } from '../../middleware/validate'
import { sharesController } from './shares.controller'

/** The person's side of sharing, mounted on /api. Only the person who owns the link gets past the service's link check. */
export function sharesRoutes(deps: AppDeps) {
  const c = sharesController(deps)
  const person = [requireRole('person'), requireVerified]
  const router = Router()
  router.put('/links/:linkId/shares/:entryId', ...person, validate({ params: shareParamsSchema, body: sharePutSchema }), c.put)
  router.delete('/links/:linkId/shares/:entryId', ...person, validate({ params: shareParamsSchema, query: shareDeleteQuerySchema }), c.del)
  router.get('/person/links/:linkId/shares', requireRole('person'), validate({ params: linkIdParamSchema }), c.states)
  router.get('/person/links/:linkId/access-log', requireRole('person'), validate({ params: linkIdParamSchema }), c.accessLog)
  return router
}
