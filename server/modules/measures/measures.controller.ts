import type { RequestHandler } from 'express'
import { measureBundle } from '../../../shared/fhir/measureBundle'
import type { AppDeps } from '../../deps'
import { clock } from '../links/linkAccess'
import { csvTextOf } from './csvUpload'
import { measuresCsv } from './csvExport'
import * as earlier from './earlierScores.service'
import * as measures from './measures.service'

/** A filename part from a display name: letters and digits only, so no header injection and no path. */
const fileSafe = (name: string) => name.replace(/[^A-Za-z0-9]+/g, '-').replace(/^-|-$/g, '').toLowerCase() || 'person'

export function measuresController(deps: AppDeps) {
  const linkIdOf = (req: { params: Record<string, unknown> }) => String(req.params.linkId)
  const personName = async (personId: string) => (await deps.models.User.findByPk(personId, { attributes: ['displayName'] }))?.displayName ?? 'linked person'
  const exported = (therapistId: string, personId: string, linkId: string, format: 'csv' | 'fhir') =>
    deps.models.AuditEvent.create({ actorId: therapistId, action: `measures.exported.${format}`, subjectUserId: personId, subjectId: linkId })

  return {
    list: (async (req, res) => {
      res.setHeader('Cache-Control', 'no-store')
      res.json(await measures.linkMeasures(deps, req.user!.id, linkIdOf(req)))
    }) satisfies RequestHandler,
    csv: (async (req, res) => {
      // Build the file before setting download headers, so a refusal still answers in the one JSON error shape.
      const { link, results, item9 } = await measures.loadLinkMeasures(deps, req.user!.id, linkIdOf(req))
      const name = await personName(link.personId)
      const text = measuresCsv(results, item9, name)
      await exported(req.user!.id, link.personId, link.id, 'csv')
      res.setHeader('Cache-Control', 'no-store')
      res.attachment(`rungs-measures-${fileSafe(name)}.csv`).type('text/csv; charset=utf-8').send(text)
    }) satisfies RequestHandler,
    fhir: (async (req, res) => {
      const { link, results } = await measures.loadLinkMeasures(deps, req.user!.id, linkIdOf(req))
      const name = await personName(link.personId)
      const bundle = measureBundle(results, { generatedAt: clock(deps), subjectDisplay: name })
      await exported(req.user!.id, link.personId, link.id, 'fhir')
      res.setHeader('Cache-Control', 'no-store')
      res.attachment(`rungs-measures-${fileSafe(name)}.fhir.json`).type('application/fhir+json; charset=utf-8').send(JSON.stringify(bundle, null, 2))
    }) satisfies RequestHandler,
    upload: (async (req, res) => {
      res.status(201).json({ scores: await earlier.uploadEarlierScores(deps, req.user!.id, linkIdOf(req), csvTextOf(req)) })
    }) satisfies RequestHandler,
    listEarlier: (async (req, res) => {
      res.setHeader('Cache-Control', 'no-store')
      res.json({ scores: await earlier.listEarlierScoresForTherapist(deps, req.user!.id, linkIdOf(req)) })
    }) satisfies RequestHandler,
    deleteEarlier: (async (req, res) => {
      await earlier.deleteEarlierScore(deps, req.user!.id, linkIdOf(req), String(req.params.id))
      res.json({ ok: true })
    }) satisfies RequestHandler,
    personEarlier: (async (req, res) => {
      res.setHeader('Cache-Control', 'no-store')
      res.json({ scores: await earlier.listEarlierScoresForPerson(deps, req.user!.id, linkIdOf(req)) })
    }) satisfies RequestHandler,
  }
}
