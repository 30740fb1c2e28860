import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { Quasar } from 'quasar'
import { describe, expect, it } from 'vitest'
import type { Entry } from '@shared/schemas/entry.schema'
import SharePreviewDialog from '@/components/SharePreviewDialog.vue'

function phq9(item9: 0 | 1): Entry {
  const at = 1_760_000_000_000
  return { id: crypto.randomUUID(), kind: 'measure', createdAt: at, updatedAt: at, version: 1, body: '', wants: [], backgroundThoughts: [], tags: [], shares: [], measure: { instrument: 'phq9', answers: [1, 1, 1, 1, 1, 1, 1, 1, item9], completedAt: at } }
}

async function preview(entry: Entry): Promise<string> {
  document.body.innerHTML = ''
  const pinia = createPinia()
  setActivePinia(pinia)
  const w = mount(SharePreviewDialog, { props: { entry, therapistName: 'Dr Ines Marlow', modelValue: true }, global: { plugins: [Quasar, pinia] }, attachTo: document.body })
  await flushPromises()
  await new Promise((r) => setTimeout(r, 50))
  const text = document.body.textContent ?? ''
  w.unmount()
  return text
}

describe('the share preview of a questionnaire', () => {
  it('shows the answers in the instrument wording and says question 9 carries a flag', async () => {
    const text = await preview(phq9(1))
    expect(text).toContain('Questionnaire ·')
    expect(text).toContain('Thoughts that you would be better off dead, or of hurting yourself in some way')
    expect(text).toContain('Several days (1)')
    expect(text).toContain('Your answer to question 9 is above "Not at all", so this questionnaire will carry a flag for Dr Ines Marlow')
  })

  it('carries no flag when question 9 is answered 0', async () => {
    const text = await preview(phq9(0))
    expect(text).not.toContain('will carry a flag')
  })
})
