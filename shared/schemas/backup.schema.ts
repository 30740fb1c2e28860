import { z } from 'zod'
import { entrySchema } from './entry.schema'

/** The value of `format` in every Rungs backup file; anything else is some other program's file. */
export const BACKUP_FORMAT = 'rungs-backup'
/** The newest file layout this build writes and reads. A file with a higher number was made by a newer Rungs. */
export const BACKUP_FORMAT_VERSION = 1
/** The largest backup text Rungs will read: 20 MB, far above years of writing, well below what a phone can hold. */
export const BACKUP_MAX_CHARS = 20 * 1024 * 1024

/** A backup passphrase: long enough to resist guessing, with no upper fuss beyond sanity. */
export const backupPassphraseSchema = z
  .string()
  .min(8, 'Use at least 8 characters.')
  .max(1024, 'That passphrase is too long.')

/** The raw text of a picked file, before JSON parsing. */
export const backupTextSchema = z.string().max(BACKUP_MAX_CHARS)

/**
 * The two fields every version of the format keeps, so Rungs can tell "not a Rungs backup" from "made by a newer Rungs"
 * before it looks at anything else.
 */
export const backupHeaderSchema = z.object({
  format: z.literal(BACKUP_FORMAT),
  formatVersion: z.number().int().min(1),
})
export type BackupHeader = z.infer<typeof backupHeaderSchema>

/** What a backup carries: every entry, as the shared Entry shape. Times are epoch milliseconds. */
export const backupPayloadSchema = z.object({
  exportedAt: z.number().int().nonnegative(),
  entries: z.array(entrySchema),
})
export type BackupPayload = z.infer<typeof backupPayloadSchema>

/** How the key is made from the passphrase. `check` lets a wrong passphrase be told apart from a damaged file. */
export const backupKdfSchema = z.object({
  name: z.literal('PBKDF2'),
  hash: z.literal('SHA-256'),
  iterations: z.number().int().positive(),
  salt: z.base64().min(1),
  check: z.base64().min(1),
})
export type BackupKdf = z.infer<typeof backupKdfSchema>

export const backupCipherSchema = z.object({
  name: z.literal('AES-GCM'),
  iv: z.base64().min(1),
})
export type BackupCipher = z.infer<typeof backupCipherSchema>

/** A file locked with a passphrase: `data` is the encrypted JSON of a BackupPayload. */
export const lockedBackupFileSchema = z.object({
  format: z.literal(BACKUP_FORMAT),
  formatVersion: z.literal(BACKUP_FORMAT_VERSION),
  locked: z.literal(true),
  kdf: backupKdfSchema,
  cipher: backupCipherSchema,
  data: z.base64().min(1),
})
export type LockedBackupFile = z.infer<typeof lockedBackupFileSchema>

/** A file anyone can read: the payload in plain JSON. */
export const unlockedBackupFileSchema = z.object({
  format: z.literal(BACKUP_FORMAT),
  formatVersion: z.literal(BACKUP_FORMAT_VERSION),
  locked: z.literal(false),
  exportedAt: backupPayloadSchema.shape.exportedAt,
  entries: backupPayloadSchema.shape.entries,
})
export type UnlockedBackupFile = z.infer<typeof unlockedBackupFileSchema>

export const backupFileSchema = z.discriminatedUnion('locked', [lockedBackupFileSchema, unlockedBackupFileSchema])
export type BackupFile = z.infer<typeof backupFileSchema>
