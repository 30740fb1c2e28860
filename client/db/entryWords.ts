import { searchWords } from '@shared/content/searchWords'
import type { Entry } from '@shared/schemas/entry.schema'

/** Every searchable word of an entry: body, wants, rungs, meeting point, background thoughts and tags. */
export function entryWords(e: Pick<Entry, 'body' | 'wants' | 'meetingPoint' | 'backgroundThoughts' | 'tags'>): string[] {
  return searchWords(
    e.body,
    ...e.wants.flatMap((w) => [w.text, ...w.ladder.map((r) => r.text)]),
    e.meetingPoint,
    ...e.backgroundThoughts,
    ...e.tags,
  )
}
