import { z } from 'zod'

export const emailSchema = z
  .string({ error: 'Enter an e-mail address.' })
  .trim()
  .toLowerCase()
  .max(254, 'That e-mail address is too long.')
  .pipe(z.email({ error: 'Enter a valid e-mail address.' }))

/** Characters as a person counts them: Unicode code points, so an emoji is one, not two UTF-16 units. */
export const codePointLength = (s: string) => [...s].length

// NIST SP 800-63B 5.1.1.2: at least 8 characters, no composition rules; a generous upper bound stops hashing abuse.
// The common-password and context checks run on the server only (server/auth/commonPasswords.ts), so the list
// never lands in the client bundle.
export const passwordSchema = z
  .string({ error: 'Enter a password.' })
  .max(1024, 'Use at most 256 characters.')
  .refine((s) => codePointLength(s) >= 8, 'Use at least 8 characters.')
  .refine((s) => codePointLength(s) <= 256, 'Use at most 256 characters.')

export const displayNameSchema = z
  .string({ error: 'Enter a name.' })
  .trim()
  .min(1, 'Enter a name.')
  .max(80, 'Use at most 80 characters.')

export const roleSchema = z.enum(['person', 'therapist', 'admin'])
export type Role = z.infer<typeof roleSchema>

export const signUpSchema = z.discriminatedUnion('role', [
  z.object({
    role: z.literal('person'),
    email: emailSchema,
    password: passwordSchema,
    displayName: displayNameSchema,
  }),
  z.object({
    role: z.literal('therapist'),
    email: emailSchema,
    password: passwordSchema,
    displayName: displayNameSchema,
    practice: z.string().trim().min(1, 'Enter the practice name.').max(120, 'Use at most 120 characters.'),
    registration: z
      .string()
      .trim()
      .min(1, 'Enter your professional registration.')
      .max(200, 'Use at most 200 characters.'),
  }),
], { error: 'Choose whether you are a person in therapy or a therapist.' })
export type SignUp = z.infer<typeof signUpSchema>

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string({ error: 'Enter your password.' }).min(1, 'Enter your password.').max(256),
})
export type SignIn = z.infer<typeof signInSchema>

// Tokens are 32 random bytes in base64url: 43 characters.
export const tokenSchema = z.string({ error: 'The link is incomplete.' }).regex(/^[A-Za-z0-9_-]{43}$/, 'The link is incomplete or damaged.')

export const verifySchema = z.object({ token: tokenSchema })
export const resetRequestSchema = z.object({ email: emailSchema })
export const resetConfirmSchema = z.object({ token: tokenSchema, password: passwordSchema })
