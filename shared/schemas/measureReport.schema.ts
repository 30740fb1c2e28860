import { z } from 'zod'
import { earlierScoreViewSchema, instrumentIdSchema, measureResultSchema } from './measure.schema'

export const measureChangeSchema = z.enum(['reliable improvement', 'reliable deterioration', 'no reliable change'])

/** shared/scoring/talkingTherapies.ts TalkingTherapiesOutcome, as it crosses the wire. */
export const talkingTherapiesOutcomeSchema = z.object({
  casenessAtStart: z.boolean(),
  casenessAtEnd: z.boolean(),
  recovery: z.boolean().nullable(),
  reliableImprovement: z.boolean(),
  reliableDeterioration: z.boolean(),
  reliableRecovery: z.boolean().nullable(),
  measures: z.array(instrumentIdSchema),
})

/** GET /api/therapist/links/:linkId/measures: scored results oldest first, the course outcome and per-measure change. */
export const linkMeasuresSchema = z.object({
  results: z.array(measureResultSchema),
  outcome: talkingTherapiesOutcomeSchema.nullable(),
  changes: z.object({ phq9: measureChangeSchema.optional(), gad7: measureChangeSchema.optional() }),
})
export type LinkMeasures = z.infer<typeof linkMeasuresSchema>

export const earlierScoresResponseSchema = z.object({ scores: z.array(earlierScoreViewSchema) })

/** The per-row answer to a CSV that did not pass: `details.rows` of the 400 `invalid_csv` error. */
export const earlierScoreRowErrorsSchema = z.object({ rows: z.array(z.object({ row: z.number().int(), errors: z.array(z.string()) })) })
export type EarlierScoreRowErrors = z.infer<typeof earlierScoreRowErrorsSchema>

export const earlierScoreParamsSchema = z.object({
  linkId: z.uuid({ error: 'That link id is not valid.' }),
  id: z.uuid({ error: 'That score id is not valid.' }),
})

/** The columns the upload expects, with an example, for the dialog and the error message alike. */
export const earlierScoresCsvExample = 'date,measure,total,item9\n2026-08-03,PHQ-9,16,1\n2026-08-03,GAD-7,12,'
