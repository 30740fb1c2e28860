import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { Quasar } from 'quasar'
import { beforeEach, describe, expect, it, vi } from 'vitest'
import { ApiError } from '@/api/http'
import SignOutEverywhereDialog from '@/components/SignOutEverywhereDialog.vue'
import { useSessionStore } from '@/stores/session'

async function openDialog(signOutEverywhere: () => Promise<void>) {
  const pinia = createPinia()
  setActivePinia(pinia)
  const session = useSessionStore()
  const spy = vi.spyOn(session, 'signOutEverywhere').mockImplementation(signOutEverywhere)
  const wrapper = mount(SignOutEverywhereDialog, {
    props: { modelValue: true, 'onUpdate:modelValue': (v: boolean) => wrapper.setProps({ modelValue: v }) },
    global: { plugins: [[Quasar, {}], pinia] },
    attachTo: document.body,
  })
  await flushPromises()
  return { wrapper, spy }
}
const button = (test: string) => document.querySelector<HTMLButtonElement>(`[data-test=${test}]`)!

describe('SignOutEverywhereDialog', () => {
  beforeEach(() => { document.body.innerHTML = '' })

  it('says every session ends and that the journal on this device stays', async () => {
    const { wrapper, spy } = await openDialog(async () => {})
    expect(document.querySelector('#signout-everywhere-title')?.textContent).toBe('Sign out everywhere?')
    expect(document.querySelector('[data-test=signout-everywhere-journal]')?.textContent).toContain('The journal on this device stays here')
    expect(button('signout-everywhere-cancel').textContent).toContain('Keep me signed in')
    expect(button('signout-everywhere-confirm').textContent).toContain('Sign out everywhere')
    expect(spy).not.toHaveBeenCalled()
    wrapper.unmount()
  })

  it('changes nothing when the person keeps their sessions', async () => {
    const { wrapper, spy } = await openDialog(async () => {})
    button('signout-everywhere-cancel').click()
    await flushPromises()
    expect(wrapper.emitted('update:modelValue')?.at(-1)).toEqual([false])
    expect(spy).not.toHaveBeenCalled()
    expect(wrapper.emitted('done')).toBeUndefined()
    wrapper.unmount()
  })

  it('signs out everywhere once on confirm, closes and reports done', async () => {
    const { wrapper, spy } = await openDialog(async () => {})
    button('signout-everywhere-confirm').click()
    await flushPromises()
    expect(spy).toHaveBeenCalledTimes(1)
    expect(wrapper.emitted('done')).toHaveLength(1)
    expect(wrapper.emitted('update:modelValue')?.at(-1)).toEqual([false])
    wrapper.unmount()
  })

  it('stays open with the server\'s message when it cannot reach the server', async () => {
    const { wrapper, spy } = await openDialog(async () => {
      throw new ApiError(0, 'offline', 'Rungs could not reach the server. Check your connection; nothing you typed is lost.')
    })
    button('signout-everywhere-confirm').click()
    await flushPromises()
    expect(spy).toHaveBeenCalledTimes(1)
    expect(document.querySelector('[data-test=signout-everywhere-error]')?.textContent).toContain('could not reach the server')
    expect(wrapper.emitted('done')).toBeUndefined()
    expect(wrapper.emitted('update:modelValue')).toBeUndefined()
    wrapper.unmount()
  })
})
