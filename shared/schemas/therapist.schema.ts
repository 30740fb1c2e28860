import { z } from 'zod'

export const therapistProfilePatchSchema = z
  .object({
    practice: z.string().trim().min(1, 'Enter the practice name.').max(120, 'Use at most 120 characters.').optional(),
    registration: z.string().trim().min(1, 'Enter your professional registration.').max(200, 'Use at most 200 characters.').optional(),
  })
  .strict()
export type TherapistProfilePatch = z.infer<typeof therapistProfilePatchSchema>
