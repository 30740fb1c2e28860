import { Router } from 'express'
import type { AppDeps } from '../../deps'
import { requireAuth } from '../../middleware/requireAuth'
import { presentMe } from './presentMe'

export function meRoutes(deps: AppDeps) {
  const router = Router()
  router.get('/', requireAuth, async (req, res) => {
    const sentMail = req.user!.role === 'admin' && Boolean(deps.fakeSmtp) && deps.config.env !== 'production'
    res.json({ user: await presentMe(deps.models, req.user!), features: { sentMail } })
  })
  return router
}
