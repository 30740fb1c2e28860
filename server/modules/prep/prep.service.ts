import { Op } from 'sequelize'
import type { Entry } from '../../../shared/schemas/entry.schema'
import type { CaseloadRow, PrepNoteRow } from '../../../shared/schemas/prep.schema'
import type { SharePatch, SharedEntryView } from '../../../shared/schemas/share.schema'
import type { AppDeps } from '../../deps'
import type { PrepNote } from '../../db/models/PrepNote'
import { HttpError } from '../../middleware/HttpError'
import { clock, linkOfTherapist } from '../links/linkAccess'
import { caseloadMeasures } from '../measures/measures.service'
import { recordReads } from '../shares/recordReads'

type Deps = Pick<AppDeps, 'models' | 'sequelize' | 'now'>

const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null)
const asDate = (v: Date | string | null): Date | null => (v === null ? null : v instanceof Date ? v : new Date(v))
const live = { withdrawnAt: null, payload: { [Op.ne]: null } }

/**
 * One row per active link of this therapist: who, when they last shared, how many copies arrived since the last session
 * (the latest past appointment, else the link's start), how many are marked to discuss, the next appointment and whether
 * any live copy carries a risk flag, plus the latest PHQ-9 and GAD-7 with change since the first. A fixed number of
 * queries for the whole caseload, however many people are on it; the measure summaries write their own access-log rows.
 */
export async function caseload(deps: Deps, therapistId: string): Promise<CaseloadRow[]> {
  const links = await deps.models.Link.findAll({
    where: { therapistId, state: 'active' },
    include: [{ model: deps.models.User, as: 'person', attributes: ['id', 'displayName'] }],
    order: [['startedAt', 'ASC']],
  })
  if (!links.length) return []
  const now = clock(deps)
  const ids = links.map((l) => l.id)
  const [measures, shares, appointments] = await Promise.all([
    caseloadMeasures(deps, therapistId, links),
    // Plain rows, not model instances: building 1 000 instances per request cost more than the queries.
    deps.models.SharedEntry.findAll({ where: { linkId: { [Op.in]: ids }, ...live }, attributes: ['linkId', 'sharedAt', 'toDiscuss', 'riskFlag'], raw: true }),
    deps.models.Appointment.findAll({ where: { linkId: { [Op.in]: ids } }, attributes: ['linkId', 'at'], raw: true }),
  ])
  // Raw rows carry the driver's values: SQLite gives dates as text and booleans as 0/1.
  for (const s of shares) Object.assign(s, { sharedAt: asDate(s.sharedAt), toDiscuss: Boolean(s.toDiscuss), riskFlag: Boolean(s.riskFlag) })
  for (const a of appointments) a.at = asDate(a.at)!
  const sharesOf = new Map<string, typeof shares>(ids.map((id) => [id, []]))
  for (const s of shares) sharesOf.get(s.linkId)!.push(s)
  // The same rules as lastSessionOf (the latest appointment at or before now) and the next one strictly after now.
  const lastOf = new Map<string, Date>()
  const nextOf = new Map<string, Date>()
  for (const { linkId, at } of appointments) {
    if (at <= now) {
      const last = lastOf.get(linkId)
      if (!last || at > last) lastOf.set(linkId, at)
    } else {
      const next = nextOf.get(linkId)
      if (!next || at < next) nextOf.set(linkId, at)
    }
  }
  return links.map((link) => {
    const mine = sharesOf.get(link.id)!
    const lastSession = lastOf.get(link.id) ?? null
    const since = lastSession ?? link.startedAt
    const lastShared = mine.reduce<Date | null>((max, s) => (s.sharedAt && (!max || s.sharedAt > max) ? s.sharedAt : max), null)
    return {
      linkId: link.id,
      person: { displayName: link.person!.displayName },
      startedAt: iso(link.startedAt),
      lastSessionAt: iso(lastSession),
      lastSharedAt: iso(lastShared),
      newSinceLastSession: mine.filter((s) => s.sharedAt && (!since || s.sharedAt > since)).length,
      toDiscussCount: mine.filter((s) => s.toDiscuss).length,
      nextAppointment: iso(nextOf.get(link.id)),
      riskFlag: mine.some((s) => s.riskFlag),
      measures: measures.get(link.id) ?? { phq9: null, gad7: null },
    }
  })
}

/**
 * The live shared copies of one active link, newest first. Returning content is what "opened" means in the person's access
 * log, so each returned entry gets an audit row (actor: therapist; subjectUserId: person; subjectId: the shared copy's id,
 * which names link and entry together) in the same transaction as the read, at most one per copy and version per
 * READ_WINDOW_MS (recordReads). An empty answer writes nothing.
 */
