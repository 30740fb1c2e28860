import { Notify } from 'quasar'
import { watch } from 'vue'
import { setUnauthenticatedHandler } from '@/api/http'
import { router } from '@/router'
import { RouteName } from '@/router/names'
import { useSessionStore } from '@/stores/session'

const AUTH_PAGES: string[] = [RouteName.SignIn, RouteName.SignUp, RouteName.Forgot, RouteName.Reset, RouteName.Verify]

/**
 * One place decides what a 401 means: the server session has ended, so forget who was signed in. When it ended because
 * of the idle or absolute timeout, a calm notice offers to sign in again and come back to the same screen; the outbox
 * keeps everything and resumes after sign-in (boot/sync.ts).
 */
export function bootHttp(): void {
  const session = useSessionStore()
  let dismiss: (() => void) | undefined

  function signInAgain(): void {
    const here = router.currentRoute.value
    const redirect = AUTH_PAGES.includes(String(here.name)) ? undefined : here.fullPath
    void router.push({ name: RouteName.SignIn, query: redirect ? { redirect } : {} })
  }

  setUnauthenticatedHandler((err) => {
    const timedOut = err.code === 'session_expired'
    session.forget(timedOut)
    if (!timedOut || dismiss) return
    dismiss = Notify.create({
      message: 'You were signed out after a while without use.',
      caption: 'Nothing on this device is lost. Anything waiting to send will go once you sign in again.',
      icon: 'schedule',
      color: 'primary',
      textColor: 'white',
      multiLine: true,
      timeout: 0,
      position: 'bottom',
      attrs: { role: 'status', 'data-test': 'session-expired' },
      actions: [
        { label: 'Not now', color: 'white', noCaps: true, flat: true, padding: '10px 16px' },
        { label: 'Sign in again', color: 'white', noCaps: true, outline: true, padding: '10px 16px', handler: signInAgain },
      ],
      onDismiss: () => { dismiss = undefined },
    })
  })

  watch(
    () => session.status,
    (status) => {
      if (status === 'signedIn') dismiss?.()
    },
  )
}
