import { z } from 'zod'
import { roleSchema } from './auth.schema'

/** Things an admin can tick when approving a therapist; the approval records which ones were checked. */
export const approvalChecks = [
  { id: 'registration', label: 'Registration found on the professional register' },
  { id: 'identity', label: 'Identity matches the registration' },
  { id: 'practice', label: 'Works at the named practice' },
] as const
export type ApprovalCheckId = (typeof approvalChecks)[number]['id']

export const approveSchema = z.object({
  checks: z
    .array(z.enum(approvalChecks.map((c) => c.id) as [ApprovalCheckId, ...ApprovalCheckId[]]))
    .min(1, 'Record at least one thing you checked.')
    .refine((a) => new Set(a).size === a.length, 'Each check can be recorded once.'),
  note: z.string().trim().max(500, 'Use at most 500 characters.').optional(),
})
export type Approve = z.infer<typeof approveSchema>

export const idParamSchema = z.object({ id: z.uuid({ error: 'That id is not valid.' }) })

export const accountRowSchema = z.object({
  id: z.string(),
  email: z.string(),
  displayName: z.string(),
  role: roleSchema,
  emailVerified: z.boolean(),
  disabled: z.boolean(),
  createdAt: z.string(),
  therapist: z
    .object({ practice: z.string(), registration: z.string(), approvedAt: z.string().nullable() })
    .nullable(),
})
export type AccountRow = z.infer<typeof accountRowSchema>

export const accountPatchSchema = z.object({ disabled: z.boolean() }).strict()

export const mailSummarySchema = z.object({
  id: z.string(),
  to: z.string(),
  subject: z.string(),
  receivedAt: z.string(),
})
export const mailMessageSchema = mailSummarySchema.extend({ from: z.string(), text: z.string() })
export type MailSummary = z.infer<typeof mailSummarySchema>
export type MailMessage = z.infer<typeof mailMessageSchema>
