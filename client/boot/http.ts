import { setUnauthenticatedHandler } from '@/api/http'
import { useSessionStore } from '@/stores/session'

/** One place decides what a 401 means: the server session has ended, so forget who was signed in. */
export function bootHttp(): void {
  const session = useSessionStore()
  setUnauthenticatedHandler(() => session.forget())
}
