import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { Quasar } from 'quasar'
import { beforeEach, describe, expect, it } from 'vitest'
import type { Entry } from '@shared/schemas/entry.schema'
import { emptySafetyPlan } from '@shared/schemas/safetyPlan.schema'
import PrepEntryCard from '@/components/PrepEntryCard.vue'
import PrepSafetyPlanCard from '@/components/PrepSafetyPlanCard.vue'
import SharePreviewDialog from '@/components/SharePreviewDialog.vue'

const planEntry: Entry = {
  id: '6a1f3c2e-8d4b-4f7a-9c1e-2b3d4e5f6a7b',
  kind: 'safetyPlan',
  createdAt: Date.UTC(2026, 2, 1, 9),
  updatedAt: Date.UTC(2026, 2, 3, 9),
  version: 3,
  body: '',
  wants: [],
  backgroundThoughts: [],
  tags: [],
  shares: [],
  safetyPlan: { ...emptySafetyPlan(), onMyOwn: ['Feed the cat and sit with her'], askForHelp: [{ name: 'Rafa', phone: '07700 900456', note: 'my brother' }] },
}

describe('a shared safety plan', () => {
  beforeEach(() => {
    document.body.innerHTML = ''
    setActivePinia(createPinia())
  })

  it('reads on the therapist side as the same lines, with every step shown and no dial links', () => {
    const w = mount(PrepSafetyPlanCard, { props: { entry: planEntry }, global: { plugins: [[Quasar, {}]] } })
    expect(w.text()).toContain('Feed the cat and sit with her')
    expect(w.get('[data-test=plan-contact]').text()).toBe('Rafa — 07700 900456 (my brother)')
    expect(w.findAll('[data-test^=plan-step-]')).toHaveLength(7)
    expect(w.find('a[href^="tel:"]').exists()).toBe(false)
    expect(w.text()).toContain('version 3')
  })

  it('is what the prep list shows for an entry of kind safetyPlan', () => {
    const share = { linkId: 'l1', entryId: planEntry.id, version: 3, payload: planEntry, riskFlag: false, toDiscuss: false, readAt: null, sharedAt: null }
    const w = mount(PrepEntryCard, { props: { share: share as never }, global: { plugins: [[Quasar, {}]] } })
    expect(w.find('[data-test=prep-safety-plan]').exists()).toBe(true)
    expect(w.find('[data-test=prep-entry]').exists()).toBe(false)
  })

  it('is previewed step by step before it is shared', async () => {
    const w = mount(SharePreviewDialog, { props: { modelValue: true, entry: planEntry, therapistName: 'Dr Okafor' }, global: { plugins: [[Quasar, {}]] }, attachTo: document.body })
    await flushPromises()
    const preview = document.querySelector('[data-test=share-preview]')!.textContent!
    expect(preview).toContain('Safety plan · last changed')
    expect(preview).toContain('Things I can do on my own')
    expect(preview).toContain('Rafa — 07700 900456 (my brother)')
    expect(preview).not.toContain('Moment ·')
    w.unmount()
  })
})
