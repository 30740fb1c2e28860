import type { RequestHandler } from 'express'
import type { AppDeps } from '../../deps'
import * as admin from './admin.service'

export function adminController(deps: AppDeps) {
  return {
    accounts: (async (_req, res) => {
      res.json({ accounts: await admin.listAccounts(deps) })
    }) satisfies RequestHandler,
    patchAccount: (async (req, res) => {
      res.json({ account: await admin.setDisabled(deps, req.user!, String(req.params.id), req.body.disabled) })
    }) satisfies RequestHandler,
    pending: (async (_req, res) => {
      res.json({ pending: await admin.listPending(deps) })
    }) satisfies RequestHandler,
    approve: (async (req, res) => {
      await admin.approve(deps, req.user!, String(req.params.id), req.body)
      res.json({ ok: true })
    }) satisfies RequestHandler,
    revoke: (async (req, res) => {
      await admin.revokeApproval(deps, req.user!, String(req.params.id))
      res.json({ ok: true })
    }) satisfies RequestHandler,
  }
}
