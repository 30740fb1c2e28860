import type { Subscription } from 'dexie'
import { onScopeDispose, shallowRef, watch, type ShallowRef, type WatchSource } from 'vue'
import { loadDb } from '@/db/openDb'

/**
 * Subscribes to a Dexie liveQuery for as long as the calling component (or store) lives, and re-subscribes when the
 * watched sources change. Results are held in a shallowRef: Dexie hands over new arrays, never mutated ones. Until the
 * Dexie chunk has loaded (db/openDb.ts) the result is `initial` and `loaded` is false.
 */
export function useLiveQuery<T>(querier: () => T | Promise<T>, initial: T, sources: WatchSource[] = []): { result: ShallowRef<T>; error: ShallowRef<unknown>; loaded: ShallowRef<boolean> } {
  const result = shallowRef(initial) as ShallowRef<T>
  const error = shallowRef<unknown>()
  const loaded = shallowRef(false)
  let subscription: Subscription | undefined
  let starts = 0
  let disposed = false

  const start = () => {
    subscription?.unsubscribe()
    subscription = undefined
    const mine = ++starts
    // Subscribed only once Dexie is in, so the querier itself never waits on the chunk inside liveQuery's zone.
    void loadDb().then(
      ({ liveQuery }) => {
        if (disposed || mine !== starts) return
        subscription = liveQuery(querier).subscribe({
          next: (value) => {
            result.value = value
            loaded.value = true
          },
          error: (err) => {
            error.value = err
          },
        })
      },
      (err: unknown) => {
        error.value = err
      },
    )
  }
  // Rendered ahead at build time (client/prerender/firstScreen.ts) there is no device to read: the result stays `initial`.
  if (import.meta.env.SSR) return { result, error, loaded }
  if (sources.length) watch(sources, start, { immediate: true })
  else start()
  onScopeDispose(() => {
    disposed = true
    subscription?.unsubscribe()
  })
  return { result, error, loaded }
}
