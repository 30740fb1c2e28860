import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { Dialog, Notify, QLayout, QPageContainer, Quasar } from 'quasar'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h } from 'vue'
import { RouterView, createMemoryHistory, createRouter } from 'vue-router'
import type { ItemAnswer } from '@shared/schemas/measure.schema'
import type { Entry } from '@shared/schemas/entry.schema'
import { db } from '@/db/db'
import { writeSetting } from '@/db/settingsRepository'
import { routes } from '@/router/routes'

// happy-dom has no canvas; the chart's text summary is what these tests read.
vi.mock('vue-chartjs', async () => {
  const { defineComponent, h } = await import('vue')
  return { Line: defineComponent({ props: ['data', 'options', 'plugins'], setup: (p) => () => h('canvas', { 'data-test': 'chart', 'data-points': JSON.stringify(p.data.datasets[0].data) }) }) }
})

const DAY = 86_400_000
const NOW = Date.now()
const me = { id: 'u1', email: 'rowan@example.org', displayName: 'Rowan', role: 'person', emailVerified: true, emailNotices: true, therapist: null }
const link = {
  id: 'link-1', state: 'active' as const, startedAt: '2026-01-05T10:00:00.000Z', endedAt: null, endedBy: null, nextAppointment: null, lastSessionAt: null,
  therapist: { displayName: 'Dr Ines Marlow', practice: 'Harbour Lane Practice', registration: 'HCPC PYL00000', approval: null },
}

/** A finished questionnaire as stored on the device. */
async function seedMeasure(instrument: 'phq9' | 'gad7', answers: ItemAnswer[], daysAgo: number) {
  const at = NOW - daysAgo * DAY
  const e: Entry = { id: crypto.randomUUID(), kind: 'measure', createdAt: at, updatedAt: at, version: 1, body: '', wants: [], backgroundThoughts: [], tags: [], shares: [], measure: { instrument, answers, completedAt: at + 60_000 } }
  await db.entries.put({ ...e, words: [] })
  return e
}
// Totals: 8 and 15 (a rise of 7, past the PHQ-9 reliable-change 6 of Talking Therapies).
const phq8 = [1, 1, 1, 1, 1, 1, 1, 1, 0] as ItemAnswer[]
const phq15 = [2, 2, 2, 2, 2, 2, 2, 1, 0] as ItemAnswer[]

// Lazy pages load slowly on a busy machine; waits are generous, never asserted.
const WAIT = { timeout: 8000 }

async function mountAt(path: string) {
  const pinia = createPinia()
  setActivePinia(pinia)
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push(path)
  await router.isReady()
  const Host = defineComponent({ render: () => h(QLayout, { view: 'hHh lpR fFf' }, () => h(QPageContainer, () => h(RouterView))) })
  const wrapper = mount(Host, { global: { plugins: [[Quasar, { plugins: { Notify, Dialog } }], pinia, router] }, attachTo: document.body })
  await flushPromises()
  await new Promise((r) => setTimeout(r, 100))
  await flushPromises()
  return { wrapper, router }
}

