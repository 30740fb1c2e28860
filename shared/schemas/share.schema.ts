import { z } from 'zod'
import { entrySchema } from './entry.schema'

export const shareParamsSchema = z.object({
  linkId: z.uuid({ error: 'That link id is not valid.' }),
  entryId: z.uuid({ error: 'That entry id is not valid.' }),
})

/** PUT /api/links/:linkId/shares/:entryId. The version is the entry's own, so payload.version must match it. */
export const sharePutSchema = z
  .object({ version: z.number().int().min(1), payload: entrySchema })
  .strict()
  .refine((b) => b.payload.version === b.version, { message: 'payload.version must equal version.', path: ['payload', 'version'] })
export type SharePut = z.infer<typeof sharePutSchema>

/** DELETE /api/links/:linkId/shares/:entryId?version=N */
export const shareDeleteQuerySchema = z.object({ version: z.coerce.number({ error: 'Give the version to withdraw.' }).int().min(1) })
export type ShareDeleteQuery = z.infer<typeof shareDeleteQuerySchema>

export const sharePutResponseSchema = z.object({ status: z.enum(['stored', 'unchanged']), version: z.number() })
export const shareDeleteResponseSchema = z.object({ status: z.enum(['withdrawn', 'unchanged']), version: z.number() })
export type SharePutResponse = z.infer<typeof sharePutResponseSchema>
export type ShareDeleteResponse = z.infer<typeof shareDeleteResponseSchema>

/** What the person sees of their own shares: states only, never the payload. */
export const shareStateRowSchema = z.object({
  entryId: z.string(),
  version: z.number(),
  sharedAt: z.string().nullable(),
  withdrawnAt: z.string().nullable(),
  readAt: z.string().nullable(),
})
export type ShareStateRow = z.infer<typeof shareStateRowSchema>

/** One shared entry as the therapist's screens receive it. */
export const sharedEntryViewSchema = z.object({
  entryId: z.string(),
  kind: z.string().nullable(),
  version: z.number(),
  payload: entrySchema,
  sharedAt: z.string().nullable(),
  readAt: z.string().nullable(),
  toDiscuss: z.boolean(),
  riskFlag: z.boolean(),
})
export type SharedEntryView = z.infer<typeof sharedEntryViewSchema>

export const sharePatchSchema = z
  .object({ read: z.boolean().optional(), toDiscuss: z.boolean().optional() })
  .strict()
  .refine((b) => b.read !== undefined || b.toDiscuss !== undefined, 'Send read or toDiscuss.')
export type SharePatch = z.infer<typeof sharePatchSchema>

export const accessLogRowSchema = z.object({ at: z.string(), entryId: z.string(), by: z.string(), action: z.literal('opened') })
export type AccessLogRow = z.infer<typeof accessLogRowSchema>
