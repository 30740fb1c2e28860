import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { Dialog, Notify, Quasar } from 'quasar'
import { beforeEach, describe, expect, it } from 'vitest'
import { createMemoryHistory, createRouter } from 'vue-router'
import App from '@/App.vue'
import { loadLockScreen } from '@/boot/appLock'
import { db } from '@/db/db'
import { checkPasscode, readAppLock, setAppLock } from '@/db/appLockRepository'
import { createEntry } from '@/db/entriesRepository'
import { routes } from '@/router/routes'
import { FREE_TRIES, lockWaitMs, useAppLockStore } from '@/stores/appLock'
import { useDeviceSettingsStore } from '@/stores/deviceSettings'

// Few PBKDF2 rounds keep the tests fast; the app always uses LOCK_ITERATIONS.
const FAST = 1000
const ENTRY_TEXT = 'Heron standing in the reeds by the lock gates'
const PLAN_REASON = 'Seeing my niece at Easter'

async function settle(ms = 30) {
  await flushPromises()
  await new Promise((r) => setTimeout(r, ms))
  await flushPromises()
}

async function until(check: () => boolean, what: string) {
  for (let i = 0; i < 100; i++) {
    if (check()) return
    await settle(20)
  }
  throw new Error(`Timed out waiting for ${what}`)
}

/** The whole app at `path`, with the lock decided before mounting, as main.ts does. */
async function mountApp(path: string) {
  const pinia = createPinia()
  setActivePinia(pinia)
  await useDeviceSettingsStore().setRegion('UK')
  await useAppLockStore().load()
  // boot/appLock.ts fetches the lock screen before mounting when the app starts locked.
  if (useAppLockStore().locked) await loadLockScreen()
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push(path)
  await router.isReady()
  const wrapper = mount(App, { global: { plugins: [[Quasar, { plugins: { Notify, Dialog } }], pinia, router] }, attachTo: document.body })
  await settle()
  return { wrapper, router, lock: useAppLockStore() }
}

const click = async (selector: string) => {
  const el = document.querySelector<HTMLElement>(selector)
  if (!el) throw new Error(`No ${selector}`)
  el.click()
  await settle()
}

async function typeCode(value: string) {
  const input = document.querySelector<HTMLInputElement>('[data-test=lock-code]')!
  input.value = value
  input.dispatchEvent(new Event('input'))
  await settle()
  await click('[data-test=lock-unlock]')
  await settle(50)
}

