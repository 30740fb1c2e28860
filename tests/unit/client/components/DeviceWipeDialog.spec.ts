import { flushPromises, mount } from '@vue/test-utils'
import Dexie from 'dexie'
import { createPinia, setActivePinia } from 'pinia'
import { Quasar } from 'quasar'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { createMemoryHistory, createRouter } from 'vue-router'
import DeviceWipeDialog from '@/components/DeviceWipeDialog.vue'
import { db } from '@/db/db'
import { createEntry } from '@/db/entriesRepository'
import { writeSetting } from '@/db/settingsRepository'
import { routes } from '@/router/routes'

async function settle(ms = 30) {
  await flushPromises()
  await new Promise((r) => setTimeout(r, ms))
  await flushPromises()
}

async function openDialog(props: Record<string, unknown> = {}) {
  const pinia = createPinia()
  setActivePinia(pinia)
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push('/more/settings')
  await router.isReady()
  const wrapper = mount(DeviceWipeDialog, { props: { modelValue: true, ...props }, global: { plugins: [[Quasar, {}], pinia, router] }, attachTo: document.body })
  await settle()
  return wrapper
}

const confirmButton = () => document.querySelector<HTMLButtonElement>('[data-test=wipe-confirm]')!
async function typeWord(value: string) {
  const input = document.querySelector<HTMLInputElement>('[data-test=wipe-word]')!
  input.value = value
  input.dispatchEvent(new Event('input'))
  await settle()
}

describe('DeviceWipeDialog', () => {
  let assign: ReturnType<typeof vi.fn>
  beforeEach(async () => {
    document.body.innerHTML = ''
    localStorage.clear()
    await db.open()
    await Promise.all([db.entries.clear(), db.settings.clear()])
    assign = vi.fn()
    vi.spyOn(window, 'location', 'get').mockReturnValue({ ...window.location, assign } as unknown as Location)
  })
  afterEach(() => { vi.restoreAllMocks() })

  it('keeps the wipe button disabled until the word WIPE is typed, and wipes nothing meanwhile', async () => {
    await createEntry({ kind: 'moment', body: 'A slow Sunday', wants: [], backgroundThoughts: [], tags: [] })
    const w = await openDialog()
    expect(document.body.textContent).toContain('cannot be undone')
    expect(document.body.textContent).toContain('A backup first is wise')
    expect(document.querySelector('[data-test=wipe-backup-link]')?.getAttribute('href')).toBe('/more/backup')
    expect(confirmButton().disabled).toBe(true)
    await typeWord('wipe it')
    expect(confirmButton().disabled).toBe(true)
    confirmButton().click()
    await settle()
    expect(await db.entries.count()).toBe(1)
    expect(assign).not.toHaveBeenCalled()
    await typeWord('wipe')
    expect(confirmButton().disabled).toBe(false)
    w.unmount()
  })

  it('deletes the device database and Rungs\' localStorage keys, then reloads to the first-run screen', async () => {
    await createEntry({ kind: 'moment', body: 'A slow Sunday', wants: [], backgroundThoughts: [], tags: [] })
    await writeSetting('firstRunSeenAt', Date.now())
    localStorage.setItem('rungs.appearance', 'dark')
    localStorage.setItem('another.site.key', 'kept')
    const w = await openDialog()
    await typeWord('WIPE')
    confirmButton().click()
    await settle(100)
    expect(assign).toHaveBeenCalledWith('/')
    expect(await Dexie.exists('rungs')).toBe(false)
    expect(localStorage.getItem('rungs.appearance')).toBeNull()
    expect(localStorage.getItem('another.site.key')).toBe('kept')
    w.unmount()
  })
})
