import { mount } from '@vue/test-utils'
import { Quasar } from 'quasar'
import { beforeEach, describe, expect, it, vi } from 'vitest'
import { createMemoryHistory, createRouter } from 'vue-router'
import BackupReminderCard from '@/components/BackupReminderCard.vue'
import { db } from '@/db/db'
import { createEntry } from '@/db/entriesRepository'
import { writeSetting } from '@/db/settingsRepository'
import { routes } from '@/router/routes'

const DAY = 24 * 60 * 60 * 1000

async function mountCard() {
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push('/')
  return mount(BackupReminderCard, { global: { plugins: [Quasar, router] } })
}

beforeEach(async () => {
  await Promise.all([db.entries.clear(), db.settings.clear()])
  document.body.innerHTML = ''
})

describe('the backup reminder on Today', () => {
  it('says how long ago the last backup file was made', async () => {
    await createEntry({ kind: 'moment', body: 'Walked the long way round the reservoir', wants: [], backgroundThoughts: [], tags: [] })
    await writeSetting('lastBackupAt', Date.now() - 20 * DAY)
    const wrapper = await mountCard()
    await vi.waitFor(() => expect(wrapper.find('[data-test=backup-reminder]').exists()).toBe(true))
    expect(wrapper.text()).toContain('The last backup file was made 2 weeks ago.')
  })

  it('says there is no backup file yet when none was made, and goes away on "Not now"', async () => {
    await createEntry({ kind: 'moment', body: 'Walked the long way round the reservoir', wants: [], backgroundThoughts: [], tags: [] })
    const wrapper = await mountCard()
    await vi.waitFor(() => expect(wrapper.find('[data-test=backup-reminder]').exists()).toBe(true))
    expect(wrapper.text()).toContain('There is no backup file of it yet.')
    await wrapper.find('[data-test=backup-reminder-snooze]').trigger('click')
    await vi.waitFor(() => expect(wrapper.find('[data-test=backup-reminder]').exists()).toBe(false))
  })

  it('stays away while the journal is empty', async () => {
    const wrapper = await mountCard()
    await new Promise((r) => setTimeout(r, 100))
    expect(wrapper.find('[data-test=backup-reminder]').exists()).toBe(false)
  })
})