describe('the Measures page', () => {
  beforeEach(async () => {
    document.body.innerHTML = ''
    await Promise.all([db.entries.clear(), db.settings.clear(), db.links.clear(), db.earlierScores.clear()])
  })
  afterEach(() => { vi.unstubAllGlobals() })

  it('offers both questionnaires, saying what each asks about and how long it takes', async () => {
    vi.stubGlobal('fetch', vi.fn())
    const { wrapper } = await mountAt('/measures')
    for (const i of ['phq9', 'gad7']) expect(wrapper.get(`[data-test=measure-start-${i}]`).attributes('href')).toBe(`/measures/new/${i}`)
    expect(wrapper.text()).toContain('low mood and depression')
    expect(wrapper.text()).toContain('anxiety and worry')
    expect(wrapper.text()).toContain('2–3 minutes')
    wrapper.unmount()
  })

  it('meets a reliable worsening with supportive words, Help now and "talk to your therapist", never outcome classes', async () => {
    vi.stubGlobal('fetch', vi.fn())
    await seedMeasure('phq9', phq8, 40)
    await seedMeasure('phq9', phq15, 2)
    const { wrapper } = await mountAt('/measures')
    await vi.waitFor(() => expect(wrapper.find('[data-test=measure-worsening]').exists()).toBe(true), WAIT)
    const card = wrapper.get('[data-test=measure-worsening]')
    expect(card.text()).toContain('talk to your therapist')
    expect(card.text()).toContain('You deserve support')
    expect(card.find('[data-test=help-now]').exists()).toBe(true)
    expect(wrapper.get('[data-test=measure-change-phq9]').text()).toBe('7 points higher than your first.')
    expect(wrapper.get('[data-test=measure-latest-phq9]').text()).toContain('15')
    expect(wrapper.get('[data-test=measure-latest-phq9]').text()).toContain('moderately severe')
    expect(wrapper.get('[data-test=measure-chart-summary-phq9]').text()).toMatch(/PHQ-9: 2 scores\. First 8 \(mild\).*latest 15 \(moderately severe\)/)
    expect(wrapper.text().toLowerCase()).not.toMatch(/deteriorat|recover|reliabl|improved|unchanged/)
    wrapper.unmount()
  })

  it('says nothing about worsening for a small rise', async () => {
    vi.stubGlobal('fetch', vi.fn())
    await seedMeasure('phq9', phq8, 40)
    await seedMeasure('phq9', [1, 1, 1, 1, 1, 1, 2, 2, 0], 2)
    const { wrapper } = await mountAt('/measures')
    await vi.waitFor(() => expect(wrapper.find('[data-test=measure-change-phq9]').exists()).toBe(true), WAIT)
    expect(wrapper.get('[data-test=measure-change-phq9]').text()).toBe('2 points higher than your first.')
    expect(wrapper.find('[data-test=measure-worsening]').exists()).toBe(false)
    wrapper.unmount()
  })

  it('makes no request at all on a device that never signed in', async () => {
    const fetch = vi.fn()
    vi.stubGlobal('fetch', fetch)
    await db.links.put({ ...link, syncedAt: NOW })
    await seedMeasure('gad7', [1, 1, 1, 1, 1, 1, 1], 3)
    const { wrapper } = await mountAt('/measures')
    await vi.waitFor(() => expect(wrapper.find('[data-test=measure-history-gad7]').exists()).toBe(true), WAIT)
    expect(fetch).not.toHaveBeenCalled()
    wrapper.unmount()
  })

  it('fetches the therapist\'s earlier scores when signed in with an active link, caches them, and counts change from the true first', async () => {
    const fetch = vi.fn(async (url: string) => {
      if (url === '/api/me') return new Response(JSON.stringify({ user: me, features: { sentMail: false } }), { status: 200 })
      if (url === '/api/links/link-1/earlier-scores') {
        return new Response(JSON.stringify({ scores: [{ id: 'es-1', instrument: 'phq9', takenOn: '2025-11-03', total: 22, item9: null, enteredBy: 'Dr Ines Marlow', enteredAt: '2026-01-06T09:00:00.000Z' }] }), { status: 200 })
      }
      return new Response(JSON.stringify({ error: { code: 'not_found', message: 'No such route.' } }), { status: 404 })
    })
    vi.stubGlobal('fetch', fetch)
    await writeSetting('signedInBefore', true)
    await db.links.put({ ...link, syncedAt: NOW })
    await seedMeasure('phq9', phq15, 2)
    const { wrapper } = await mountAt('/measures')
    await vi.waitFor(() => expect(wrapper.find('[data-test=measure-row-therapist]').exists()).toBe(true), WAIT)
    expect(fetch.mock.calls.map((c) => c[0])).toEqual(['/api/me', '/api/links/link-1/earlier-scores'])
    expect(await db.earlierScores.toArray()).toMatchObject([{ id: 'es-1', linkId: 'link-1', total: 22, item9: null }])
    expect(wrapper.get('[data-test=measure-row-therapist]').text()).toContain('entered by your therapist')
    expect(wrapper.get('[data-test=measure-change-phq9]').text()).toBe('7 points lower than your first.')
    expect(wrapper.get('[data-test=measure-chart-summary-phq9]').text()).toContain('First 22 (severe, entered by your therapist)')
    expect(wrapper.get('[data-test=chart]').attributes('data-points')).toBe('[22,15]')
    wrapper.unmount()
  })

  it('refuses an earlier-scores answer that does not match the schema, keeping the cached copy', async () => {
    await db.earlierScores.put({ id: 'es-old', linkId: 'link-1', instrument: 'gad7', takenOn: '2025-10-01', total: 12, item9: null, enteredBy: 'Dr Ines Marlow', enteredAt: '2026-01-06T09:00:00.000Z', syncedAt: NOW })
    vi.stubGlobal('fetch', vi.fn(async (url: string) => url === '/api/me'
      ? new Response(JSON.stringify({ user: me, features: { sentMail: false } }), { status: 200 })
      : new Response(JSON.stringify({ scores: [{ id: 'es-2', instrument: 'phq9', total: 'many' }] }), { status: 200 })))
    await writeSetting('signedInBefore', true)
    await db.links.put({ ...link, syncedAt: NOW })
    const { wrapper } = await mountAt('/measures')
    await vi.waitFor(() => expect(wrapper.find('[data-test=measure-history-gad7]').exists()).toBe(true), WAIT)
    expect((await db.earlierScores.toArray()).map((s) => s.id)).toEqual(['es-old'])
    wrapper.unmount()
  })

  it('lists an unfinished form to carry on', async () => {
    vi.stubGlobal('fetch', vi.fn())
    const at = NOW - DAY
    await db.entries.put({ id: crypto.randomUUID(), kind: 'measure', createdAt: at, updatedAt: at, version: 1, body: '', wants: [], backgroundThoughts: [], tags: [], shares: [], words: [], measure: { instrument: 'gad7', answers: [1, 2, null, null, null, null, null] } })
    const { wrapper } = await mountAt('/measures')
    await vi.waitFor(() => expect(wrapper.find('[data-test=measure-unfinished-row]').exists()).toBe(true), WAIT)
    expect(wrapper.get('[data-test=measure-unfinished-row]').text()).toContain('2 of 7 answered')
    expect(wrapper.get('[data-test=measure-resume]').attributes('href')).toMatch(/^\/measures\/new\/gad7\?entry=/)
    expect(wrapper.find('[data-test=measure-history-gad7]').exists()).toBe(false)
    wrapper.unmount()
  })
})
