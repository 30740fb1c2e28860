import { Op } from 'sequelize'
import { notWatchedCaution, type AppointmentRow, type InvitationRow, type LinkPreview, type PersonLinkRow, type TherapistLinkRow } from '../../../shared/schemas/link.schema'
import type { AppDeps } from '../../deps'
import type { Link } from '../../db/models/Link'
import type { User } from '../../db/models/User'
import { invitationMail, linkEndedMail, linkStartedMail } from '../../mail/templates/linkMail'
import { HttpError } from '../../middleware/HttpError'
import { presentApproval } from '../me/presentMe'
import { displayInviteCode, hashInviteCode, newInviteCode } from './inviteCode'
import { clock, linkOfEitherSide, linkOfTherapist, sendNotice } from './linkAccess'

type Deps = Pick<AppDeps, 'models' | 'sequelize' | 'mailer' | 'log' | 'config' | 'now'>

const INVITATION_LIFETIME_MS = 7 * 24 * 60 * 60 * 1000

const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null)

/**
 * Makes a single-use invitation that expires in 7 days, and e-mails it when an address is given. Returns the code for
 * display once; only its SHA-256 is kept.
 */
export async function createInvitation(deps: Deps, therapist: User, email: string | undefined): Promise<{ invitation: InvitationRow; code: string }> {
  const now = clock(deps)
  const code = newInviteCode()
  const row = await deps.models.Invitation.create({
    therapistId: therapist.id,
    codeHash: hashInviteCode(code),
    expiresAt: new Date(now.getTime() + INVITATION_LIFETIME_MS),
    email: email ?? null,
    usedAt: null,
  })
  await deps.models.AuditEvent.create({ actorId: therapist.id, action: 'invitation.created', subjectUserId: null, subjectId: row.id })
  if (email) {
    try {
      await deps.mailer.send(invitationMail(email, therapist.displayName, displayInviteCode(code), deps.config.appUrl))
    } catch (err) {
      deps.log.warn({ err }, 'mail: an invitation could not be sent')
    }
  }
  return { invitation: toInvitationRow(row), code: displayInviteCode(code) }
}

function toInvitationRow(row: { id: string; email: string | null; createdAt: Date; expiresAt: Date }): InvitationRow {
  return { id: row.id, email: row.email, createdAt: row.createdAt.toISOString(), expiresAt: row.expiresAt.toISOString() }
}

/** The therapist's unused, unexpired invitations, newest first. Codes cannot be shown again: only hashes are kept. */
export async function listOpenInvitations(deps: Deps, therapistId: string): Promise<InvitationRow[]> {
  const rows = await deps.models.Invitation.findAll({
    where: { therapistId, usedAt: null, expiresAt: { [Op.gt]: clock(deps) } },
    order: [['createdAt', 'DESC']],
  })
  return rows.map(toInvitationRow)
}

async function openInvitation(deps: Deps, code: string) {
  const invitation = await deps.models.Invitation.findOne({ where: { codeHash: hashInviteCode(code), usedAt: null, expiresAt: { [Op.gt]: clock(deps) } } })
  const therapist = invitation
    ? await deps.models.User.findByPk(invitation.therapistId, { include: [{ model: deps.models.TherapistProfile, as: 'therapistProfile' }] })
    : null
  // An unapproved or disabled therapist's codes stop working, like an unknown one.
  if (!invitation || !therapist || therapist.disabledAt || !therapist.therapistProfile?.approvedAt) {
    throw new HttpError(404, 'not_found', 'That code does not work. It may have expired or been used already; ask for a new one.')
  }
  return { invitation, therapist, profile: therapist.therapistProfile }
}

async function therapistCard(deps: Deps, therapist: User) {
  const profile = therapist.therapistProfile ?? (await deps.models.TherapistProfile.findOne({ where: { userId: therapist.id } }))
  return {
    displayName: therapist.displayName,
    practice: profile?.practice ?? '',
    registration: profile?.registration ?? '',
    approval: profile ? await presentApproval(deps.models, profile) : null,
  }
}

/**
 * Shows who a code belongs to before the person confirms, and records the link as pending: it exists, but nothing can
 * be shared over it until the person confirms. The code stays unused until then.
 */
