import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { Dialog, Notify, QLayout, QPageContainer, Quasar } from 'quasar'
import { beforeEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h } from 'vue'
import { RouterView, createMemoryHistory, createRouter } from 'vue-router'
import { gad7Form, phq9Form } from '@shared/content/measureForms'
import { db } from '@/db/db'
import { routes } from '@/router/routes'

// Lazy pages load slowly on a busy machine; waits are generous, never asserted.
const WAIT = { timeout: 8000 }

async function settle(ms = 30) {
  await flushPromises()
  await new Promise((r) => setTimeout(r, ms))
  await flushPromises()
}

async function mountAt(path: string) {
  const pinia = createPinia()
  setActivePinia(pinia)
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push(path)
  await router.isReady()
  const Host = defineComponent({ render: () => h(QLayout, { view: 'hHh lpR fFf' }, () => h(QPageContainer, () => h(RouterView))) })
  const wrapper = mount(Host, { global: { plugins: [[Quasar, { plugins: { Notify, Dialog } }], pinia, router] }, attachTo: document.body })
  await settle(80)
  return { wrapper, router }
}

type W = Awaited<ReturnType<typeof mountAt>>['wrapper']
const click = async (w: W, test: string) => {
  await w.get(`[data-test=${test}]`).trigger('click')
  await settle()
}
/** Answers the current question, or skips it when the answer is null, then moves on. */
async function answerAll(w: W, answers: (number | null)[]) {
  for (const a of answers) {
    if (a === null) await click(w, 'measure-skip')
    else {
      await click(w, `measure-choice-${a}`)
      await click(w, 'measure-next')
    }
  }
}

