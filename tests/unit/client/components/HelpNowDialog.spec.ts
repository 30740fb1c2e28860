import { mount, flushPromises } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { Quasar } from 'quasar'
import { beforeEach, describe, expect, it } from 'vitest'
import { createMemoryHistory, createRouter } from 'vue-router'
import HelpNowDialog from '@/components/HelpNowDialog.vue'
import { routes } from '@/router/routes'
import { useDeviceSettingsStore } from '@/stores/deviceSettings'

async function openDialog(region: 'UK' | 'IE' | 'US') {
  const pinia = createPinia()
  setActivePinia(pinia)
  await useDeviceSettingsStore().setRegion(region)
  const wrapper = mount(HelpNowDialog, { props: { modelValue: true }, global: { plugins: [[Quasar, {}], pinia] }, attachTo: document.body })
  await flushPromises()
  return wrapper
}

describe('HelpNowDialog', () => {
  beforeEach(() => { document.body.innerHTML = '' })

  it('puts the chosen region emergency number first, as a tap-to-call link', async () => {
    const w = await openDialog('UK')
    const call = document.querySelector('[data-test=emergency-call]')
    expect(call?.getAttribute('href')).toBe('tel:999') // REFERENCE §5: UK 999 [C]
    expect(document.body.textContent).toContain('Nobody watches Rungs in real time')
    w.unmount()
  })

  it('lists youth lines for the UK and tap-to-text links', async () => {
    const w = await openDialog('UK')
    expect(document.querySelectorAll('[data-test=youth-line]').length).toBe(2) // REFERENCE §5: Papyrus, Childline [C]
    expect(document.querySelector('a[href="sms:85258"]')).not.toBeNull() // REFERENCE §5: Shout 85258 [C]
    expect(document.querySelector('a[href="tel:116123"]')).not.toBeNull() // REFERENCE §5: Samaritans 116 123 [C]
    w.unmount()
  })

  it('says "check locally" beside a number marked from memory', async () => {
    const w = await openDialog('IE')
    expect(document.querySelector('[data-test=emergency-call]')?.getAttribute('href')).toBe('tel:112')
    // Ireland's 112 is marked [M] in REFERENCE §5.
    expect(document.body.textContent).toContain('Check this number locally.')
    w.unmount()
  })

  it('offers the safety plan in one tap, with no sign-in on the way', async () => {
    const pinia = createPinia()
    setActivePinia(pinia)
    const router = createRouter({ history: createMemoryHistory(), routes })
    await router.push('/')
    await router.isReady()
    const w = mount(HelpNowDialog, { props: { modelValue: true }, global: { plugins: [[Quasar, {}], pinia, router] }, attachTo: document.body })
    await flushPromises()
    const plan = document.querySelector('[data-test=help-now-safety-plan]')
    expect(plan?.textContent).toContain('My safety plan')
    expect(plan?.getAttribute('href')).toBe('/more/safety-plan')
    // The plan's route asks for no role, so the one guard lets anyone through.
    expect(router.resolve({ name: 'safetyPlan' }).matched.flatMap((r) => r.meta.roles ?? [])).toEqual([])
    w.unmount()
  })
})
