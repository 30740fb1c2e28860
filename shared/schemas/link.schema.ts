import { z } from 'zod'
import { emailSchema } from './auth.schema'
import { approvalSchema } from './user.schema'

// Unambiguous letters and digits: no 0/O, 1/I/L, so a code read aloud or copied by hand is typed right.
export const inviteCodeAlphabet = 'ABCDEFGHJKMNPQRSTUVWXYZ23456789'
export const inviteCodeLength = 8

/** Accepts "abcd-2345", "ABCD 2345" or "ABCD2345"; yields the 8 bare upper-case characters. */
export const inviteCodeSchema = z
  .string({ error: 'Enter the code you were given.' })
  .transform((s) => s.toUpperCase().replace(/[^A-Z0-9]/g, ''))
  .pipe(z.string().regex(new RegExp(`^[${inviteCodeAlphabet}]{${inviteCodeLength}}$`), 'A code has 8 letters and digits, like ABCD-2345.'))

export const invitationCreateSchema = z.object({ email: emailSchema.optional() }).strict()
export type InvitationCreate = z.infer<typeof invitationCreateSchema>

export const invitationRowSchema = z.object({
  id: z.string(),
  email: z.string().nullable(),
  createdAt: z.string(),
  expiresAt: z.string(),
})
export type InvitationRow = z.infer<typeof invitationRowSchema>

/** Returned once, when the code is made; the server keeps only its hash. */
export const invitationCreatedSchema = z.object({ invitation: invitationRowSchema, code: z.string() })

export const linkCodeBodySchema = z.object({ code: inviteCodeSchema }).strict()
export type LinkCodeBody = z.infer<typeof linkCodeBodySchema>

/** Said wherever sharing is set up (DESIGN.md, Safety). */
export const notWatchedCaution = 'Your therapist is not watching Rungs in real time. If you are in danger, use Help now to call your local emergency number.'

export const linkPreviewSchema = z.object({
  therapist: z.object({ displayName: z.string(), practice: z.string(), registration: z.string(), approval: approvalSchema.nullable() }),
  expiresAt: z.string(),
  caution: z.string(),
})
export type LinkPreview = z.infer<typeof linkPreviewSchema>

export const linkStateSchema = z.enum(['pending', 'active', 'ended'])

export const personLinkRowSchema = z.object({
  id: z.string(),
  state: linkStateSchema,
  startedAt: z.string().nullable(),
  endedAt: z.string().nullable(),
  endedBy: z.enum(['person', 'therapist']).nullable(),
  therapist: z.object({ displayName: z.string(), practice: z.string(), registration: z.string(), approval: approvalSchema.nullable() }),
  nextAppointment: z.string().nullable(),
  /** The latest past appointment (ISO), or null: where "since the last session" starts on the summary. */
  lastSessionAt: z.string().nullable(),
})
export type PersonLinkRow = z.infer<typeof personLinkRowSchema>

export const therapistLinkRowSchema = z.object({
  id: z.string(),
  state: linkStateSchema,
  startedAt: z.string().nullable(),
  endedAt: z.string().nullable(),
  endedBy: z.enum(['person', 'therapist']).nullable(),
  person: z.object({ displayName: z.string() }),
  nextAppointment: z.string().nullable(),
})
export type TherapistLinkRow = z.infer<typeof therapistLinkRowSchema>

export const linkIdParamSchema = z.object({ linkId: z.uuid({ error: 'That link id is not valid.' }) })

export const appointmentCreateSchema = z.object({ at: z.iso.datetime({ offset: true, error: 'Give the date and time, e.g. 2026-12-08T10:00:00Z.' }) }).strict()
export type AppointmentCreate = z.infer<typeof appointmentCreateSchema>
export const appointmentRowSchema = z.object({ id: z.string(), at: z.string() })
export type AppointmentRow = z.infer<typeof appointmentRowSchema>
