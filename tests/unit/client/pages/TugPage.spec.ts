import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { Dialog, Notify, QLayout, QPageContainer, Quasar } from 'quasar'
import { beforeEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h } from 'vue'
import { createMemoryHistory, createRouter } from 'vue-router'
import { db } from '@/db/db'
import TugPage from '@/pages/TugPage.vue'
import { RouteName } from '@/router/names'

// The first save loads the entry schemas (a dynamic import), which on a busy machine takes a while.
const WAIT = { timeout: 5000 }

async function settle(ms = 30) {
  await flushPromises()
  await new Promise((r) => setTimeout(r, ms))
  await flushPromises()
}

// Every route name as a plain stub: the app's lazy pages would keep loading after the test ends.
const Stub = defineComponent({ render: () => h('div') })
const routes = [{ path: '/', component: Stub }, ...Object.values(RouteName).map((name) => ({ path: `/${name}/:id?`, name, component: Stub }))]

async function mountFlow() {
  const pinia = createPinia()
  setActivePinia(pinia)
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push({ name: RouteName.Tug })
  await router.isReady()
  // QPage lives inside a layout, as it does in the app.
  const Host = defineComponent({ render: () => h(QLayout, { view: 'hHh lpR fFf' }, () => h(QPageContainer, () => h(TugPage))) })
  const wrapper = mount(Host, { global: { plugins: [[Quasar, { plugins: { Notify, Dialog } }], pinia, router] }, attachTo: document.body })
  await settle()
  return { wrapper, router }
}

const click = async (w: ReturnType<typeof mount>, test: string) => {
  await w.get(`[data-test=${test}]`).trigger('click')
  await settle()
}

describe('the tug flow', () => {
  beforeEach(async () => {
    document.body.innerHTML = ''
    await Promise.all([db.entries.clear(), db.drafts.clear()])
  })

  it('walks one step per screen, climbs two ladders, and saves the tug with its meeting point', async () => {
    const { wrapper, router } = await mountFlow()
    expect(wrapper.get('[data-test=tug-prompt]').text().length).toBeGreaterThan(3)
    await wrapper.get('textarea[data-test=tug-describe]').setValue('Asked to stay late again')
    await click(wrapper, 'tug-next')
    await click(wrapper, 'tug-skip') // distress before: skipped, so it stays absent
    await wrapper.get('textarea[data-test=want-text]').setValue('Go home on time')
    await click(wrapper, 'tug-next')
    await wrapper.get('textarea[data-test=want-text]').setValue('Be seen as reliable')
    await click(wrapper, 'tug-next')
    for (const rung of ['Rest', 'Energy for my kids', 'Being present']) {
      await wrapper.get('textarea[data-test=rung-input]').setValue(rung)
      await click(wrapper, 'rung-add')
    }
    expect(wrapper.findAll('[data-test=rung]').length).toBe(3)
    await click(wrapper, 'tug-next')
    await wrapper.get('textarea[data-test=rung-input]').setValue('Keeping the job')
    await click(wrapper, 'rung-add')
    await click(wrapper, 'tug-next')
    await wrapper.get('textarea[data-test=tug-meeting]').setValue('Looking after my family')
    await click(wrapper, 'tug-next')
    await click(wrapper, 'tug-next') // background
    await click(wrapper, 'tug-next') // distress after
    expect(wrapper.find('[data-test=tug-picture]').exists() || wrapper.find('[data-test=tug-picture-no-pull]').exists()).toBe(true)
    await click(wrapper, 'tug-save')

    // Saving loads the entry schemas on first use, so it is waited for rather than timed.
    const saved = await vi.waitFor(async () => {
      const [e] = await db.entries.toArray()
      expect(e).toBeDefined()
      return e
    }, WAIT)
    expect(saved?.kind).toBe('tug')
    expect(saved?.body).toBe('Asked to stay late again')
    expect(saved?.wants.map((w) => w.text)).toEqual(['Go home on time', 'Be seen as reliable'])
    expect(saved?.wants[0]?.ladder.map((r) => r.text)).toEqual(['Rest', 'Energy for my kids', 'Being present'])
    expect(saved?.meetingPoint).toBe('Looking after my family')
    expect('distressBefore' in saved!).toBe(false)
    expect(await db.drafts.get('tug:new')).toBeUndefined()
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('entry'), WAIT)
    wrapper.unmount()
  })

  it('keeps the draft and the step when stopped, and resumes there', async () => {
    const first = await mountFlow()
    await first.wrapper.get('textarea[data-test=tug-describe]').setValue('Half way through')
    await click(first.wrapper, 'tug-next')
    await click(first.wrapper, 'tug-stop')
    const draft = await vi.waitFor(async () => {
      const d = await db.drafts.get('tug:new')
      expect(d?.step).toBe('distressBefore')
      return d
    }, WAIT)
    expect(draft?.data.body).toBe('Half way through')
    expect(draft?.step).toBe('distressBefore')
    first.wrapper.unmount()

    const again = await mountFlow()
    await vi.waitFor(() => expect(again.wrapper.find('[data-test=distress-slider]').exists()).toBe(true), WAIT)
    again.wrapper.unmount()
  })

  it('offers a way out to a grounding screen, keeping what was written', async () => {
    const { wrapper, router } = await mountFlow()
    await wrapper.get('textarea[data-test=tug-describe]').setValue('This is a lot')
    await click(wrapper, 'tug-too-much')
    await settle(50)
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('grounding'), WAIT)
    await vi.waitFor(async () => expect((await db.drafts.get('tug:new'))?.data.body).toBe('This is a lot'), WAIT)
    wrapper.unmount()
  })

  it('shows the care card when distress after is higher than before', async () => {
    await db.drafts.put({ id: 'tug:new', kind: 'tug', data: { kind: 'tug', body: 'x', distressBefore: 30, distressAfter: 45, wants: [], backgroundThoughts: [], tags: [] }, step: 'distressAfter', updatedAt: Date.now() })
    const { wrapper } = await mountFlow()
    await vi.waitFor(() => expect(wrapper.find('[data-test=distress-care]').exists()).toBe(true), WAIT)
    wrapper.unmount()
  })
})
