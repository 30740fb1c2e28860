import { Router } from 'express'
import { accountPatchSchema, approveSchema, idParamSchema } from '../../../shared/schemas/admin.schema'
import type { AppDeps } from '../../deps'
import { requireRole } from '../../middleware/requireRole'
import { validate } from '../../middleware/validate'
import { adminController } from './admin.controller'

export function adminRoutes(deps: AppDeps) {
  const c = adminController(deps)
  const router = Router()
  router.use(requireRole('admin'))
  router.get('/accounts', c.accounts)
  router.patch('/accounts/:id', validate({ params: idParamSchema, body: accountPatchSchema }), c.patchAccount)
  router.get('/approvals', c.pending)
  router.post('/approvals/:id', validate({ params: idParamSchema, body: approveSchema }), c.approve)
  router.delete('/approvals/:id', validate({ params: idParamSchema }), c.revoke)
  return router
}
