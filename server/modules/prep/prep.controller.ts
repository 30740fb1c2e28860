import type { RequestHandler } from 'express'
import type { AppDeps } from '../../deps'
import { sessionRider } from '../../auth/loadSessionUser'
import { CASELOAD_FINGERPRINT_RIDER, caseloadCache } from './caseloadCache'
import * as prep from './prep.service'

export function prepController(deps: AppDeps) {
  // One per app: a cached answer is reused only while the database's fingerprint still matches (caseloadCache.ts).
  const caseloads = caseloadCache(deps)
  const ids = (p: Record<string, unknown>) => ({ linkId: String(p.linkId), noteId: String(p.noteId), entryId: String(p.entryId) })
  return {
    caseload: (async (req, res) => {
      const readAhead = sessionRider(req.user, CASELOAD_FINGERPRINT_RIDER)
      const { body, etag } = await caseloads.get(req.user!.id, typeof readAhead === 'string' ? readAhead : undefined)
      // With the ETag set, res.send answers a matching If-None-Match with 304 and does not hash the body again.
      res.setHeader('ETag', etag)
      res.type('json').send(body)
    }) satisfies RequestHandler,
    readShares: (async (req, res) => {
      // Shared content must not linger in shared caches or the browser's disk cache.
      res.setHeader('Cache-Control', 'no-store')
      res.json({ shares: await prep.readShares(deps, req.user!.id, ids(req.params).linkId) })
    }) satisfies RequestHandler,
    patchShare: (async (req, res) => {
      const { linkId, entryId } = ids(req.params)
      res.json({ share: await prep.patchShare(deps, req.user!.id, linkId, entryId, req.body) })
    }) satisfies RequestHandler,
    notes: (async (req, res) => {
      res.setHeader('Cache-Control', 'no-store')
      res.json({ notes: await prep.listNotes(deps, req.user!.id, ids(req.params).linkId) })
    }) satisfies RequestHandler,
    addNote: (async (req, res) => {
      res.status(201).json({ note: await prep.addNote(deps, req.user!.id, ids(req.params).linkId, req.body.text) })
    }) satisfies RequestHandler,
    editNote: (async (req, res) => {
      const { linkId, noteId } = ids(req.params)
      res.json({ note: await prep.editNote(deps, req.user!.id, linkId, noteId, req.body.text) })
    }) satisfies RequestHandler,
    deleteNote: (async (req, res) => {
      const { linkId, noteId } = ids(req.params)
      await prep.deleteNote(deps, req.user!.id, linkId, noteId)
      res.json({ ok: true })
    }) satisfies RequestHandler,
    exportNotes: (async (req, res) => {
      const { linkId } = ids(req.params)
      // Build the file before setting download headers, so a refusal still answers in the one JSON error shape.
      if ((req.query as { format?: string }).format === 'json') {
        const notes = (await prep.listNotes(deps, req.user!.id, linkId)).reverse()
        res.setHeader('Cache-Control', 'no-store')
        res.attachment(`rungs-notes-${linkId}.json`).json({ linkId, notes })
        return
      }
      const text = await prep.exportNotesText(deps, req.user!.id, linkId)
      res.setHeader('Cache-Control', 'no-store')
      res.attachment(`rungs-notes-${linkId}.txt`).type('text/plain; charset=utf-8').send(text)
    }) satisfies RequestHandler,
  }
}
