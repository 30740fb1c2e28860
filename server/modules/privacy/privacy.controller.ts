import type { RequestHandler } from 'express'
import { staffCloseMessage } from '../../../shared/schemas/privacy.schema'
import type { AppDeps } from '../../deps'
import { HttpError } from '../../middleware/HttpError'
import * as privacy from './privacy.service'

export function privacyController(deps: AppDeps) {
  return {
    /** Therapist and admin accounts are closed by an admin, so they are told so before anything else is checked. */
    onlyPersonCloses: ((req, _res, next) => {
      if (req.user!.role === 'admin') throw new HttpError(403, 'forbidden', 'Ask another admin to close an admin account.')
      if (req.user!.role !== 'person') throw new HttpError(403, 'forbidden', staffCloseMessage)
      next()
    }) satisfies RequestHandler,
    exportAccount: (async (req, res) => {
      const data = await privacy.exportAccount(deps, req.user!)
      const day = data.exportedAt.slice(0, 10)
      res.setHeader('Cache-Control', 'no-store')
      res.attachment(`rungs-account-${day}.json`)
      res.type('application/json').send(JSON.stringify(data, null, 2))
    }) satisfies RequestHandler,
    closeAccount: (async (req, res, next) => {
      await privacy.closeAccount(deps, req.user!, req.body.password)
      // The rows are gone already; ending this request's session too stops it being saved again on the way out.
      req.session.destroy((err) => {
        if (err) return next(err)
        res.clearCookie('rungs.sid', { path: '/' })
        res.json({ message: 'Your account is closed. Everything the server held for it has been removed.' })
      })
    }) satisfies RequestHandler,
  }
}
