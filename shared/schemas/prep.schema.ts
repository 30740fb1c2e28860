import { z } from 'zod'
import { measureSummarySchema } from './measure.schema'

export const caseloadRowSchema = z.object({
  linkId: z.string(),
  person: z.object({ displayName: z.string() }),
  startedAt: z.string().nullable(),
  lastSessionAt: z.string().nullable(),
  lastSharedAt: z.string().nullable(),
  newSinceLastSession: z.number(),
  toDiscussCount: z.number(),
  nextAppointment: z.string().nullable(),
  riskFlag: z.boolean(),
  /** Latest score, band and change since the first, per measure (shared questionnaires and earlier scores). */
  measures: z.object({ phq9: measureSummarySchema.nullable(), gad7: measureSummarySchema.nullable() }),
})
export type CaseloadRow = z.infer<typeof caseloadRowSchema>

const noteText = z.string().trim().min(1, 'Write something first.').max(20000, 'Use at most 20 000 characters.')
export const prepNoteCreateSchema = z.object({ text: noteText }).strict()
export const prepNotePatchSchema = z.object({ text: noteText }).strict()
export type PrepNoteCreate = z.infer<typeof prepNoteCreateSchema>

export const prepNoteParamsSchema = z.object({ linkId: z.uuid({ error: 'That link id is not valid.' }), noteId: z.uuid({ error: 'That note id is not valid.' }) })
export const prepNoteExportQuerySchema = z.object({ format: z.enum(['text', 'json']).default('text') })

export const prepNoteRowSchema = z.object({ id: z.string(), text: z.string(), createdAt: z.string(), updatedAt: z.string() })
export type PrepNoteRow = z.infer<typeof prepNoteRowSchema>
