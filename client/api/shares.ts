import type { Entry } from '@shared/schemas/entry.schema'
import { accessLogRowSchema, shareDeleteResponseSchema, sharePutResponseSchema } from '@shared/schemas/share.schema'
import { z } from 'zod'
import { request } from './http'

const path = (linkId: string, entryId: string) => `/api/links/${encodeURIComponent(linkId)}/shares/${encodeURIComponent(entryId)}`

/** Sends a copy of the entry at its version; the server ignores a version it already holds, so a replay is harmless. */
export const putShare = (linkId: string, entry: Entry) => request('PUT', path(linkId, entry.id), { version: entry.version, payload: entry }, sharePutResponseSchema)
export const deleteShare = (linkId: string, entryId: string, version: number) => request('DELETE', `${path(linkId, entryId)}?version=${version}`, undefined, shareDeleteResponseSchema)
export const fetchAccessLog = (linkId: string) => request('GET', `/api/person/links/${encodeURIComponent(linkId)}/access-log`, undefined, z.object({ events: z.array(accessLogRowSchema) }))
