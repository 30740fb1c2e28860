import { z } from 'zod'

export const instrumentIdSchema = z.enum(['phq9', 'gad7'], { error: 'The measure must be PHQ-9 or GAD-7.' })

/** One answer 0–3, or null for a question that was skipped. */
export const itemAnswerSchema = z.union([z.literal(0), z.literal(1), z.literal(2), z.literal(3)]).nullable()

/**
 * A questionnaire as filled in on the device (the `measure` field of an entry of kind 'measure'). Answers are kept
 * raw; totals and bands are always recomputed from them by shared/scoring, never stored.
 */
export const measureBodySchema = z
  .object({
    instrument: instrumentIdSchema,
    answers: z.array(itemAnswerSchema).min(7).max(9),
    /** The difficulty question (0 not difficult … 3 extremely); not scored. Absent = not answered. */
    difficulty: z.union([z.literal(0), z.literal(1), z.literal(2), z.literal(3)]).optional(),
    /** Epoch ms when the last question was reached; absent while the form is still in progress. */
    completedAt: z.number().int().nonnegative().optional(),
  })
  .refine((m) => m.answers.length === (m.instrument === 'phq9' ? 9 : 7), {
    message: 'PHQ-9 has 9 answers and GAD-7 has 7.',
    path: ['answers'],
  })
export type MeasureBody = z.infer<typeof measureBodySchema>
export type ItemAnswer = z.infer<typeof itemAnswerSchema>

export const bandSchema = z.enum(['minimal', 'mild', 'moderate', 'moderately severe', 'severe'])
export type Band = z.infer<typeof bandSchema>

/** Where a result came from: filled in by the person in Rungs, or an earlier score entered by the therapist. */
export const measureSourceSchema = z.enum(['person', 'therapist'])
export type MeasureSource = z.infer<typeof measureSourceSchema>

/** Item 9 of the PHQ-9: 'none' = answered 0, 'flag' = above 0, 'unknown' = skipped or not recorded (never taken as 0). */
export const selfHarmItemSchema = z.enum(['none', 'flag', 'unknown'])
export type SelfHarmItem = z.infer<typeof selfHarmItemSchema>

/** One scored result as both sides' screens and exports use it. */
export const measureResultSchema = z.object({
  id: z.string(),
  instrument: instrumentIdSchema,
  takenAt: z.string(),
  total: z.number().int().nullable(),
  band: bandSchema.nullable(),
  /** True when the total was prorated from the answered items (Arrieta et al. 2017 rule). */
  prorated: z.boolean(),
  selfHarm: selfHarmItemSchema.nullable(),
  source: measureSourceSchema,
  /** The raw answers, when the person shared the form (absent for earlier scores entered as totals). */
  answers: z.array(itemAnswerSchema).optional(),
  difficulty: z.number().int().min(0).max(3).optional(),
})
export type MeasureResult = z.infer<typeof measureResultSchema>

const isoDay = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Write the date as YYYY-MM-DD, e.g. 2026-09-14.')

/**
 * One row of the therapist's CSV of earlier scores (intake on paper). Columns: date, measure, total, and for a PHQ-9
 * optionally item9 (leave it empty when unknown; it is never assumed to be 0).
 */
export const earlierScoreRowSchema = z
  .object({
    date: isoDay.refine((d) => !Number.isNaN(Date.parse(`${d}T00:00:00Z`)) && new Date(`${d}T00:00:00Z`).toISOString().startsWith(d), 'That date does not exist.'),
    measure: z
      .string()
      .trim()
      .transform((s) => s.toUpperCase().replace(/[\s_]/g, '').replace('PHQ9', 'PHQ-9').replace('GAD7', 'GAD-7'))
      .pipe(z.enum(['PHQ-9', 'GAD-7'], { error: 'The measure must be PHQ-9 or GAD-7.' })),
    total: z.coerce.number({ error: 'The total must be a whole number.' }).int('The total must be a whole number.').min(0, 'The total cannot be below 0.'),
    item9: z
      .union([z.literal(''), z.coerce.number().int().min(0).max(3)], { error: 'item9 must be 0, 1, 2 or 3, or empty.' })
      .optional()
      .transform((v) => (v === '' || v === undefined ? undefined : v)),
  })
  .superRefine((row, ctx) => {
    const max = row.measure === 'PHQ-9' ? 27 : 21
    if (row.total > max) ctx.addIssue({ code: 'custom', path: ['total'], message: `A ${row.measure} total is at most ${max}.` })
    if (row.measure === 'GAD-7' && row.item9 !== undefined) ctx.addIssue({ code: 'custom', path: ['item9'], message: 'item9 belongs to the PHQ-9 only.' })
  })
export type EarlierScoreRow = z.infer<typeof earlierScoreRowSchema>

/** An earlier score as stored by the server and shown on both sides. */
export const earlierScoreViewSchema = z.object({
  id: z.string(),
  instrument: instrumentIdSchema,
  takenOn: z.string(),
  total: z.number().int(),
  item9: z.number().int().nullable(),
  enteredBy: z.string(),
  enteredAt: z.string(),
})
export type EarlierScoreView = z.infer<typeof earlierScoreViewSchema>

/** Per-measure summary for the therapist's caseload column. */
export const measureSummarySchema = z.object({
  latest: z.number().int(),
  band: bandSchema,
  takenAt: z.string(),
  /** Latest minus first (negative = fewer symptoms); null with only one score. */
  changeSinceFirst: z.number().int().nullable(),
  source: measureSourceSchema,
})
export type MeasureSummary = z.infer<typeof measureSummarySchema>
