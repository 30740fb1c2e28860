import { flushPromises } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { beforeEach, describe, expect, it, vi } from 'vitest'
import { bootAppLock } from '@/boot/appLock'
import { readAppLock, removeAppLock, setAppLock } from '@/db/appLockRepository'
import { db } from '@/db/db'
import { wipeDevice } from '@/db/deviceWipe'
import { readStartupHint, writeStartupHint } from '@/db/startupHints'
import { useAppLockStore } from '@/stores/appLock'

// Few PBKDF2 rounds keep the tests fast; the app always uses LOCK_ITERATIONS.
const FAST = 1000

beforeEach(async () => {
  await db.open()
  await db.settings.clear()
  localStorage.clear()
  setActivePinia(createPinia())
})

describe('the "a lock is set" mirror', () => {
  it('is set when a lock is set and cleared when it is removed', async () => {
    expect(readStartupHint('lockSet')).toBeUndefined()
    await setAppLock('2468', 5, FAST)
    expect(localStorage.getItem('rungs.lockSet')).toBe('yes')
    expect(readStartupHint('lockSet')).toBe(true)
    await removeAppLock()
    expect(readStartupHint('lockSet')).toBe(false)
  })

  it('follows Dexie whenever the lock is read, whatever it said before', async () => {
    await setAppLock('2468', 5, FAST)
    writeStartupHint('lockSet', false)
    await readAppLock()
    expect(readStartupHint('lockSet')).toBe(true)
    await db.settings.delete('appLock')
    await readAppLock()
    expect(readStartupHint('lockSet')).toBe(false)
  })

  it('holds nothing secret: only yes or no', async () => {
    await setAppLock('2468', 5, FAST)
    const stored = Object.keys(localStorage).map((k) => `${k}=${localStorage.getItem(k)}`)
    expect(stored).toEqual(['rungs.lockSet=yes'])
  })

  it('goes with a device wipe, so the next start asks Dexie', async () => {
    await setAppLock('2468', 5, FAST)
    await wipeDevice()
    expect(readStartupHint('lockSet')).toBeUndefined()
  })
})

describe('deciding the lock at start', () => {
  it('with no mirror, lets Dexie decide before the app may mount: a set lock covers the first paint', async () => {
    await setAppLock('2468', 5, FAST)
    localStorage.clear()
    await bootAppLock()
    expect(useAppLockStore().locked).toBe(true)
    expect(readStartupHint('lockSet')).toBe(true)
  })

  it('with the mirror saying a lock is set, is locked before the app may mount', async () => {
    await setAppLock('2468', 5, FAST)
    await bootAppLock()
    expect(useAppLockStore().locked).toBe(true)
  })

  it('with no mirror and no lock, starts unlocked and mirrors that', async () => {
    await bootAppLock()
    expect(useAppLockStore().locked).toBe(false)
    expect(readStartupHint('lockSet')).toBe(false)
  })

  it('with the mirror saying no lock, lets the app mount before Dexie answers, and Dexie still has the last word', async () => {
    // A mirror out of step with Dexie (it cannot be after setAppLock, which mirrors first): the lock still applies.
    await setAppLock('2468', 5, FAST)
    writeStartupHint('lockSet', false)
    await bootAppLock()
    const lock = useAppLockStore()
    expect(lock.enabled).toBe(false)
    await expect.poll(() => lock.locked).toBe(true)
    await flushPromises()
    expect(readStartupHint('lockSet')).toBe(true)
  })
})

describe('the start-up facts on a browser with no Rungs database yet', () => {
  // probeNoDatabase asks once per page load, so each case loads the module afresh, as a new page would.
  const freshHints = async () => {
    vi.resetModules()
    return import('@/db/startupHints')
  }

  it('says "no lock, notice not seen" without opening a database, and creates none', async () => {
    db.close()
    await new Promise((resolve, reject) => Object.assign(indexedDB.deleteDatabase('rungs'), { onsuccess: resolve, onerror: reject }))
    const hints = await freshHints()
    expect(await hints.startupFact('lockSet')).toBe(false)
    expect(await hints.startupFact('firstRunSeen')).toBe(false)
    expect((await indexedDB.databases()).map((d) => d.name)).not.toContain('rungs')
  })

  it('leaves the decision to Dexie when the database exists and there is no hint', async () => {
    await setAppLock('2468', 5, FAST)
    localStorage.clear()
    const hints = await freshHints()
    expect(await hints.startupFact('lockSet')).toBeUndefined()
    expect(await hints.startupFact('firstRunSeen')).toBeUndefined()
  })

  it('goes by the hint when there is one', async () => {
    writeStartupHint('firstRunSeen', true)
    writeStartupHint('lockSet', true)
    const hints = await freshHints()
    expect(await hints.startupFact('firstRunSeen')).toBe(true)
    expect(await hints.startupFact('lockSet')).toBe(true)
  })
})
