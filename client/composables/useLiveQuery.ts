import { liveQuery, type Subscription } from 'dexie'
import { onScopeDispose, shallowRef, watch, type ShallowRef, type WatchSource } from 'vue'

/**
 * Subscribes to a Dexie liveQuery for as long as the calling component (or store) lives, and re-subscribes when the
 * watched sources change. Results are held in a shallowRef: Dexie hands over new arrays, never mutated ones.
 */
export function useLiveQuery<T>(querier: () => T | Promise<T>, initial: T, sources: WatchSource[] = []): { result: ShallowRef<T>; error: ShallowRef<unknown>; loaded: ShallowRef<boolean> } {
  const result = shallowRef(initial) as ShallowRef<T>
  const error = shallowRef<unknown>()
  const loaded = shallowRef(false)
  let subscription: Subscription | undefined

  const start = () => {
    subscription?.unsubscribe()
    subscription = liveQuery(querier).subscribe({
      next: (value) => {
        result.value = value
        loaded.value = true
      },
      error: (err) => {
        error.value = err
      },
    })
  }
  if (sources.length) watch(sources, start, { immediate: true })
  else start()
  onScopeDispose(() => subscription?.unsubscribe())
  return { result, error, loaded }
}
