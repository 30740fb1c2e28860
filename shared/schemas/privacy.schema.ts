import { z } from 'zod'

/** Closing an account asks for the password again, so a device left signed in cannot close it. */
export const closeAccountSchema = z
  .object({ password: z.string({ error: 'Enter your password.' }).min(1, 'Enter your password.').max(256) })
  .strict()
export type CloseAccount = z.infer<typeof closeAccountSchema>

/** The format name and version of the account download, so a reader can tell what it holds. */
export const ACCOUNT_EXPORT_FORMAT = 'rungs-account-export'
export const ACCOUNT_EXPORT_VERSION = 1

/** The message the server gives a therapist or admin who tries to close their own account. */
export const staffCloseMessage = 'Ask the practice admin to close a therapist account.'
