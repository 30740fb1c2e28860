import { format, isToday, isYesterday } from 'date-fns'
import { computed, type Ref } from 'vue'
import { listJournal, type JournalFilter, type JournalRow } from '@/db/entriesRepository'
import { useLiveQuery } from './useLiveQuery'

export type JournalItem = { type: 'day'; key: string; label: string } | { type: 'entry'; key: string; id: string }

function dayLabel(t: number): string {
  if (isToday(t)) return 'Today'
  if (isYesterday(t)) return 'Yesterday'
  return format(t, 'EEEE d MMMM yyyy')
}

/** The journal list for a filter, newest first, with a heading before each day. Re-queries when the filter changes. */
export function useJournalList(filter: Ref<JournalFilter>) {
  const { result: rows, loaded } = useLiveQuery(() => listJournal(filter.value), [] as JournalRow[], [() => JSON.stringify(filter.value)])
  const items = computed<JournalItem[]>(() => {
    const out: JournalItem[] = []
    let day = ''
    for (const r of rows.value) {
      const d = format(r.createdAt, 'yyyy-MM-dd')
      if (d !== day) {
        day = d
        out.push({ type: 'day', key: `day:${d}`, label: dayLabel(r.createdAt) })
      }
      out.push({ type: 'entry', key: r.id, id: r.id })
    }
    return out
  })
  return { rows, items, loaded }
}
