import { createPinia, setActivePinia } from 'pinia'
import { beforeEach, describe, expect, it } from 'vitest'
import { db } from '@/db/db'
import { createEntry } from '@/db/entriesRepository'
import { saveLinks } from '@/db/linksRepository'
import { defaultPageSize, useSummaryStore } from '@/stores/summary'
import type { PersonLinkRow } from '@shared/schemas/link.schema'

const DAY = 86_400_000

function link(lastSessionAt: string | null): PersonLinkRow {
  return {
    id: crypto.randomUUID(),
    state: 'active',
    startedAt: new Date(Date.now() - 60 * DAY).toISOString(),
    endedAt: null,
    endedBy: null,
    therapist: { displayName: 'Invented Therapist', practice: 'Alder Street Practice', registration: 'X-1', approval: null },
    nextAppointment: null,
    lastSessionAt,
  }
}

describe('useSummaryStore', () => {
  beforeEach(async () => {
    await Promise.all([db.entries.clear(), db.links.clear(), db.settings.clear()])
    setActivePinia(createPinia())
  })

  it('starts at the last session from the cached link rows and ticks every moment and tug after it', async () => {
    const last = Date.now() - 5 * DAY
    await saveLinks([link(new Date(last).toISOString())])
    await createEntry({ kind: 'moment', body: 'After the session', wants: [], backgroundThoughts: [], tags: [], createdAt: Date.now() - DAY })
    await createEntry({ kind: 'moment', body: 'Before the session', wants: [], backgroundThoughts: [], tags: [], createdAt: Date.now() - 6 * DAY })
    const store = useSummaryStore()
    await store.load()
    expect(store.period.from).toBe(last)
    expect(store.period.note).toBeNull()
    expect(store.entries.map((e) => e.body)).toEqual(['After the session'])
    expect(store.chosenEntries).toEqual([store.entries[0]!.id])
  })

  it('falls back to the last 14 days and says so when no past session is known', async () => {
    await saveLinks([link(null)])
    const store = useSummaryStore()
    await store.load()
    expect(store.period.note).toContain('last 14 days')
    expect(Date.now() - store.period.from).toBeGreaterThan(13 * DAY)
    expect(Date.now() - store.period.from).toBeLessThan(14 * DAY)
  })

  it('leaves unticked entries and a safety plan it was not asked for out of the PDF input, and keeps the bring-up list', async () => {
    const a = await createEntry({ kind: 'moment', body: 'Keep me', wants: [], backgroundThoughts: [], tags: [] })
    await createEntry({ kind: 'moment', body: 'Leave me out', wants: [], backgroundThoughts: [], tags: [] })
    const store = useSummaryStore()
    await store.load()
    expect(store.hasSafetyPlan).toBe(false)
    store.chosenEntries = [a.id]
    await store.setBringUp(['Sleep', '  '])
    const input = store.summaryInput()
    expect(input.entries.map((e) => e.body)).toEqual(['Keep me'])
    expect(input.bringUp).toEqual(['Sleep'])
    expect(input.safetyPlan).toBeNull()

    setActivePinia(createPinia())
    const again = useSummaryStore()
    await again.load()
    expect(again.bringUp).toEqual(['Sleep', '  '])
  })

  it('picks Letter for the US and Canada and A4 elsewhere', () => {
    expect(defaultPageSize('en-US')).toBe('Letter')
    expect(defaultPageSize('fr-CA')).toBe('Letter')
    expect(defaultPageSize('en-GB')).toBe('A4')
    expect(defaultPageSize('de')).toBe('A4')
  })
})
