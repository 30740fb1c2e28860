import { Router } from 'express'
import { linkIdParamSchema } from '../../../shared/schemas/link.schema'
import { prepNoteCreateSchema, prepNoteExportQuerySchema, prepNoteParamsSchema, prepNotePatchSchema } from '../../../shared/schemas/prep.schema'
import { shareParamsSchema, sharePatchSchema } from '../../../shared/schemas/share.schema'
import type { AppDeps } from '../../deps'
import { requireApprovedTherapist } from '../../middleware/requireRole'
import { validate } from '../../middleware/validate'
import { prepController } from './prep.controller'

/** The therapist's reading side, mounted on /api: approved therapists only, and the service checks the link is theirs. */
export function prepRoutes(deps: AppDeps) {
  const c = prepController(deps)
  const link = validate({ params: linkIdParamSchema })
  const router = Router()
  router.get('/therapist/caseload', requireApprovedTherapist, c.caseload)
  router.get('/therapist/links/:linkId/shares', requireApprovedTherapist, link, c.readShares)
  router.patch('/therapist/links/:linkId/shares/:entryId', requireApprovedTherapist, validate({ params: shareParamsSchema, body: sharePatchSchema }), c.patchShare)
  router.get('/therapist/links/:linkId/notes/export', requireApprovedTherapist, validate({ params: linkIdParamSchema, query: prepNoteExportQuerySchema }), c.exportNotes)
  router.get('/therapist/links/:linkId/notes', requireApprovedTherapist, link, c.notes)
  router.post('/therapist/links/:linkId/notes', requireApprovedTherapist, validate({ params: linkIdParamSchema, body: prepNoteCreateSchema }), c.addNote)
  router.patch('/therapist/links/:linkId/notes/:noteId', requireApprovedTherapist, validate({ params: prepNoteParamsSchema, body: prepNotePatchSchema }), c.editNote)
  router.delete('/therapist/links/:linkId/notes/:noteId', requireApprovedTherapist, validate({ params: prepNoteParamsSchema }), c.deleteNote)
  return router
}