export async function previewLink(deps: Deps, person: User, code: string): Promise<LinkPreview> {
  const { invitation, therapist } = await openInvitation(deps, code)
  const where = { personId: person.id, therapistId: therapist.id }
  if (await deps.models.Link.findOne({ where: { ...where, state: 'active' } })) throw new HttpError(409, 'already_linked', 'You are already linked with this therapist.')
  if (!(await deps.models.Link.findOne({ where: { ...where, state: 'pending' } }))) {
    await deps.models.Link.create({ ...where, state: 'pending', startedAt: null, endedAt: null, endedBy: null })
  }
  return { therapist: await therapistCard(deps, therapist), expiresAt: invitation.expiresAt.toISOString(), caution: notWatchedCaution }
}

/**
 * Confirms a code: the link becomes active and the invitation is used, in one transaction. A second active link with the
 * same therapist is a 409. Both sides get a notice (if they want notices), without content.
 */
export async function confirmLink(deps: Deps, person: User, code: string): Promise<PersonLinkRow> {
  const { invitation, therapist } = await openInvitation(deps, code)
  const now = clock(deps)
  const existing = await deps.models.Link.findOne({ where: { personId: person.id, therapistId: therapist.id, state: 'active' } })
  if (existing) throw new HttpError(409, 'already_linked', 'You are already linked with this therapist.')
  const link = await deps.sequelize.transaction(async (transaction) => {
    // The conditional update lets only one of two racing confirmations use the code.
    const [used] = await deps.models.Invitation.update({ usedAt: now }, { where: { id: invitation.id, usedAt: null }, transaction })
    if (used !== 1) throw new HttpError(404, 'not_found', 'That code does not work. It may have expired or been used already; ask for a new one.')
    // The pending link from the preview becomes active; a confirmation without a preview creates it directly.
    const pending = await deps.models.Link.findOne({ where: { personId: person.id, therapistId: therapist.id, state: 'pending' }, transaction })
    const created = pending
      ? await pending.update({ state: 'active', startedAt: now }, { transaction })
      : await deps.models.Link.create({ personId: person.id, therapistId: therapist.id, state: 'active', startedAt: now, endedAt: null, endedBy: null }, { transaction })
    await deps.models.AuditEvent.create({ actorId: person.id, action: 'link.started', subjectUserId: person.id, subjectId: created.id }, { transaction })
    return created
  })
  await sendNotice(deps, person, linkStartedMail(person.email, person.displayName, therapist.displayName))
  await sendNotice(deps, therapist, linkStartedMail(therapist.email, therapist.displayName, person.displayName))
  return presentPersonLink(deps, link, therapist)
}

async function nextAppointment(deps: Deps, linkId: string): Promise<Date | null> {
  const next = await deps.models.Appointment.findOne({ where: { linkId, at: { [Op.gt]: clock(deps) } }, order: [['at', 'ASC']] })
  return next?.at ?? null
}

/** The latest appointment already past: "since the last session" on the person's summary starts here. */
async function lastAppointment(deps: Deps, linkId: string): Promise<Date | null> {
  const last = await deps.models.Appointment.findOne({ where: { linkId, at: { [Op.lte]: clock(deps) } }, order: [['at', 'DESC']] })
  return last?.at ?? null
}

const endedByRole = (link: Link): 'person' | 'therapist' | null => (!link.endedBy ? null : link.endedBy === link.personId ? 'person' : 'therapist')

async function presentPersonLink(deps: Deps, link: Link, therapist: User): Promise<PersonLinkRow> {
  return {
    id: link.id,
    state: link.state,
    startedAt: iso(link.startedAt),
    endedAt: iso(link.endedAt),
    endedBy: endedByRole(link),
    therapist: await therapistCard(deps, therapist),
    nextAppointment: link.state === 'active' ? iso(await nextAppointment(deps, link.id)) : null,
    lastSessionAt: iso(await lastAppointment(deps, link.id)),
  }
}

