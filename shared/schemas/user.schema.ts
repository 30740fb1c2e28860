import { z } from 'zod'
import { roleSchema } from './auth.schema'

export const approvalSchema = z.object({
  approvedAt: z.string(),
  approvedByName: z.string(),
  checks: z.array(z.string()),
  note: z.string().nullable(),
})
export type Approval = z.infer<typeof approvalSchema>

export const therapistProfileSchema = z.object({
  practice: z.string(),
  registration: z.string(),
  approval: approvalSchema.nullable(),
})
export type TherapistProfile = z.infer<typeof therapistProfileSchema>

/** What the server tells a signed-in user about themselves. Never carries the password hash. */
export const meSchema = z.object({
  id: z.string(),
  email: z.string(),
  displayName: z.string(),
  role: roleSchema,
  emailVerified: z.boolean(),
  emailNotices: z.boolean(),
  therapist: therapistProfileSchema.nullable(),
})
export type Me = z.infer<typeof meSchema>

export const preferencesSchema = z.object({
  displayName: z.string().trim().min(1, 'Enter a name.').max(80, 'Use at most 80 characters.').optional(),
  emailNotices: z.boolean().optional(),
}).strict()
export type Preferences = z.infer<typeof preferencesSchema>
