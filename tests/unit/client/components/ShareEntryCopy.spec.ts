import { mount } from '@vue/test-utils'
import { Quasar } from 'quasar'
import { describe, expect, it } from 'vitest'
import type { Entry } from '@shared/schemas/entry.schema'
import ShareEntryCopy from '@/components/ShareEntryCopy.vue'

const at = 1_760_000_000_000
const base = { id: crypto.randomUUID(), createdAt: at, updatedAt: at, version: 1, body: '', wants: [], backgroundThoughts: [], tags: [], shares: [] }

const render = (entry: Entry, tags = '') =>
  mount(ShareEntryCopy, { props: { entry }, slots: tags ? { tags } : {}, global: { plugins: [Quasar] } })

describe('the copy of one entry shown before sharing', () => {
  it('shows a tug in full: body, distress before and after, both wants with their ladders, meeting point, background and tags', () => {
    const tug: Entry = {
      ...base,
      kind: 'tug',
      body: 'Dinner with my brother',
      distressBefore: 70,
      distressAfter: 40,
      wants: [
        { text: 'Say no to the loan', importance: 8, ladder: [{ id: 'a', text: 'To keep our savings for the move' }] },
        { text: 'Keep things calm', ladder: [{ id: 'b', text: 'To stay close to him' }] },
      ],
      meetingPoint: 'Offer help with the forms instead',
      backgroundThoughts: ['Mum would take his side'],
      tags: ['family'],
    } as Entry
    const text = render(tug).text()
    expect(text).toContain('Tug ·')
    expect(text).toContain('Dinner with my brother')
    expect(text).toContain('Distress before 70 (0–100)')
    expect(text).toContain('Distress after 40 (0–100)')
    expect(text).toContain('Want: Say no to the loan (matters 8/10)')
    expect(text).toContain('To keep our savings for the move')
    expect(text).toContain('Want: Keep things calm')
    expect(text).toContain('Meeting point: Offer help with the forms instead')
    expect(text).toContain('Mum would take his side')
    expect(text).toContain('family')
  })

  it('shows a questionnaire as its answers in the instrument wording, with the slot beside the date line', () => {
    const measure = { ...base, kind: 'measure', measure: { instrument: 'gad7', answers: [2, 1, 0, 0, 3, 1, 1], completedAt: at } } as Entry
    const w = render(measure, '<span data-test="tag">Will carry a flag</span>')
    expect(w.text()).toContain('Questionnaire ·')
    expect(w.text()).toContain('Feeling nervous, anxious, or on edge') // Spitzer et al. 2006, GAD-7 item 1 wording
    expect(w.text()).toContain('More than half the days (2)')
    expect(w.find('.row [data-test="tag"]').exists()).toBe(true)
  })
})
