import { z } from 'zod'
import { measureBodySchema } from './measure.schema'
import { safetyPlanSchema } from './safetyPlan.schema'

export const entryKindSchema = z.enum(['moment', 'tug', 'measure', 'safetyPlan'])
export type EntryKind = z.infer<typeof entryKindSchema>

// Distress on the subjective-units-of-distress scale, 0–100 (common practice). Absent means "not chosen".
export const distressSchema = z.number().int().min(0).max(100)
// How much a want matters, 0–10.
export const importanceSchema = z.number().int().min(0).max(10)

export const rungSchema = z.object({
  id: z.string().min(1).max(64),
  text: z.string().max(1000),
})
export type Rung = z.infer<typeof rungSchema>

export const wantSchema = z.object({
  text: z.string().max(2000),
  importance: importanceSchema.optional(),
  /** Rungs climbed above this want, lowest first. */
  ladder: z.array(rungSchema).max(100),
})
export type Want = z.infer<typeof wantSchema>

export const shareStateSchema = z.enum(['queued', 'shared', 'withdrawing', 'withdrawn', 'failed'])
export const entryShareSchema = z.object({
  linkId: z.string(),
  state: shareStateSchema,
  sentVersion: z.number().int().min(0),
})

export const tagSchema = z.string().trim().min(1).max(60)

/** One journal entry as stored on the device (DESIGN.md, Data). Times are epoch milliseconds. */
export const entrySchema = z.object({
  id: z.uuid(),
  kind: entryKindSchema,
  /** When it happened; the person can adjust it. */
  createdAt: z.number().int().nonnegative(),
  updatedAt: z.number().int().nonnegative(),
  /** Rises by one with every saved edit; the sharing protocol keys on it. */
  version: z.number().int().min(1),
  body: z.string().max(20000),
  distressBefore: distressSchema.optional(),
  distressAfter: distressSchema.optional(),
  wants: z.array(wantSchema).max(2),
  meetingPoint: z.string().max(2000).optional(),
  backgroundThoughts: z.array(z.string().max(2000)).max(50),
  tags: z.array(tagSchema).max(30),
  shares: z.array(entryShareSchema),
  /** Only on kind 'measure': the questionnaire answers. */
  measure: measureBodySchema.optional(),
  /** Only on kind 'safetyPlan'. */
  safetyPlan: safetyPlanSchema.optional(),
})
export type Entry = z.infer<typeof entrySchema>

/** What a person fills in; the repository adds id, times, version, shares and the search words. */
export const entryInputSchema = entrySchema.omit({ id: true, updatedAt: true, version: true, shares: true }).partial({ createdAt: true })
export type EntryInput = z.infer<typeof entryInputSchema>
