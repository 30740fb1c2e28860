import { Router } from 'express'
import { therapistProfilePatchSchema } from '../../../shared/schemas/therapist.schema'
import type { AppDeps } from '../../deps'
import { requireRole } from '../../middleware/requireRole'
import { validate } from '../../middleware/validate'
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
  return router
}
