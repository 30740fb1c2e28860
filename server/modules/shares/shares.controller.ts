import type { RequestHandler } from 'express'
import type { AppDeps } from '../../deps'
import * as shares from './shares.service'

export function sharesController(deps: AppDeps) {
  return {
    put: (async (req, res) => {
      res.json(await shares.putShare(deps, req.user!.id, String(req.params.linkId), String(req.params.entryId), req.body.version, req.body.payload))
    }) satisfies RequestHandler,
    del: (async (req, res) => {
      const { version } = req.query as unknown as { version: number }
      res.json(await shares.deleteShare(deps, req.user!.id, String(req.params.linkId), String(req.params.entryId), version))
    }) satisfies RequestHandler,
    states: (async (req, res) => {
      res.json({ shares: await shares.listPersonShareStates(deps, req.user!.id, String(req.params.linkId)) })
    }) satisfies RequestHandler,
    accessLog: (async (req, res) => {
      res.json({ events: await shares.accessLog(deps, req.user!.id, String(req.params.linkId)) })
    }) satisfies RequestHandler,
  }
}
