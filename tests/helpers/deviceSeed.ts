import type { Page } from 'playwright-core'
import { searchWords } from '../../shared/content/searchWords'
import type { Entry } from '../../shared/schemas/entry.schema'

// An invented month of one person's journal, for screenshots and benchmarks; no real person.
const moments = ['Tight chest before the team call', 'Walked by the river at lunch', 'Argument about the washing up', 'Could not sleep, mind racing', 'Coffee with an old friend', 'Email from my manager on Sunday']
const tags = ['work', 'family', 'sleep', 'friends', 'body']
const rungs = [['Rest in the evenings', 'Having energy for my kids', 'Being a present parent'], ['Keeping this job', 'Security for my family', 'Looking after my family'], ['Being heard', 'Feeling respected', 'Feeling safe']]

/** Builds entries spread over the last `days` days, in the stored shape (with search words). */
export function seedEntries(count: number, days: number, now = Date.now()): (Entry & { words: string[] })[] {
  const out: (Entry & { words: string[] })[] = []
  for (let i = 0; i < count; i++) {
    const at = now - Math.round(((i * 137) % (days * 24)) * 3_600_000 + (i % 5) * 600_000)
    const tug = i % 4 === 0
    const ladderA = rungs[i % 3]!.map((text, j) => ({ id: `a${i}-${j}`, text }))
    const ladderB = rungs[(i + 1) % 3]!.map((text, j) => ({ id: `b${i}-${j}`, text }))
    const before = 20 + ((i * 37) % 70)
    const e: Entry = {
      id: crypto.randomUUID(),
      kind: tug ? 'tug' : 'moment',
      createdAt: at,
      updatedAt: at,
      version: 1,
      body: tug ? 'Pulled between staying late and going home' : moments[i % moments.length]!,
      distressBefore: before,
      ...(tug ? { distressAfter: Math.max(0, before - 10 - (i % 15)) } : {}),
      wants: tug ? [{ text: 'Go home on time', importance: 7, ladder: ladderA }, { text: 'Be seen as reliable', importance: 6, ladder: ladderB }] : [],
      ...(tug && i % 8 === 0 ? { meetingPoint: 'Looking after my family' } : {}),
      backgroundThoughts: [],
      tags: [tags[i % tags.length]!, ...(i % 3 === 0 ? [tags[(i + 2) % tags.length]!] : [])],
      shares: [],
    }
    out.push({ ...e, words: searchWords(e.body, ...e.wants.flatMap((w) => [w.text, ...w.ladder.map((r) => r.text)]), e.meetingPoint, ...e.tags) })
  }
  return out
}

/**
 * Writes entries straight into the app's IndexedDB. The page must have opened the app once; on a first visit the app
 * creates its database only when the page is idle (client/db/openDb.ts), so this waits until the database is listed
 * (opening it before would create an empty one) and then until its upgrade has made the entries store: CI saw an open
 * just after the listing find no stores.
 */
export async function seedDevice(page: Page, entries: (Entry & { words: string[] })[]): Promise<void> {
  await page.waitForFunction(async () => (await indexedDB.databases()).some((d) => d.name === 'rungs' && (d.version ?? 0) > 1), undefined, { polling: 100, timeout: 10_000 })
  await page.evaluate(async (rows) => {
    const open = () =>
      new Promise<IDBDatabase>((resolve, reject) => {
        const r = indexedDB.open('rungs')
        r.onsuccess = () => resolve(r.result)
        r.onerror = () => reject(r.error)
      })
    let db = await open()
    for (let i = 0; i < 100 && !db.objectStoreNames.contains('entries'); i++) {
      db.close()
      await new Promise((resolve) => setTimeout(resolve, 100))
      db = await open()
    }
    await new Promise<void>((resolve, reject) => {
      const tx = db.transaction('entries', 'readwrite')
      for (const row of rows) tx.objectStore('entries').put(row)
      tx.oncomplete = () => resolve()
      tx.onerror = () => reject(tx.error)
    })
    db.close()
  }, entries)
}
