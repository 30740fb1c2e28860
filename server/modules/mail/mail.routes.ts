import { Router } from 'express'
import { z } from 'zod'
import type { FakeSmtp } from '../../mail/fakeSmtp'
import { HttpError } from '../../middleware/HttpError'
import { requireRole } from '../../middleware/requireRole'
import { validate } from '../../middleware/validate'

/** The admin's "Sent mail" page: only mounted while the local fake mail server is in use, never in production. */
export function sentMailRoutes(fake: FakeSmtp) {
  const router = Router()
  router.use(requireRole('admin'))
  router.get('/', (_req, res) => {
    res.json({ messages: fake.messages().map(({ id, to, subject, receivedAt }) => ({ id, to, subject, receivedAt })) })
  })
  router.get('/:id', validate({ params: z.object({ id: z.uuid({ error: 'That id is not valid.' }) }) }), (req, res) => {
    const message = fake.find(String(req.params.id))
    if (!message) throw new HttpError(404, 'not_found', 'That message is no longer kept.')
    res.json({ message })
  })
  return router
}
