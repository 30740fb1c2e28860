import { appointmentRowSchema, invitationCreatedSchema, invitationRowSchema, therapistLinkRowSchema, type InvitationCreate } from '@shared/schemas/link.schema'
import { caseloadRowSchema, prepNoteRowSchema } from '@shared/schemas/prep.schema'
import { sharedEntryViewSchema, type SharePatch } from '@shared/schemas/share.schema'
import { z } from 'zod'
import { request } from './http'

const caseloadResponse = z.object({ caseload: z.array(caseloadRowSchema) })
const sharesResponse = z.object({ shares: z.array(sharedEntryViewSchema) })
const sharePatchResponse = z.object({ share: z.object({ entryId: z.string(), readAt: z.string().nullable(), toDiscuss: z.boolean() }) })
const notesResponse = z.object({ notes: z.array(prepNoteRowSchema) })
const noteResponse = z.object({ note: prepNoteRowSchema })
const okResponse = z.object({ ok: z.literal(true) })
const appointmentsResponse = z.object({ appointments: z.array(appointmentRowSchema) })
const appointmentResponse = z.object({ appointment: appointmentRowSchema })
const invitationsResponse = z.object({ invitations: z.array(invitationRowSchema) })
const linksResponse = z.object({ links: z.array(therapistLinkRowSchema) })
const endResponse = z.object({ state: z.literal('ended'), endedAt: z.string() })
const exportResponse = z.object({ linkId: z.string(), notes: z.array(prepNoteRowSchema) })

const base = (linkId: string) => `/api/therapist/links/${encodeURIComponent(linkId)}`

export const fetchCaseload = () => request('GET', '/api/therapist/caseload', undefined, caseloadResponse)
export const fetchLinks = () => request('GET', '/api/therapist/links', undefined, linksResponse)
export const fetchShares = (linkId: string) => request('GET', `${base(linkId)}/shares`, undefined, sharesResponse)
export const patchShare = (linkId: string, entryId: string, patch: SharePatch) =>
  request('PATCH', `${base(linkId)}/shares/${encodeURIComponent(entryId)}`, patch, sharePatchResponse)

export const fetchNotes = (linkId: string) => request('GET', `${base(linkId)}/notes`, undefined, notesResponse)
export const addNote = (linkId: string, text: string) => request('POST', `${base(linkId)}/notes`, { text }, noteResponse)
export const editNote = (linkId: string, noteId: string, text: string) => request('PATCH', `${base(linkId)}/notes/${encodeURIComponent(noteId)}`, { text }, noteResponse)
export const deleteNote = (linkId: string, noteId: string) => request('DELETE', `${base(linkId)}/notes/${encodeURIComponent(noteId)}`, undefined, okResponse)

/**
 * Saves the notes as a plain-text file. The server's JSON export is used because http.ts parses JSON only; the text is
 * laid out here, oldest note first, the same way the server's text export lays it out.
 */
export async function exportNotes(linkId: string, personName: string): Promise<void> {
  const { notes } = await request('GET', `${base(linkId)}/notes/export?format=json`, undefined, exportResponse)
  const head = `Rungs prep notes for ${personName}\nExported ${new Date().toISOString()}\nThese are your working notes; they are never shown in the person's app.\n`
  const body = notes.map((n) => `--- ${n.createdAt}${n.updatedAt !== n.createdAt ? ` (edited ${n.updatedAt})` : ''}\n${n.text}\n`)
  const blob = new Blob([[head, ...body].join('\n')], { type: 'text/plain;charset=utf-8' })
  const url = URL.createObjectURL(blob)
  const a = document.createElement('a')
  a.href = url
  a.download = `rungs-notes-${personName.replace(/[^A-Za-z0-9]+/g, '-').toLowerCase() || 'person'}.txt`
  document.body.appendChild(a)
  a.click()
  a.remove()
  setTimeout(() => URL.revokeObjectURL(url), 1000)
}

export const fetchAppointments = (linkId: string) => request('GET', `${base(linkId)}/appointments`, undefined, appointmentsResponse)
export const addAppointment = (linkId: string, at: string) => request('POST', `${base(linkId)}/appointments`, { at }, appointmentResponse)

export const fetchInvitations = () => request('GET', '/api/therapist/invitations', undefined, invitationsResponse)
export const createInvitation = (body: InvitationCreate) => request('POST', '/api/therapist/invitations', body, invitationCreatedSchema)

export const endLink = (linkId: string) => request('POST', `/api/links/${encodeURIComponent(linkId)}/end`, undefined, endResponse)
