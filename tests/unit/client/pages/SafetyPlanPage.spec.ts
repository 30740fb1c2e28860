import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { Dialog, Notify, QLayout, QPageContainer, Quasar } from 'quasar'
import { beforeEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h } from 'vue'
import { createMemoryHistory, createRouter } from 'vue-router'
import { db } from '@/db/db'
import { SAFETY_PLAN_DRAFT_ID } from '@/db/safetyPlanRepository'
import SafetyPlanPage from '@/pages/SafetyPlanPage.vue'
import { routes } from '@/router/routes'
import { useDeviceSettingsStore } from '@/stores/deviceSettings'

// Words that name ways of hurting oneself. The plan's prompts must never contain any of them (safe-messaging practice).
const neverSay = [
  'method', 'means', 'pill', 'pills', 'tablet', 'tablets', 'medication', 'medicine', 'overdose', 'drug', 'drugs', 'poison',
  'knife', 'knives', 'blade', 'blades', 'razor', 'gun', 'guns', 'firearm', 'weapon', 'rope', 'ligature', 'cord', 'belt',
  'bridge', 'cliff', 'rail', 'train', 'jump', 'hang', 'hanging', 'cut', 'cutting', 'lethal', 'car', 'gas', 'alcohol',
]

async function settle(ms = 30) {
  await flushPromises()
  await new Promise((r) => setTimeout(r, ms))
  await flushPromises()
}

async function mountPage(region: 'UK' | 'US' = 'UK') {
  const pinia = createPinia()
  setActivePinia(pinia)
  await useDeviceSettingsStore().setRegion(region)
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push('/more/safety-plan')
  await router.isReady()
  const Host = defineComponent({ render: () => h(QLayout, { view: 'hHh lpR fFf' }, () => h(QPageContainer, () => h(SafetyPlanPage))) })
  const wrapper = mount(Host, { global: { plugins: [[Quasar, { plugins: { Notify, Dialog } }], pinia, router] }, attachTo: document.body })
  await settle()
  return wrapper
}

type W = Awaited<ReturnType<typeof mountPage>>
const click = async (w: W, test: string) => {
  await w.get(`[data-test=${test}]`).trigger('click')
  await settle()
}
const typeInto = async (w: W, selector: string, value: string) => {
  await w.get(selector).setValue(value)
  await settle()
}
const planEntries = () => db.entries.where('kind').equals('safetyPlan').toArray()

