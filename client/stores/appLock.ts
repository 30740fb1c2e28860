import { defineStore } from 'pinia'
import { computed, ref } from 'vue'
import type { LockIdleMinutes } from '@shared/schemas/appLock.schema'
import {
  checkPasscode,
  clearLockFailures,
  readAppLock,
  readLockFailures,
  recordLockFailure,
  removeAppLock,
  setAppLock,
  setLockIdle,
} from '@/db/appLockRepository'

/** Wrong passcodes allowed before each further try waits. */
export const FREE_TRIES = 5
const FIRST_WAIT_MS = 30_000
const MAX_WAIT_MS = 15 * 60_000

/**
 * How long to wait before the next try after `failures` wrong passcodes in a row: nothing for the first five, then
 * 30 s doubling up to 15 min (common practice). It only slows guessing; nothing is ever locked out or lost.
 */
export function lockWaitMs(failures: number): number {
  if (failures < FREE_TRIES) return 0
  return Math.min(MAX_WAIT_MS, FIRST_WAIT_MS * 2 ** (failures - FREE_TRIES))
}

export type UnlockResult = 'unlocked' | 'wrong' | 'wait'

/**
 * The optional app lock on this device: whether it is on, whether the journal is covered now, and when to cover it
 * (after the chosen idle time, and at every start). The passcode itself is never kept; only its hash is, in Dexie.
 */
export const useAppLockStore = defineStore('appLock', () => {
  const enabled = ref(false)
  const locked = ref(false)
  const idleMinutes = ref<LockIdleMinutes>(5)
  const digits = ref(false)
  const failures = ref(0)
  const lastFailureAt = ref(0)
  const checking = ref(false)
  let lastActivity = Date.now()
  let watching = false

  /** When the next try is allowed (epoch ms); 0 when a try is allowed now. */
  const nextTryAt = computed(() => (failures.value < FREE_TRIES ? 0 : lastFailureAt.value + lockWaitMs(failures.value)))

  /** Reads the setting before the app mounts, so person pages never paint before the lock is decided. */
  async function load(): Promise<void> {
    const [record, tries] = await Promise.all([readAppLock(), readLockFailures()])
    enabled.value = Boolean(record)
    if (record) {
      idleMinutes.value = record.idleMinutes
      digits.value = record.digits
    }
    failures.value = tries.count
    lastFailureAt.value = tries.lastAt
    locked.value = enabled.value
    lastActivity = Date.now()
  }

  function lock(): void {
    if (enabled.value) locked.value = true
  }

  function noteActivity(): void {
    lastActivity = Date.now()
  }

  function idleTooLong(now = Date.now()): boolean {
    return now - lastActivity >= idleMinutes.value * 60_000
  }

  /** Checks the idle time; called on a timer and when the app comes back into view. */
  function checkIdle(now = Date.now()): void {
    if (enabled.value && !locked.value && idleTooLong(now)) lock()
  }

  function onVisibility(): void {
    if (document.visibilityState === 'hidden') {
      if (idleMinutes.value === 0) lock()
    } else checkIdle()
  }

  /** Starts watching the page once: leaving it, coming back, activity, and a timer for idle time in view. */
  function watchPage(): void {
    if (watching || typeof window === 'undefined') return
    watching = true
    for (const type of ['pointerdown', 'keydown', 'touchstart', 'wheel'] as const) window.addEventListener(type, noteActivity, { passive: true, capture: true })
    document.addEventListener('visibilitychange', onVisibility)
    window.addEventListener('pagehide', () => { if (idleMinutes.value === 0) lock() })
    // Coming back from the back-forward cache does not run the app's start again.
    window.addEventListener('pageshow', (e) => { if (e.persisted) (idleMinutes.value === 0 ? lock() : checkIdle()) })
    setInterval(() => { if (idleMinutes.value > 0) checkIdle() }, 10_000)
  }

  async function unlock(passcode: string, now = Date.now()): Promise<UnlockResult> {
    if (nextTryAt.value > now) return 'wait'
    checking.value = true
    try {
      if (await checkPasscode(passcode)) {
        await clearLockFailures()
        failures.value = 0
        lastFailureAt.value = 0
        locked.value = false
        lastActivity = Date.now()
        return 'unlocked'
      }
      const next = await recordLockFailure(now)
      failures.value = next.count
      lastFailureAt.value = next.lastAt
      return 'wrong'
    } finally {
      checking.value = false
    }
  }

  /** Turns the lock on, or changes the passcode. The journal stays open until the next lock. */
  async function turnOn(passcode: string, idle: LockIdleMinutes, iterations?: number): Promise<void> {
    const record = await setAppLock(passcode, idle, iterations)
    enabled.value = true
    idleMinutes.value = idle
    digits.value = record.digits
    failures.value = 0
    lastFailureAt.value = 0
    lastActivity = Date.now()
  }

  async function changeIdle(idle: LockIdleMinutes): Promise<void> {
    await setLockIdle(idle)
    idleMinutes.value = idle
    lastActivity = Date.now()
  }

  /** Turns the lock off; asks for the current passcode, so a journal left open cannot have its lock removed. */
  async function turnOff(passcode: string): Promise<boolean> {
    if (!(await checkPasscode(passcode))) return false
    await removeAppLock()
    enabled.value = false
    locked.value = false
    return true
  }

  return { enabled, locked, idleMinutes, digits, failures, nextTryAt, checking, load, watchPage, lock, checkIdle, noteActivity, unlock, turnOn, changeIdle, turnOff }
})
