import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { freshContext } from '../helpers/chromium'
import { recordRequests, startE2eServer } from '../helpers/e2eServer'

let server: Awaited<ReturnType<typeof startE2eServer>>
beforeAll(async () => { server = await startE2eServer() })
afterAll(async () => { await server?.close() })

describe('a device that has never signed in', () => {
  it('makes zero requests to /api and none to any other origin', async () => {
    const { context, close } = await freshContext()
    const page = await context.newPage()
    const requests = recordRequests(page)
    await page.goto(server.url)
    await page.getByRole('heading', { name: 'A moment', exact: true }).waitFor()
    await page.getByRole('tab', { name: 'More' }).click()
    await page.getByRole('heading', { name: 'More' }).waitFor()
    await page.getByText('Settings', { exact: true }).first().click()
    await page.getByRole('heading', { name: 'Settings' }).waitFor()
    await page.getByRole('button', { name: 'Dark' }).click()
    await page.getByRole('button', { name: 'Help now' }).click()
    await page.getByLabel('Where are you?').click()
    await page.getByRole('option', { name: 'Ireland' }).click()
    await page.keyboard.press('Escape')
    await page.reload()
    await page.getByRole('heading', { name: 'Settings' }).waitFor()
    await page.waitForTimeout(500)

    const origin = new URL(server.url).origin
    const urls = requests.map((r) => r.url())
    expect(urls.length).toBeGreaterThan(3)
    expect(urls.filter((u) => new URL(u).pathname.startsWith('/api'))).toEqual([])
    expect(urls.filter((u) => !u.startsWith('data:') && new URL(u).origin !== origin)).toEqual([])
    // The region choice lives in IndexedDB, not in localStorage: only the appearance and the yes/no start-up hints do.
    const stored = await page.evaluate(() => Object.entries(localStorage))
    const allowed = ['rungs.appearance', 'rungs.lockSet', 'rungs.firstRunSeen']
    expect(stored.filter(([k]) => !allowed.includes(k))).toEqual([])
    expect(stored.filter(([k, v]) => k !== 'rungs.appearance' && v !== 'yes' && v !== 'no')).toEqual([])
    await close()
  })
})
