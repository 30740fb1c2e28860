import { Router } from 'express'
import { appointmentCreateSchema, invitationCreateSchema, linkCodeBodySchema, linkIdParamSchema } from '../../../shared/schemas/link.schema'
import type { AppDeps } from '../../deps'
import { limitPerIp, sharedCounters } from '../../middleware/rateLimit'
import { requireVerified } from '../../middleware/requireAuth'
import { requireApprovedTherapist, requireRole } from '../../middleware/requireRole'
import { validate } from '../../middleware/validate'
import { linksController } from './links.controller'

/** Mounted on /api. Every route names its own guard, so nothing here is open by accident. */
export function linksRoutes(deps: AppDeps) {
  const c = linksController(deps)
  // Codes are short enough to type, so wrong guesses are limited; only failures count.
  const codeLimit = limitPerIp(20, { skipSuccessfulRequests: true, store: sharedCounters(deps, 'link-code') })
  const person = [requireRole('person'), requireVerified]
  const router = Router()

  router.post('/therapist/invitations', requireApprovedTherapist, validate({ body: invitationCreateSchema }), c.createInvitation)
  router.get('/therapist/invitations', requireApprovedTherapist, c.listInvitations)
  router.get('/therapist/links', requireApprovedTherapist, c.therapistLinks)
  router.post('/therapist/links/:linkId/appointments', requireApprovedTherapist, validate({ params: linkIdParamSchema, body: appointmentCreateSchema }), c.addAppointment)
  router.get('/therapist/links/:linkId/appointments', requireApprovedTherapist, validate({ params: linkIdParamSchema }), c.appointments)

  router.post('/person/links/preview', ...person, codeLimit, validate({ body: linkCodeBodySchema }), c.preview)
  router.post('/person/links', ...person, codeLimit, validate({ body: linkCodeBodySchema }), c.confirm)
  router.get('/person/links', requireRole('person'), c.personLinks)

  router.post('/links/:linkId/end', requireRole('person', 'therapist'), validate({ params: linkIdParamSchema }), c.end)
  return router
}
