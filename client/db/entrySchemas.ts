type EntrySchemas = typeof import('@shared/schemas/entry.schema')

let loaded: EntrySchemas | undefined
let loading: Promise<EntrySchemas> | undefined

/**
 * The entry schemas, and zod with them, loaded with the first write or restore rather than with the first screen: the
 * journal paints and reads without them, and every write still parses before anything reaches IndexedDB.
 */
export function loadEntrySchemas(): Promise<EntrySchemas> {
  loading ??= import('@shared/schemas/entry.schema').then(
    (m) => (loaded = m),
    (err: unknown) => {
      loading = undefined
      throw err
    },
  )
  return loading
}

/**
 * The schemas once loaded. Code inside a Dexie transaction must await nothing but IndexedDB (the transaction would
 * commit or lose its zone), so a caller that opens one loads the schemas first and the code inside takes them from here.
 */
export const loadedEntrySchemas = (): EntrySchemas | undefined => loaded