export async function readShares(deps: Deps, therapistId: string, linkId: string): Promise<SharedEntryView[]> {
  const link = await linkOfTherapist(deps, therapistId, linkId)
  return deps.sequelize.transaction(async (transaction) => {
    const rows = await deps.models.SharedEntry.findAll({ where: { linkId, ...live }, order: [['sharedAt', 'DESC']], transaction })
    await recordReads(deps, therapistId, rows.map((r) => ({ id: r.id, personId: link.personId, sharedAt: r.sharedAt })), transaction)
    return rows.map((r) => ({
      entryId: r.entryId,
      kind: r.kind,
      version: r.version,
      payload: JSON.parse(r.payload!) as Entry,
      sharedAt: iso(r.sharedAt),
      readAt: iso(r.readAt),
      toDiscuss: r.toDiscuss,
      riskFlag: r.riskFlag,
    }))
  })
}

/** Marks a live shared copy read or unread, and to discuss or not. Answers with the flags only, never the payload. */
export async function patchShare(deps: Deps, therapistId: string, linkId: string, entryId: string, patch: SharePatch) {
  await linkOfTherapist(deps, therapistId, linkId)
  const row = await deps.models.SharedEntry.findOne({ where: { linkId, entryId, ...live } })
  if (!row) throw new HttpError(404, 'not_found', 'There is no such shared entry.')
  await row.update({
    ...(patch.read === undefined ? {} : { readAt: patch.read ? (row.readAt ?? clock(deps)) : null }),
    ...(patch.toDiscuss === undefined ? {} : { toDiscuss: patch.toDiscuss }),
  })
  return { entryId: row.entryId, readAt: iso(row.readAt), toDiscuss: row.toDiscuss }
}

const toNoteRow = (n: PrepNote): PrepNoteRow => ({ id: n.id, text: n.text, createdAt: n.createdAt.toISOString(), updatedAt: n.updatedAt.toISOString() })

/** The therapist's own working notes on a link, newest first. They outlive the link, and are never shown to the person. */
export async function listNotes(deps: Deps, therapistId: string, linkId: string): Promise<PrepNoteRow[]> {
  await linkOfTherapist(deps, therapistId, linkId, { anyState: true })
  const notes = await deps.models.PrepNote.findAll({ where: { linkId, therapistId }, order: [['createdAt', 'DESC']] })
  return notes.map(toNoteRow)
}

/** Adds a note to an active link. */
export async function addNote(deps: Deps, therapistId: string, linkId: string, text: string): Promise<PrepNoteRow> {
  await linkOfTherapist(deps, therapistId, linkId)
  return toNoteRow(await deps.models.PrepNote.create({ linkId, therapistId, text }))
}

async function ownNote(deps: Deps, therapistId: string, linkId: string, noteId: string) {
  await linkOfTherapist(deps, therapistId, linkId, { anyState: true })
  const note = await deps.models.PrepNote.findOne({ where: { id: noteId, linkId, therapistId } })
  if (!note) throw new HttpError(404, 'not_found', 'There is no such note.')
  return note
}

/** Edits one of the therapist's own notes; after the link has ended the notes stay as they were. */
export async function editNote(deps: Deps, therapistId: string, linkId: string, noteId: string, text: string): Promise<PrepNoteRow> {
  await linkOfTherapist(deps, therapistId, linkId)
  const note = await ownNote(deps, therapistId, linkId, noteId)
  return toNoteRow(await note.update({ text }))
}

/** Deletes one of the therapist's own notes. */
export async function deleteNote(deps: Deps, therapistId: string, linkId: string, noteId: string): Promise<void> {
  const note = await ownNote(deps, therapistId, linkId, noteId)
  await note.destroy()
}

/** The therapist's notes on one link as a plain-text file, oldest first, for their own records. */
export async function exportNotesText(deps: Deps, therapistId: string, linkId: string): Promise<string> {
  const link = await linkOfTherapist(deps, therapistId, linkId, { anyState: true })
  const person = await deps.models.User.findByPk(link.personId)
  const notes = (await listNotes(deps, therapistId, linkId)).reverse()
  const head = `Working notes: ${person?.displayName ?? 'linked person'} (link ${link.id})\nExported ${clock(deps).toISOString()}\n`
  return [head, ...notes.map((n) => `--- ${n.createdAt}${n.updatedAt !== n.createdAt ? ` (edited ${n.updatedAt})` : ''}\n${n.text}\n`)].join('\n')
}
