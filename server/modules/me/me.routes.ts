import { Router } from 'express'
import type { AppDeps } from '../../deps'
import { requireAuth } from '../../middleware/requireAuth'
import { presentMe } from './presentMe'

export function meRoutes(deps: AppDeps) {
  const router = Router()
  router.get('/', requireAuth, async (req, res) => {
    res.json({ user: await presentMe(deps.models, req.user!) })
  })
  return router
}