describe('the safety plan page', () => {
  beforeEach(async () => {
    document.body.innerHTML = ''
    await Promise.all([db.entries.clear(), db.drafts.clear(), db.settings.clear()])
  })

  it('says the plan is best made with your therapist and that Rungs is not watched in real time', async () => {
    const w = await mountPage()
    const intro = w.get('[data-test=plan-intro]').text()
    expect(intro).toContain('best made together with your therapist')
    expect(intro).toContain('not watching Rungs in real time')
    w.unmount()
  })

  it('prefills professionals and crisis lines from the chosen Help now region', async () => {
    const w = await mountPage('UK')
    await click(w, 'plan-start')
    const names = w.findAll('[data-test=plan-contacts-professionals] input[data-test=plan-contact-name]').map((i) => (i.element as HTMLInputElement).value)
    const phones = w.findAll('[data-test=plan-contacts-professionals] input[data-test=plan-contact-phone]').map((i) => (i.element as HTMLInputElement).value)
    expect(names).toEqual(['Emergency services', 'Samaritans', 'NHS 111, option 2 (England)', 'Shout'])
    expect(phones.slice(0, 2)).toEqual(['999', '116 123']) // REFERENCE §5: UK 999, Samaritans 116 123 [C]
    w.unmount()

    await db.drafts.clear()
    const us = await mountPage('US')
    await click(us, 'plan-start')
    const usNames = us.findAll('[data-test=plan-contacts-professionals] input[data-test=plan-contact-name]').map((i) => (i.element as HTMLInputElement).value)
    expect(usNames).toContain('988 Suicide & Crisis Lifeline') // REFERENCE §5: US 988 [C]
    us.unmount()
  })

  it('creates exactly one safety plan entry, and a second save updates it with a higher version', async () => {
    const w = await mountPage()
    await click(w, 'plan-start')
    await w.get('[data-test=plan-lines-warningSigns] [data-test=plan-line-add]').trigger('click')
    await settle()
    await typeInto(w, '[data-test=plan-lines-warningSigns] textarea[data-test=plan-line]', 'Staying in bed all day')
    await click(w, 'plan-save')
    await settle(50)

    let rows = await planEntries()
    expect(rows).toHaveLength(1)
    expect(rows[0]?.version).toBe(1)
    expect(rows[0]?.body).toBe('')
    expect(rows[0]?.safetyPlan?.warningSigns).toEqual(['Staying in bed all day'])
    expect(rows[0]?.safetyPlan?.professionals[0]).toMatchObject({ name: 'Emergency services', phone: '999' })
    expect(await db.drafts.get(SAFETY_PLAN_DRAFT_ID)).toBeUndefined()
    // The read view shows the saved plan, with numbers to tap.
    expect(w.get('[data-test=plan-read]').text()).toContain('Staying in bed all day')
    expect(w.find('[data-test=plan-read] a[href="tel:116123"]').exists()).toBe(true)

    await click(w, 'plan-edit')
    await typeInto(w, 'textarea[data-test=plan-reason]', 'My niece')
    await click(w, 'plan-save')
    await settle(50)
    rows = await planEntries()
    expect(rows).toHaveLength(1)
    expect(rows[0]?.version).toBe(2)
    expect(rows[0]?.safetyPlan?.reasonToKeepGoing).toBe('My niece')
    expect(rows[0]?.safetyPlan?.warningSigns).toEqual(['Staying in bed all day'])
    w.unmount()
  })

  it('keeps unsaved changes as a draft when the person leaves mid-edit, and brings them back', async () => {
    const w = await mountPage()
    await click(w, 'plan-start')
    await typeInto(w, 'textarea[data-test=plan-reason]', 'The allotment in spring')
    w.unmount()
    await settle()
    expect((await db.drafts.get(SAFETY_PLAN_DRAFT_ID))?.data.safetyPlan?.reasonToKeepGoing).toBe('The allotment in spring')
    expect(await planEntries()).toHaveLength(0)

    const again = await mountPage()
    await vi.waitFor(() => expect(again.find('[data-test=plan-restored]').exists()).toBe(true))
    expect((again.get('textarea[data-test=plan-reason]').element as HTMLTextAreaElement).value).toBe('The allotment in spring')
    again.unmount()
  })

  it('moves and removes lines with buttons', async () => {
    const w = await mountPage()
    await click(w, 'plan-start')
    const add = () => w.get('[data-test=plan-lines-onMyOwn] [data-test=plan-line-add]').trigger('click')
    await add(); await settle(); await add(); await settle()
    const lines = () => w.findAll('[data-test=plan-lines-onMyOwn] textarea[data-test=plan-line]')
    await lines()[0]!.setValue('Music')
    await lines()[1]!.setValue('A walk')
    await settle()
    await w.findAll('[data-test=plan-lines-onMyOwn] [data-test=plan-line-up]')[1]!.trigger('click')
    await settle()
    expect(lines().map((l) => (l.element as HTMLTextAreaElement).value)).toEqual(['A walk', 'Music'])
    await w.findAll('[data-test=plan-lines-onMyOwn] [data-test=plan-line-remove]')[0]!.trigger('click')
    await settle()
    expect(lines().map((l) => (l.element as HTMLTextAreaElement).value)).toEqual(['Music'])
    w.unmount()
  })

  it('refuses an over-long line with a message naming the step and line, and keeps the writing', async () => {
    const w = await mountPage()
    await click(w, 'plan-start')
    await w.get('[data-test=plan-lines-peopleAndPlaces] [data-test=plan-line-add]').trigger('click')
    await settle()
    await typeInto(w, '[data-test=plan-lines-peopleAndPlaces] textarea[data-test=plan-line]', 'x'.repeat(501))
    await click(w, 'plan-save')
    expect(w.get('[data-test=plan-problems]').text()).toContain('People and places that help me feel better, line 1: Keep each line under 500 characters.')
    expect(await planEntries()).toHaveLength(0)
    expect((w.get('[data-test=plan-lines-peopleAndPlaces] textarea[data-test=plan-line]').element as HTMLTextAreaElement).value).toHaveLength(501)
    w.unmount()
  })

  it('never uses a word that names a way of hurting oneself, in the read view or in any prompt', async () => {
    const w = await mountPage()
    const pageText = () => document.body.textContent!.toLowerCase()
    const found = (text: string) => neverSay.filter((word) => new RegExp(`\\b${word}\\b`).test(text))
    expect(found(pageText())).toEqual([])
    await click(w, 'plan-start')
    expect(w.findAll('[data-test=plan-prompt]')).toHaveLength(7)
    const prompts = w.findAll('[data-test=plan-prompt]').map((p) => p.text().toLowerCase()).join(' ')
    expect(found(prompts)).toEqual([])
    expect(found(pageText())).toEqual([])
    expect(prompts).toContain('with your therapist')
    w.unmount()
  })
})
