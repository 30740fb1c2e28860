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

let noDatabase: Promise<boolean> | undefined

/**
 * Whether this browser holds no Rungs database yet (a first visit, or the start after a wipe), asked once: main.ts asks
 * before anything opens Dexie, since opening creates it. A browser that cannot tell answers false (ask Dexie).
 */
export function probeNoDatabase(name = 'rungs'): Promise<boolean> {
  noDatabase ??= (async () => {
    const list = await globalThis.indexedDB?.databases?.()
    return Array.isArray(list) && !list.some((d) => d.name === name)
  })().catch(() => false)
  return noDatabase
}

/** For the build-time render of the first screen (client/prerender/firstScreen.ts): the state of a first visit. */
export function assumeNoDatabase(): void {
  noDatabase = Promise.resolve(true)
}

/**
 * A fact for the first paint: the hint when there is one; false on a browser with no Rungs database, where neither a
 * lock nor an acknowledged notice can exist; otherwise undefined, and Dexie decides.
 */
export async function startupFact(name: StartupHint): Promise<boolean | undefined> {
  const hint = readStartupHint(name)
  if (hint !== undefined) return hint
  return (await probeNoDatabase()) ? false : undefined
}
