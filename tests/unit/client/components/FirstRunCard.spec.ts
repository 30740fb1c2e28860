import { flushPromises, mount } from '@vue/test-utils'
import { Quasar } from 'quasar'
import { beforeEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h, Suspense } from 'vue'
import { createMemoryHistory, createRouter } from 'vue-router'
import FirstRunCard from '@/components/FirstRunCard.vue'
import { db } from '@/db/db'
import * as settings from '@/db/settingsRepository'
import { readStartupHint, writeStartupHint } from '@/db/startupHints'
import { routes } from '@/router/routes'

/** The card as PersonLayout renders it: inside Suspense, so its first read is waited for before anything shows. */
async function mountCard() {
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push('/')
  const Host = defineComponent({ render: () => h(Suspense, null, { default: () => h(FirstRunCard), fallback: () => h('p', { 'data-test': 'waiting' }) }) })
  const wrapper = mount(Host, { global: { plugins: [Quasar, router] } })
  return wrapper
}

beforeEach(async () => {
  vi.restoreAllMocks()
  await db.open()
  await db.settings.clear()
  localStorage.clear()
  document.body.innerHTML = ''
})

describe('the first-run notice at start', () => {
  it('with no hint, waits for the device to say whether it was seen, then mirrors the answer', async () => {
    await settings.writeSetting('firstRunSeenAt', 1_700_000_000_000)
    const wrapper = await mountCard()
    await vi.waitFor(() => expect(wrapper.find('[data-test=waiting]').exists()).toBe(false))
    expect(wrapper.find('[data-test=first-run]').exists()).toBe(false)
    await vi.waitFor(() => expect(readStartupHint('firstRunSeen')).toBe(true))
  })

  it('with no hint on a new device, shows the notice in the first render and mirrors "not seen"', async () => {
    const wrapper = await mountCard()
    await vi.waitFor(() => expect(wrapper.find('[data-test=waiting]').exists()).toBe(false))
    expect(wrapper.find('[data-test=first-run]').exists()).toBe(true)
    await vi.waitFor(() => expect(readStartupHint('firstRunSeen')).toBe(false))
  })

  it('with a hint, renders at once without waiting for the device', async () => {
    writeStartupHint('firstRunSeen', false)
    // A device database that never answers: only the hint can put the card on screen.
    vi.spyOn(settings, 'readSetting').mockReturnValue(new Promise(() => undefined))
    const wrapper = await mountCard()
    await flushPromises()
    expect(wrapper.find('[data-test=waiting]').exists()).toBe(false)
    expect(wrapper.find('[data-test=first-run]').exists()).toBe(true)
  })

  it('with no hint, waits for the device before anything shows', async () => {
    vi.spyOn(settings, 'readSetting').mockReturnValue(new Promise(() => undefined))
    const wrapper = await mountCard()
    await flushPromises()
    expect(wrapper.find('[data-test=waiting]').exists()).toBe(true)
    expect(wrapper.find('[data-test=first-run]').exists()).toBe(false)
  })

  it('"I understand" hides it and mirrors "seen", so the next start shows nothing without waiting', async () => {
    writeStartupHint('firstRunSeen', false)
    const wrapper = await mountCard()
    await vi.waitFor(() => expect(wrapper.find('[data-test=first-run-ok]').exists()).toBe(true))
    await wrapper.find('[data-test=first-run-ok]').trigger('click')
    await vi.waitFor(() => expect(wrapper.find('[data-test=first-run]').exists()).toBe(false))
    expect(await settings.readSetting('firstRunSeenAt')).toBeTypeOf('number')
    await vi.waitFor(() => expect(readStartupHint('firstRunSeen')).toBe(true))
    wrapper.unmount()
    const again = await mountCard()
    await flushPromises()
    expect(again.find('[data-test=first-run]').exists()).toBe(false)
    expect(again.find('[data-test=waiting]').exists()).toBe(false)
  })

  it('a hint that is out of step gives way to the device once it answers', async () => {
    writeStartupHint('firstRunSeen', false)
    await settings.writeSetting('firstRunSeenAt', 1_700_000_000_000)
    const wrapper = await mountCard()
    await vi.waitFor(() => expect(readStartupHint('firstRunSeen')).toBe(true))
    await flushPromises()
    expect(wrapper.find('[data-test=waiting]').exists()).toBe(false)
    expect(wrapper.find('[data-test=first-run]').exists()).toBe(false)
  })
})