/** The person's own links, newest first, with the therapist's card and the next appointment. */
export async function listPersonLinks(deps: Deps, personId: string): Promise<PersonLinkRow[]> {
  const links = await deps.models.Link.findAll({
    where: { personId },
    include: [{ model: deps.models.User, as: 'therapist', include: [{ model: deps.models.TherapistProfile, as: 'therapistProfile' }] }],
    order: [['createdAt', 'DESC']],
  })
  return Promise.all(links.map((l) => presentPersonLink(deps, l, l.therapist!)))
}

/** The therapist's own links, newest first. Only the person's chosen display name is shown. */
export async function listTherapistLinks(deps: Deps, therapistId: string): Promise<TherapistLinkRow[]> {
  const links = await deps.models.Link.findAll({ where: { therapistId }, include: [{ model: deps.models.User, as: 'person' }], order: [['createdAt', 'DESC']] })
  return Promise.all(
    links.map(async (l) => ({
      id: l.id,
      state: l.state,
      startedAt: iso(l.startedAt),
      endedAt: iso(l.endedAt),
      endedBy: endedByRole(l),
      person: { displayName: l.person!.displayName },
      nextAppointment: l.state === 'active' ? iso(await nextAppointment(deps, l.id)) : null,
    })),
  )
}

/**
 * Ends a link from either side. Every shared copy is withdrawn in the same transaction: payloads dropped, tombstones kept,
 * and the earlier scores entered for the link are removed, so the therapist's screens have nothing left to show. Ending an ended link changes nothing.
 */
export async function endLink(deps: Deps, user: User, linkId: string): Promise<{ state: 'ended'; endedAt: string }> {
  const link = await linkOfEitherSide(deps, user, linkId)
  if (link.state === 'ended') return { state: 'ended', endedAt: link.endedAt!.toISOString() }
  const now = clock(deps)
  await deps.sequelize.transaction(async (transaction) => {
    await link.update({ state: 'ended', endedAt: now, endedBy: user.id }, { transaction })
    await deps.models.SharedEntry.update({ payload: null, withdrawnAt: now }, { where: { linkId, withdrawnAt: null }, transaction })
    // Copies already tombstoned keep their withdrawal time; any stray payload is dropped all the same.
    await deps.models.SharedEntry.update({ payload: null }, { where: { linkId, payload: { [Op.ne]: null } }, transaction })
    // Earlier scores the therapist entered belong to the link's shared record, so they go with it.
    await deps.models.EarlierScore.destroy({ where: { linkId }, transaction })
    await deps.models.AuditEvent.create({ actorId: user.id, action: 'link.ended', subjectUserId: link.personId, subjectId: link.id }, { transaction })
  })
  const [person, therapist] = await Promise.all([deps.models.User.findByPk(link.personId), deps.models.User.findByPk(link.therapistId)])
  if (person && therapist) {
    await sendNotice(deps, person, linkEndedMail(person.email, person.displayName, therapist.displayName))
    await sendNotice(deps, therapist, linkEndedMail(therapist.email, therapist.displayName, person.displayName))
  }
  return { state: 'ended', endedAt: now.toISOString() }
}

/** Adds a session to an active link of this therapist. */
export async function addAppointment(deps: Deps, therapistId: string, linkId: string, at: Date): Promise<AppointmentRow> {
  await linkOfTherapist(deps, therapistId, linkId)
  const row = await deps.models.Appointment.create({ linkId, at })
  return { id: row.id, at: row.at.toISOString() }
}

/** The sessions of an active link of this therapist, in time order. */
export async function listAppointments(deps: Deps, therapistId: string, linkId: string): Promise<AppointmentRow[]> {
  await linkOfTherapist(deps, therapistId, linkId)
  const rows = await deps.models.Appointment.findAll({ where: { linkId }, order: [['at', 'ASC']] })
  return rows.map((r) => ({ id: r.id, at: r.at.toISOString() }))
}

/** The start of "since the last session": the latest past appointment, else when the link started. */
export async function lastSessionOf(deps: Pick<AppDeps, 'models' | 'now'>, link: Link): Promise<Date | null> {
  const last = await deps.models.Appointment.findOne({ where: { linkId: link.id, at: { [Op.lte]: clock(deps) } }, order: [['at', 'DESC']] })
  return last?.at ?? null
}
