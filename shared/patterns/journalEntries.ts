import type { Entry, EntryKind } from '../schemas/entry.schema'

export type JournalKind = Extract<EntryKind, 'moment' | 'tug'>
export type JournalEntry = Entry & { kind: JournalKind }

/**
 * The entries patterns are drawn from: moments and tugs, oldest first (ties by id, so results are stable).
 * Measures and the safety plan have screens of their own.
 */
export function journalEntries(entries: readonly Entry[]): JournalEntry[] {
  return entries
    .filter((e): e is JournalEntry => e.kind === 'moment' || e.kind === 'tug')
    .sort((a, b) => a.createdAt - b.createdAt || a.id.localeCompare(b.id))
}
