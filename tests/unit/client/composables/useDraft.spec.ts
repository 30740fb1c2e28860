import { flushPromises, mount } from '@vue/test-utils'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h } from 'vue'
import { DRAFT_DEBOUNCE_MS, useDraft } from '@/composables/useDraft'
import { db } from '@/db/db'

function host() {
  let api!: ReturnType<typeof useDraft>
  const C = defineComponent({
    setup() {
      api = useDraft(() => 'moment:new', 'moment', () => ({ kind: 'moment', body: '' }))
      return () => h('div')
    },
  })
  const wrapper = mount(C)
  return { wrapper, api: () => api }
}

describe('useDraft', () => {
  beforeEach(async () => { await db.drafts.clear() })
  afterEach(() => { vi.useRealTimers() })

  it('saves within 500 ms of the last keystroke (debounced)', async () => {
    expect(DRAFT_DEBOUNCE_MS).toBeLessThanOrEqual(500)
    const { wrapper, api } = host()
    await api().load()
    api().data.value.body = 'Half a sen'
    await flushPromises()
    api().data.value.body = 'Half a sentence'
    await new Promise((r) => setTimeout(r, DRAFT_DEBOUNCE_MS + 150))
    expect((await db.drafts.get('moment:new'))?.data.body).toBe('Half a sentence')
    wrapper.unmount()
  })

  it('brings the draft back in a fresh component, as after a reload', async () => {
    const first = host()
    await first.api().load()
    first.api().data.value.body = 'Written before the crash'
    await first.api().flush()
    first.wrapper.unmount()

    const second = host()
    await second.api().load()
    expect(second.api().data.value.body).toBe('Written before the crash')
    expect(second.api().restored.value).toBe(true)
    second.wrapper.unmount()
  })

  it('flushes at once when the page is hidden', async () => {
    const { wrapper, api } = host()
    await api().load()
    api().data.value.body = 'Tab about to close'
    await flushPromises()
    window.dispatchEvent(new Event('pagehide'))
    await new Promise((r) => setTimeout(r, 30))
    expect((await db.drafts.get('moment:new'))?.data.body).toBe('Tab about to close')
    wrapper.unmount()
  })

  it('forgets the draft once discarded', async () => {
    const { wrapper, api } = host()
    await api().load()
    api().data.value.body = 'Saved as an entry'
    await api().flush()
    await api().discard()
    expect(await db.drafts.get('moment:new')).toBeUndefined()
    wrapper.unmount()
  })
})

describe('useDraft while the device database is still opening', () => {
  beforeEach(async () => { await db.drafts.clear() })

  it('keeps what the person typed before the draft was read, and saves it', async () => {
    const { wrapper, api } = host()
    const loading = api().load()
    // Typed into the form before the read answers, as on a first visit with the database still opening.
    api().data.value.body = 'Typed straight away'
    await loading
    expect(api().data.value.body).toBe('Typed straight away')
    expect(api().data.value.kind).toBe('moment')
    await api().flush()
    expect((await db.drafts.get('moment:new'))?.data.body).toBe('Typed straight away')
    wrapper.unmount()
  })

  it('still starts blank after a load with no typing in between (as after saving)', async () => {
    const { wrapper, api } = host()
    await api().load()
    api().data.value.body = 'Saved as an entry'
    await api().discard()
    await api().load()
    expect(api().data.value.body).toBe('')
    wrapper.unmount()
  })
})
