import { Router } from 'express'
import { therapistProfilePatchSchema } from '../../../shared/schemas/therapist.schema'
import { preferencesSchema } from '../../../shared/schemas/user.schema'
import type { AppDeps } from '../../deps'
import { requireRole } from '../../middleware/requireRole'
import { validate } from '../../middleware/validate'
import { updatePreferences } from '../me/preferences.service'
import { presentMe } from '../me/presentMe'
import { updateProfile } from './therapist.service'

export function therapistRoutes(deps: AppDeps) {
  const router = Router()
  router.use(requireRole('therapist'))
  router.get('/profile', async (req, res) => {
    const me = await presentMe(deps.models, req.user!)
    res.json({ profile: me.therapist })
  })
  router.patch('/profile', validate({ body: therapistProfilePatchSchema }), async (req, res) => {
    await updateProfile(deps, req.user!.id, req.body)
    const user = await deps.models.User.findByPk(req.user!.id)
    res.json({ profile: (await presentMe(deps.models, user!)).therapist })
  })
  router.patch('/preferences', validate({ body: preferencesSchema }), async (req, res) => {
    const user = await updatePreferences(req.user!, req.body)
    res.json({ user: await presentMe(deps.models, user) })
  })
  return router
}
