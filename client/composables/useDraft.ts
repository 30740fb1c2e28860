import { onBeforeUnmount, onMounted, ref, toRaw, watch, type Ref } from 'vue'
import { discardDraft, readDraft, saveDraft } from '@/db/draftsRepository'
import type { Draft } from '@/db/RungsDB'

/** Saves at most this long after the last keystroke. */
export const DRAFT_DEBOUNCE_MS = 300

/**
 * Keeps unsaved writing in the drafts table as the person types, so a reload, closed tab or crash brings it back.
 * Saves are debounced, and flushed at once when the page is hidden or the component goes away.
 */
export function useDraft(id: () => string, kind: Draft['kind'], init: () => Draft['data'] | Promise<Draft['data']>, entryId?: () => string | undefined) {
  const data = ref<Draft['data']>({}) as Ref<Draft['data']>
  const step = ref<string | undefined>()
  const ready = ref(false)
  const restored = ref(false)
  let timer: ReturnType<typeof setTimeout> | undefined
  let dirty = false

  const snapshot = (): Omit<Draft, 'updatedAt'> => ({
    id: id(),
    kind,
    entryId: entryId?.(),
    // Dexie stores structured clones; a JSON round trip drops Vue's proxies.
    data: JSON.parse(JSON.stringify(toRaw(data.value))) as Draft['data'],
    step: step.value,
  })

  async function flush(): Promise<void> {
    if (timer) clearTimeout(timer)
    timer = undefined
    if (!dirty) return
    dirty = false
    await saveDraft(snapshot())
  }

  async function load(): Promise<void> {
    ready.value = false
    const before = JSON.stringify(toRaw(data.value))
    const existing = await readDraft(id())
    const base = existing ? existing.data : await init()
    // The form is on screen before the device database has answered, so the person may already have typed: what they
    // typed stays (over a blank form or an older draft) and is saved, rather than being replaced by the read.
    const typed = JSON.stringify(toRaw(data.value)) !== before
    restored.value = Boolean(existing) && !typed
    data.value = typed ? { ...base, ...(JSON.parse(JSON.stringify(toRaw(data.value))) as Draft['data']) } : base
    step.value = existing?.step
    dirty = typed
    ready.value = true
    if (typed) timer = setTimeout(() => void flush(), DRAFT_DEBOUNCE_MS)
  }

  watch([data, step], () => {
    if (!ready.value) return
    dirty = true
    if (timer) clearTimeout(timer)
    timer = setTimeout(() => void flush(), DRAFT_DEBOUNCE_MS)
  }, { deep: true })

  const onHide = () => { if (document.visibilityState === 'hidden') void flush() }
  const onPageHide = () => void flush()
  onMounted(() => {
    document.addEventListener('visibilitychange', onHide)
    window.addEventListener('pagehide', onPageHide)
  })
  onBeforeUnmount(() => {
    document.removeEventListener('visibilitychange', onHide)
    window.removeEventListener('pagehide', onPageHide)
    void flush()
  })

  /** Forgets the draft once the entry is saved (or the person throws it away). */
  async function discard(): Promise<void> {
    if (timer) clearTimeout(timer)
    timer = undefined
    dirty = false
    await discardDraft(id())
  }

  return { data, step, ready, restored, load, flush, discard }
}
