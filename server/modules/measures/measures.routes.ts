import { Router, type RequestHandler } from 'express'
import { linkIdParamSchema } from '../../../shared/schemas/link.schema'
import { earlierScoreParamsSchema } from '../../../shared/schemas/measureReport.schema'
import type { AppDeps } from '../../deps'
import { requireApprovedTherapist, requireRole } from '../../middleware/requireRole'
import { validate } from '../../middleware/validate'
import { linkOfTherapist } from '../links/linkAccess'
import { csvUpload } from './csvUpload'
import { measuresController } from './measures.controller'

/**
 * Questionnaire results on both sides, mounted on /api. Every route names its guard, and the services check that the
 * link is the caller's own (a stranger's id answers like a made-up one).
 */
export function measuresRoutes(deps: AppDeps) {
  const c = measuresController(deps)
  const link = validate({ params: linkIdParamSchema })
  // The link must be the therapist's own before the upload is read at all.
  const ownLink: RequestHandler = async (req, _res, next) => {
    await linkOfTherapist(deps, req.user!.id, String(req.params.linkId))
    next()
  }
  const router = Router()
  router.get('/therapist/links/:linkId/measures', requireApprovedTherapist, link, c.list)
  router.get('/therapist/links/:linkId/measures.csv', requireApprovedTherapist, link, c.csv)
  router.get('/therapist/links/:linkId/measures/fhir', requireApprovedTherapist, link, c.fhir)
  router.post('/therapist/links/:linkId/earlier-scores', requireApprovedTherapist, link, ownLink, csvUpload, c.upload)
  router.get('/therapist/links/:linkId/earlier-scores', requireApprovedTherapist, link, c.listEarlier)
  router.delete('/therapist/links/:linkId/earlier-scores/:id', requireApprovedTherapist, validate({ params: earlierScoreParamsSchema }), c.deleteEarlier)
  router.get('/links/:linkId/earlier-scores', requireRole('person'), link, c.personEarlier)
  return router
}
