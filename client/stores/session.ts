import { defineStore } from 'pinia'
import { computed, ref, shallowRef } from 'vue'
import type { SignIn } from '@shared/schemas/auth.schema'
import type { Me } from '@shared/schemas/user.schema'
import { ApiError, setCsrfToken } from '@/api/http'
import type { MeResponse } from '@/api/me'
import { readSetting, writeSetting } from '@/db/settingsRepository'

// The account calls parse their answers with zod; a device that has never signed in never needs them, so they load
// with the first call instead of with the first screen.
const authApi = () => import('@/api/auth')
const meApi = () => import('@/api/me')

type Status = 'unknown' | 'anonymous' | 'signedIn' | 'unreachable'

/** Who is signed in on this device. A device that has never signed in never asks the server. */
export const useSessionStore = defineStore('session', () => {
  const me = shallowRef<Me | null>(null)
  const features = shallowRef<MeResponse['features']>({ sentMail: false })
  const status = ref<Status>('unknown')
  /** The server ended the session after the idle or absolute timeout; cleared by the next sign-in. */
  const expired = ref(false)
  let loading: Promise<void> | undefined

  const role = computed(() => me.value?.role)

  async function refresh(): Promise<void> {
    try {
      const res = await (await meApi()).fetchMe()
      me.value = res.user
      features.value = res.features
      status.value = 'signedIn'
    } catch (err) {
      me.value = null
      status.value = err instanceof ApiError && err.status === 0 ? 'unreachable' : 'anonymous'
    }
  }

  /** Resolves once we know who is signed in. Only calls /api/me when this device has signed in before. */
  function ready(): Promise<void> {
    loading ??= (async () => {
      if (await readSetting('signedInBefore')) await refresh()
      else status.value = 'anonymous'
    })()
    return loading
  }

  async function signIn(input: SignIn): Promise<Me> {
    me.value = await (await authApi()).signIn(input)
    expired.value = false
    status.value = 'signedIn'
    await writeSetting('signedInBefore', true)
    await refresh()
    return me.value!
  }

  async function signOut(): Promise<void> {
    await (await authApi()).signOut()
    me.value = null
    status.value = 'anonymous'
  }

  /** Signs out on every device, this one included. The journal on this device stays. */
  async function signOutEverywhere(): Promise<void> {
    await (await authApi()).signOutEverywhere()
    me.value = null
    status.value = 'anonymous'
  }

  /** Called when any request answers 401: the session ended on the server (`timedOut` after the idle or absolute limit). */
  function forget(timedOut = false): void {
    // The server's token went with the session; the next request fetches a new one.
    if (timedOut) setCsrfToken(undefined)
    if (timedOut && status.value !== 'anonymous') expired.value = true
    me.value = null
    status.value = 'anonymous'
  }

  return { me, features, status, expired, role, ready, refresh, signIn, signOut, signOutEverywhere, forget }
})
