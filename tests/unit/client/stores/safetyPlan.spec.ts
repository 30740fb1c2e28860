import { createPinia, setActivePinia } from 'pinia'
import { beforeEach, describe, expect, it } from 'vitest'
import { emptySafetyPlan } from '@shared/schemas/safetyPlan.schema'
import { db } from '@/db/db'
import { useEntriesStore } from '@/stores/entries'
import { safetyPlanProblems, useSafetyPlanStore } from '@/stores/safetyPlan'

describe('useSafetyPlanStore', () => {
  beforeEach(async () => {
    await Promise.all([db.entries.clear(), db.outbox.clear(), db.drafts.clear()])
    setActivePinia(createPinia())
  })

  it('keeps one plan entry however quickly saves follow each other', async () => {
    const store = useSafetyPlanStore()
    await Promise.all([store.save({ ...emptySafetyPlan(), onMyOwn: ['Tea'] }), store.save({ ...emptySafetyPlan(), onMyOwn: ['Tea', 'A bath'] })])
    const rows = await db.entries.where('kind').equals('safetyPlan').toArray()
    expect(rows).toHaveLength(1)
    expect(rows[0]?.version).toBe(2)
    expect(rows[0]?.safetyPlan?.onMyOwn).toEqual(['Tea', 'A bath'])
  })

  it('sends a shared plan again after an edit, at its new version', async () => {
    const store = useSafetyPlanStore()
    const first = await store.save({ ...emptySafetyPlan(), warningSigns: ['Skipping meals'] })
    await useEntriesStore().share(first.id, 'link-1')
    await db.outbox.clear()
    await db.entries.update(first.id, { shares: [{ linkId: 'link-1', state: 'shared', sentVersion: 1 }] })

    const next = await store.save({ ...emptySafetyPlan(), warningSigns: ['Skipping meals', 'Cancelling plans'] })
    expect(next.version).toBe(2)
    const row = await db.outbox.get(`${first.id}:link-1`)
    expect(row).toMatchObject({ op: 'put', version: 2 })
  })

  it('refuses a plan with a problem and stores nothing', async () => {
    const store = useSafetyPlanStore()
    await expect(store.save({ ...emptySafetyPlan(), reasonToKeepGoing: 'x'.repeat(2001) })).rejects.toThrow('My reason to keep going: this can be at most 2000 characters.')
    expect(await db.entries.count()).toBe(0)
  })
})

describe('safetyPlanProblems', () => {
  it('names the step and the contact, in plain words', () => {
    const problems = safetyPlanProblems({ ...emptySafetyPlan(), askForHelp: [{ name: 'n'.repeat(201) }, { name: ' ', phone: '0161 496 0000' }] })
    expect(problems).toEqual([
      'People I can ask for help, contact 1: the name can be at most 200 characters.',
      'A contact with the number 0161 496 0000 needs a name.',
    ])
  })

  it('ignores blank lines and blank contacts', () => {
    expect(safetyPlanProblems({ ...emptySafetyPlan(), onMyOwn: ['', '  '], professionals: [{ name: '', phone: ' ' }] })).toEqual([])
  })
})
