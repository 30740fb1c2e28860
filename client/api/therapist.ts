import type { TherapistProfilePatch } from '@shared/schemas/therapist.schema'
import { meSchema, therapistProfileSchema, type Preferences } from '@shared/schemas/user.schema'
import { z } from 'zod'
import { request } from './http'

const profileResponse = z.object({ profile: therapistProfileSchema })

export const fetchProfile = () => request('GET', '/api/therapist/profile', undefined, profileResponse)
export const updateProfile = (patch: TherapistProfilePatch) => request('PATCH', '/api/therapist/profile', patch, profileResponse)
export const updateTherapistPreferences = (prefs: Preferences) => request('PATCH', '/api/therapist/preferences', prefs, z.object({ user: meSchema }))
