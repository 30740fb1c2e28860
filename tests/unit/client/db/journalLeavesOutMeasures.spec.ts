import { beforeEach, describe, expect, it } from 'vitest'
import { makeBackupFile, restoreBackupFile } from '@/backup/backupFile'
import { db } from '@/db/db'
import { countEntries, countJournalEntries, createEntry, listJournal, recentEntries } from '@/db/entriesRepository'
import { listMeasureEntries } from '@/db/measuresRepository'

const blank = { body: '', wants: [], backgroundThoughts: [], tags: [] }

async function seed() {
  const moment = await createEntry({ kind: 'moment', body: 'Slept badly again', wants: [], backgroundThoughts: [], tags: ['sleep'] }, 1_700_000_000_000)
  const measure = await createEntry({ kind: 'measure', ...blank, tags: [], measure: { instrument: 'phq9', answers: [1, 1, 2, 0, 1, 0, 1, 0, 1], difficulty: 1, completedAt: 1_700_000_100_000 } }, 1_700_000_050_000)
  const unfinished = await createEntry({ kind: 'measure', ...blank, measure: { instrument: 'gad7', answers: [2, null, null, null, null, null, null] } }, 1_700_000_060_000)
  const plan = await createEntry({ kind: 'safetyPlan', ...blank}, 1_700_000_070_000)
  return { moment, measure, unfinished, plan }
}

beforeEach(async () => {
  await Promise.all([db.entries.clear(), db.trash.clear(), db.settings.clear()])
})

describe('the journal list', () => {
  it('leaves out questionnaires and the safety plan, which have their own screens', async () => {
    const { moment } = await seed()
    expect((await listJournal()).map((r) => r.id)).toEqual([moment.id])
    expect((await listJournal({ kinds: ['measure'] })).map((r) => r.id)).toEqual([])
    expect((await recentEntries(5)).map((e) => e.id)).toEqual([moment.id])
    expect(await countJournalEntries()).toBe(1)
    // A backup still counts everything on the device.
    expect(await countEntries()).toBe(4)
  })
})

describe('backup and restore', () => {
  it('bring questionnaire entries back whole, finished and unfinished', async () => {
    const { measure, unfinished } = await seed()
    const before = await listMeasureEntries()
    const made = await makeBackupFile({ passphrase: 'harbour lights at dusk', iterations: 1000 })
    await db.entries.clear()
    const restored = await restoreBackupFile(made.text, 'harbour lights at dusk', { minIterations: 1000 })
    expect(restored.added).toBe(4)
    const after = await listMeasureEntries()
    expect(after).toEqual(before)
    expect(after.find((e) => e.id === measure.id)?.measure).toEqual({ instrument: 'phq9', answers: [1, 1, 2, 0, 1, 0, 1, 0, 1], difficulty: 1, completedAt: 1_700_000_100_000 })
    expect(after.find((e) => e.id === unfinished.id)?.measure?.answers).toEqual([2, null, null, null, null, null, null])
  })
})
