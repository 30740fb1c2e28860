// Two non-secret facts the first paint needs, mirrored from Dexie into localStorage so a start need not wait for the
// database to open: whether an app lock is set, and whether the first-run notice was acknowledged. Dexie stays the
// truth: a missing or unreadable hint means "ask Dexie", and every Dexie read of either fact rewrites its hint. The keys
// start with `rungs.`, so wiping the device (deviceWipe.ts) clears them too.
const KEYS = { lockSet: 'rungs.lockSet', firstRunSeen: 'rungs.firstRunSeen' } as const
export type StartupHint = keyof typeof KEYS

/** The mirrored fact, or undefined when there is no (readable) hint and Dexie must decide. */
export function readStartupHint(name: StartupHint): boolean | undefined {
  try {
    const v = globalThis.localStorage?.getItem(KEYS[name])
    return v === 'yes' ? true : v === 'no' ? false : undefined
  } catch {
    return undefined
  }
}

/** Writes the hint; undefined removes it. A browser that refuses storage only loses the shortcut. */
export function writeStartupHint(name: StartupHint, value: boolean | undefined): void {
  try {
    if (value === undefined) globalThis.localStorage?.removeItem(KEYS[name])
    else globalThis.localStorage?.setItem(KEYS[name], value ? 'yes' : 'no')
  } catch {
    // Private modes and full storage: the next start asks Dexie, as before.
  }
}
