import type { RequestHandler } from 'express'
import type { AppDeps } from '../../deps'
import * as links from './links.service'

export function linksController(deps: AppDeps) {
  return {
    createInvitation: (async (req, res) => {
      res.status(201).json(await links.createInvitation(deps, req.user!, req.body.email))
    }) satisfies RequestHandler,
    listInvitations: (async (req, res) => {
      res.json({ invitations: await links.listOpenInvitations(deps, req.user!.id) })
    }) satisfies RequestHandler,
    preview: (async (req, res) => {
      res.json({ preview: await links.previewLink(deps, req.user!, req.body.code) })
    }) satisfies RequestHandler,
    confirm: (async (req, res) => {
      res.status(201).json({ link: await links.confirmLink(deps, req.user!, req.body.code) })
    }) satisfies RequestHandler,
    personLinks: (async (req, res) => {
      res.json({ links: await links.listPersonLinks(deps, req.user!.id) })
    }) satisfies RequestHandler,
    therapistLinks: (async (req, res) => {
      res.json({ links: await links.listTherapistLinks(deps, req.user!.id) })
    }) satisfies RequestHandler,
    end: (async (req, res) => {
      res.json(await links.endLink(deps, req.user!, String(req.params.linkId)))
    }) satisfies RequestHandler,
    addAppointment: (async (req, res) => {
      res.status(201).json({ appointment: await links.addAppointment(deps, req.user!.id, String(req.params.linkId), new Date(req.body.at)) })
    }) satisfies RequestHandler,
    appointments: (async (req, res) => {
      res.json({ appointments: await links.listAppointments(deps, req.user!.id, String(req.params.linkId)) })
    }) satisfies RequestHandler,
  }
}
