/**
 * The entry schemas, and zod with them, loaded with the first write or restore rather than with the first screen: the
 * journal paints and reads without them, and every write still parses before anything reaches IndexedDB.
 */
let loading: Promise<typeof import('@shared/schemas/entry.schema')> | undefined
export const loadEntrySchemas = (): Promise<typeof import('@shared/schemas/entry.schema')> => (loading ??= import('@shared/schemas/entry.schema'))
