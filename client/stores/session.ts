import { defineStore } from 'pinia'
import { computed, ref, shallowRef } from 'vue'
import type { SignIn } from '@shared/schemas/auth.schema'
import type { Me } from '@shared/schemas/user.schema'
import * as authApi from '@/api/auth'
import { ApiError } from '@/api/http'
import { fetchMe, type MeResponse } from '@/api/me'
import { readSetting, writeSetting } from '@/db/settingsRepository'

type Status = 'unknown' | 'anonymous' | 'signedIn' | 'unreachable'

/** Who is signed in on this device. A device that has never signed in never asks the server. */
export const useSessionStore = defineStore('session', () => {
  const me = shallowRef<Me | null>(null)
  const features = shallowRef<MeResponse['features']>({ sentMail: false })
  const status = ref<Status>('unknown')
  let loading: Promise<void> | undefined

  const role = computed(() => me.value?.role)

  async function refresh(): Promise<void> {
    try {
      const res = await fetchMe()
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
    me.value = await authApi.signIn(input)
    status.value = 'signedIn'
    await writeSetting('signedInBefore', true)
    await refresh()
    return me.value!
  }

  async function signOut(): Promise<void> {
    await authApi.signOut()
    me.value = null
    status.value = 'anonymous'
  }

  /** Called when any request answers 401: the session ended on the server. */
  function forget(): void {
    me.value = null
    status.value = 'anonymous'
  }

  return { me, features, status, role, ready, refresh, signIn, signOut, forget }
})
