import { meSchema, type Preferences } from '@shared/schemas/user.schema'
import { z } from 'zod'
import { request } from './http'

const meResponse = z.object({ user: meSchema, features: z.object({ sentMail: z.boolean() }) })
export type MeResponse = z.infer<typeof meResponse>

export const fetchMe = () => request('GET', '/api/me', undefined, meResponse)
export const updatePreferences = (prefs: Preferences) => request('PATCH', '/api/person/preferences', prefs, z.object({ user: meSchema }))
