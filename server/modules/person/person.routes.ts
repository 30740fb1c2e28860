import { Router } from 'express'
import { preferencesSchema } from '../../../shared/schemas/user.schema'
import type { AppDeps } from '../../deps'
import { requireRole } from '../../middleware/requireRole'
import { validate } from '../../middleware/validate'
import { presentMe } from '../me/presentMe'
import { updatePreferences } from '../me/preferences.service'

export function personRoutes(deps: AppDeps) {
  const router = Router()
  router.use(requireRole('person'))
  router.patch('/preferences', validate({ body: preferencesSchema }), async (req, res) => {
    const user = await updatePreferences(req.user!, req.body)
    res.json({ user: await presentMe(deps.models, user) })
  })
  return router
}