describe('the questionnaire form', () => {
  beforeEach(async () => {
    document.body.innerHTML = ''
    await Promise.all([db.entries.clear(), db.trash.clear(), db.settings.clear(), db.links.clear()])
  })

  it('shows one question per step in the PHQ-9 wording, with its recall period, and Back returns to the previous one', async () => {
    const { wrapper } = await mountAt('/measures/new/phq9')
    expect(wrapper.findAll('[data-test=measure-question]')).toHaveLength(1)
    expect(wrapper.get('[data-test=measure-question]').text()).toBe(phq9Form.items[0]!.text)
    expect(wrapper.get('[data-test=measure-stem]').text()).toBe('Over the last 2 weeks, how often have you been bothered by any of the following problems?')
    expect(wrapper.findAll('[data-test^=measure-choice-]').map((b) => b.text())).toEqual(['0Not at all', '1Several days', '2More than half the days', '3Nearly every day'])
    expect(wrapper.text()).toContain('No permission required to reproduce, translate, display or distribute.')
    await click(wrapper, 'measure-choice-2')
    await click(wrapper, 'measure-next')
    expect(wrapper.get('[data-test=measure-question]').text()).toBe(phq9Form.items[1]!.text)
    expect(wrapper.get('[data-test=measure-progress]').text()).toContain('question 2 of 9')
    await click(wrapper, 'measure-back')
    expect(wrapper.get('[data-test=measure-question]').text()).toBe(phq9Form.items[0]!.text)
    expect(wrapper.get('[data-test=measure-choice-2]').attributes('aria-pressed')).toBe('true')
    wrapper.unmount()
  })

  it('shows the care card the moment question 9 is answered above 0, and an abandoned form keeps its answers', async () => {
    const { wrapper } = await mountAt('/measures/new/phq9')
    await answerAll(wrapper, [1, 1, 2, 0, 1, 0, 1, 0])
    expect(wrapper.get('[data-test=measure-question]').text()).toBe(phq9Form.items[8]!.text)
    expect(wrapper.find('[data-test=measure-selfharm-card]').exists()).toBe(false)
    expect(wrapper.get('[data-test=measure-item9-note]').text()).toContain('Help now is always there')

    await click(wrapper, 'measure-choice-1')
    // Still on question 9, before any score: the card is there at once.
    expect(wrapper.get('[data-test=measure-question]').text()).toBe(phq9Form.items[8]!.text)
    const card = wrapper.get('[data-test=measure-selfharm-card]')
    expect(card.find('[data-test=help-now]').exists()).toBe(true)
    expect(card.get('[data-test=measure-safety-plan-link]').attributes('href')).toBe('/more/safety-plan')
    expect(card.get('[data-test=measure-not-watched]').text()).toContain('not watching Rungs in real time')
    expect(card.get('[data-test=measure-selfharm-emergency]').attributes('href')).toMatch(/^tel:\d+$/)
    expect(wrapper.find('[data-test=measure-score]').exists()).toBe(false)

    // Walks away here.
    wrapper.unmount()
    await settle(50)
    const [saved] = await db.entries.toArray()
    expect(saved?.kind).toBe('measure')
    expect(saved?.measure).toEqual({ instrument: 'phq9', answers: [1, 1, 2, 0, 1, 0, 1, 0, 1] })
    expect(saved?.body).toBe('')
    expect(saved?.tags).toEqual([])
  })

  it('puts the care card before the score on the result, after the difficulty question (not scored)', async () => {
    const { wrapper, router } = await mountAt('/measures/new/phq9')
    await answerAll(wrapper, [2, 2, 2, 2, 1, 1, 2, 0, 1])
    expect(wrapper.get('[data-test=measure-question]').text()).toContain('how difficult have these problems made it for you')
    await click(wrapper, 'measure-choice-1')
    await click(wrapper, 'measure-finish')
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('measureEntry'), WAIT)
    await vi.waitFor(() => expect(wrapper.find('[data-test=measure-score]').exists()).toBe(true), WAIT)
    const html = wrapper.html()
    expect(html.indexOf('data-test="measure-selfharm-card"')).toBeGreaterThan(-1)
    expect(html.indexOf('data-test="measure-selfharm-card"')).toBeLessThan(html.indexOf('data-test="measure-score"'))
    expect(wrapper.get('[data-test=measure-total]').text()).toBe('13') // REFERENCE §1 worked example 12, plus item 9 = 1
    expect(wrapper.get('[data-test=measure-band]').text()).toContain('moderate')
    const [saved] = await db.entries.toArray()
    expect(saved?.measure?.difficulty).toBe(1)
    expect(typeof saved?.measure?.completedAt).toBe('number')
    wrapper.unmount()
  })

  it('says "not scored" when question 9 is skipped, never a total of 0 or a guess', async () => {
    const { wrapper } = await mountAt('/measures/new/phq9')
    await answerAll(wrapper, [0, 0, 0, 0, 0, 0, 0, 0, null])
    await click(wrapper, 'measure-finish')
    await vi.waitFor(() => expect(wrapper.find('[data-test=measure-score]').exists()).toBe(true), WAIT)
    expect(wrapper.get('[data-test=measure-incomplete]').text()).toContain('Not scored')
    expect(wrapper.get('[data-test=measure-incomplete]').text()).toContain('question 9, which is never guessed')
    expect(wrapper.find('[data-test=measure-total]').exists()).toBe(false)
    expect(wrapper.get('[data-test=measure-answer-9]').text()).toContain('Skipped')
    const [saved] = await db.entries.toArray()
    expect(saved?.measure?.answers[8]).toBeNull()
    wrapper.unmount()
  })

  it('says a total with skipped questions is estimated from the answered ones', async () => {
    const { wrapper } = await mountAt('/measures/new/phq9')
    await answerAll(wrapper, [2, null, 2, 2, 1, 1, 2, 0, 0])
    await click(wrapper, 'measure-skip') // difficulty skipped: finishes
    await vi.waitFor(() => expect(wrapper.find('[data-test=measure-score]').exists()).toBe(true), WAIT)
    // Arrieta et al. 2017 rule: 10 from the 8 answered items, the skipped one filled with their mean (10/8) -> 11.25 -> 11
    expect(wrapper.get('[data-test=measure-total]').text()).toBe('11')
    expect(wrapper.get('[data-test=measure-prorated]').text()).toContain('Estimated from the answered questions')
    wrapper.unmount()
  })

  it('leaves a GAD-7 with a skipped question unscored, with the reason', async () => {
    const { wrapper } = await mountAt('/measures/new/gad7')
    expect(wrapper.get('[data-test=measure-question]').text()).toBe(gad7Form.items[0]!.text)
    await answerAll(wrapper, [1, 1, null, 1, 0, 1, 2])
    await click(wrapper, 'measure-finish')
    await vi.waitFor(() => expect(wrapper.find('[data-test=measure-score]').exists()).toBe(true), WAIT)
    expect(wrapper.get('[data-test=measure-incomplete]').text()).toBe('Not scored: 1 question was skipped. A GAD-7 needs every question answered.')
    expect(wrapper.find('[data-test=measure-selfharm-card]').exists()).toBe(false)
    wrapper.unmount()
  })

  it('resumes an unfinished form after its last answer', async () => {
    const first = await mountAt('/measures/new/gad7')
    await answerAll(first.wrapper, [1, 2])
    first.wrapper.unmount()
    await settle(50)
    const [saved] = await db.entries.toArray()
    expect(saved?.measure?.answers).toEqual([1, 2, null, null, null, null, null])
    const again = await mountAt(`/measures/new/gad7?entry=${saved!.id}`)
    expect(again.wrapper.get('[data-test=measure-question]').text()).toBe(gad7Form.items[2]!.text)
    await answerAll(again.wrapper, [1, 1, 0, 1, 2])
    await click(again.wrapper, 'measure-finish')
    await vi.waitFor(() => expect(again.router.currentRoute.value.name).toBe('measureEntry'), WAIT)
    expect(await db.entries.count()).toBe(1)
    expect((await db.entries.get(saved!.id))?.measure?.answers).toEqual([1, 2, 1, 1, 0, 1, 2])
    again.wrapper.unmount()
  })
})
