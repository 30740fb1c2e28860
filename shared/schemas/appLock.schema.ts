import { z } from 'zod'

/** A passcode for the app lock: 4 to 12 digits, or any text of at least 4 characters. */
export const passcodeSchema = z
  .string({ error: 'Enter a passcode.' })
  .min(4, 'Use at least 4 characters or digits.')
  .max(128, 'Use at most 128 characters.')
  .refine((v) => !/^\d+$/.test(v) || v.length <= 12, 'Use at most 12 digits.')

/** How long the app may sit unused before it locks; 0 = as soon as the person leaves it. */
export const lockIdleMinutes = [0, 1, 5, 15] as const
export type LockIdleMinutes = (typeof lockIdleMinutes)[number]