describe('the app lock', () => {
  beforeEach(async () => {
    document.body.innerHTML = ''
    await Promise.all([db.entries.clear(), db.settings.clear(), db.drafts.clear()])
  })

  it('stores a salted PBKDF2 hash and never the passcode', async () => {
    await setAppLock('river-stones-7', 5)
    const stored = await readAppLock()
    expect(stored).toMatchObject({ iterations: 600_000, idleMinutes: 5, digits: false })
    expect(stored!.hash).toMatch(/^[A-Za-z0-9+/]{43}=$/)
    expect(stored!.salt).toMatch(/^[A-Za-z0-9+/]{22}==$/)
    const everything = JSON.stringify(await db.settings.toArray())
    expect(everything).not.toContain('river-stones-7')
    expect(await checkPasscode('river-stones-7')).toBe(true)
    expect(await checkPasscode('river-stones-8')).toBe(false)
    // A fresh salt each time: the same passcode never gives the same stored hash.
    const first = stored!.hash
    await setAppLock('river-stones-7', 5)
    expect((await readAppLock())!.hash).not.toBe(first)
  })

  it('covers the journal at start without rendering any entry, and opens with the right passcode only', async () => {
    await createEntry({ kind: 'moment', body: ENTRY_TEXT, wants: [], backgroundThoughts: [], tags: [] })
    await setAppLock('2468', 1, FAST)
    const { wrapper, lock } = await mountApp('/journal')
    expect(lock.locked).toBe(true)
    expect(document.querySelector('[data-test=app-lock]')).not.toBeNull()
    expect(document.body.textContent).toContain('Rungs is locked')
    expect(document.body.innerHTML).not.toContain(ENTRY_TEXT)
    expect(document.querySelector<HTMLInputElement>('[data-test=lock-code]')!.getAttribute('inputmode')).toBe('numeric')

    await typeCode('1357')
    expect(lock.locked).toBe(true)
    expect(document.querySelector('[data-test=lock-error]')?.textContent).toContain('not right')
    expect(document.body.innerHTML).not.toContain(ENTRY_TEXT)
    expect(lock.failures).toBe(1)

    await typeCode('2468')
    expect(lock.locked).toBe(false)
    await until(() => document.body.innerHTML.includes(ENTRY_TEXT), 'the journal to show')
    expect(document.querySelector('[data-test=app-lock]')).toBeNull()
    expect(lock.failures).toBe(0)
    wrapper.unmount()
  })

  it('keeps Help now and the saved safety plan reachable while locked, without showing the journal', async () => {
    await createEntry({ kind: 'moment', body: ENTRY_TEXT, wants: [], backgroundThoughts: [], tags: [] })
    await createEntry({
      kind: 'safetyPlan',
      body: '',
      wants: [],
      backgroundThoughts: [],
      tags: [],
      safetyPlan: { warningSigns: ['Skipping meals'], onMyOwn: [], peopleAndPlaces: [], askForHelp: [{ name: 'Anouk', phone: '07700 900123' }], professionals: [], saferSurroundings: [], reasonToKeepGoing: PLAN_REASON },
    })
    await setAppLock('a quiet word', 0, FAST)
    const { wrapper, lock } = await mountApp('/')

    await click('[data-test=lock-help-now]')
    expect(document.querySelector('[data-test=emergency-call]')?.getAttribute('href')).toBe('tel:999') // REFERENCE §5: UK 999 [C]
    const planButton = document.querySelector('[data-test=help-now-safety-plan]')!
    // On the lock screen the plan opens in place, not by leaving for the (covered) plan page.
    expect(planButton.getAttribute('href')).toBeNull()
    await click('[data-test=help-now-safety-plan]')
    await until(() => document.querySelector('[data-test=lock-plan]')?.textContent?.includes(PLAN_REASON) ?? false, 'the plan on the lock screen')
    expect(document.querySelector('[data-test=lock-plan] a[href="tel:07700900123"]')).not.toBeNull()
    expect(lock.locked).toBe(true)
    expect(document.body.innerHTML).not.toContain(ENTRY_TEXT)

    await click('[data-test=lock-plan-back]')
    await click('[data-test=lock-safety-plan]')
    await until(() => document.querySelector('[data-test=lock-plan]')?.textContent?.includes('Skipping meals') ?? false, 'the plan from the lock screen button')
    expect(document.body.innerHTML).not.toContain(ENTRY_TEXT)
    wrapper.unmount()
  })

  it('explains that forgetting the passcode means wiping the device, and offers the wipe', async () => {
    await setAppLock('9753', 5, FAST)
    const { wrapper } = await mountApp('/')
    await click('[data-test=lock-forgot]')
    expect(document.querySelector('[data-test=lock-forgot-text]')?.textContent).toMatch(/only way back into Rungs on this device is to wipe/)
    await click('[data-test=lock-wipe]')
    expect(document.querySelector('[data-test=wipe-dialog]')).not.toBeNull()
    // From the lock screen no backup can be made, so the dialog does not send the person to a covered page.
    expect(document.querySelector('[data-test=wipe-backup-link]')).toBeNull()
    wrapper.unmount()
  })

  it('makes each try wait longer after five wrong passcodes, and keeps the count across a restart', async () => {
    await setAppLock('8642', 5, FAST)
    const { wrapper, lock } = await mountApp('/')
    const start = Date.now()
    for (let i = 0; i < FREE_TRIES; i++) expect(await lock.unlock('0000', start)).toBe('wrong')
    expect(lock.nextTryAt).toBe(start + lockWaitMs(FREE_TRIES))
    expect(lockWaitMs(FREE_TRIES + 1)).toBeGreaterThan(lockWaitMs(FREE_TRIES))
    // Even the right passcode waits its turn; nothing is deleted.
    expect(await lock.unlock('8642', start + 1000)).toBe('wait')
    expect(await readAppLock()).toBeDefined()
    wrapper.unmount()

    const again = await mountApp('/')
    expect(again.lock.failures).toBe(FREE_TRIES)
    expect(await again.lock.unlock('8642', start + lockWaitMs(FREE_TRIES) + 1)).toBe('unlocked')
    again.wrapper.unmount()
  })

  it('locks when the person leaves with "immediately", and after the idle time otherwise', async () => {
    await setAppLock('1234', 0, FAST)
    const { wrapper, lock } = await mountApp('/')
    expect(await lock.unlock('1234')).toBe('unlocked')
    lock.watchPage()
    Object.defineProperty(document, 'visibilityState', { value: 'hidden', configurable: true })
    document.dispatchEvent(new Event('visibilitychange'))
    expect(lock.locked).toBe(true)
    Object.defineProperty(document, 'visibilityState', { value: 'visible', configurable: true })

    expect(await lock.unlock('1234')).toBe('unlocked')
    await lock.changeIdle(5)
    lock.checkIdle(Date.now() + 4 * 60_000)
    expect(lock.locked).toBe(false)
    lock.checkIdle(Date.now() + 5 * 60_000 + 1)
    expect(lock.locked).toBe(true)
    wrapper.unmount()
  })
})
