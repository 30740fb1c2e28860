import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { freshContext } from '../helpers/chromium'
import { recordRequests, startE2eServer } from '../helpers/e2eServer'
import { sampleTug, saveMoment, writeTug } from '../helpers/journalFlows'

let server: Awaited<ReturnType<typeof startE2eServer>> | undefined
afterAll(async () => { await server?.close() })

describe('journalling on the device, offline from the start', () => {
  it('writes a moment and a tug, finds them after a reload, and survives export, clearing site data and import', async () => {
    server = await startE2eServer()
    const origin = new URL(server.url).origin
    const { context, close } = await freshContext()
    const page = await context.newPage()
    const requests = recordRequests(page)

    // One online visit installs the app; then the server goes away and the network is off.
    await page.goto(server.url)
    await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined))
    await page.reload()
    await page.waitForFunction(() => navigator.serviceWorker.controller !== null)
    await server.close()
    server = undefined
    await context.setOffline(true)
    await page.reload()
    await page.getByRole('heading', { name: 'A moment', exact: true }).waitFor()
    await page.locator('[data-test=first-run-ok]').click()

    await saveMoment(page, 'Woke at 4am with my chest tight about the meeting.')
    await page.goto(origin)
    await writeTug(page, sampleTug)
    expect(await page.locator('[data-test=meeting-point]').textContent()).toContain('Looking after my family')

    // A reload brings both back from IndexedDB.
    await page.reload()
    await page.goto(origin + '/journal')
    await page.locator('[data-test=entry-card]').nth(1).waitFor()
    expect(await page.locator('[data-test=entry-card]').count()).toBe(2)

    // Search finds the tug by a word that appears only in one of its rungs.
    await page.locator('[data-test=journal-search]').fill('energy')
    await page.waitForFunction(() => document.querySelector('[data-test=journal-count]')?.textContent?.includes('1 entry found'))
    expect(await page.locator('[data-test=entry-card]').first().textContent()).toContain('Say no and go home on time')

    // Edit the moment, and look at the patterns.
    await page.locator('[data-test=journal-search]').fill('chest')
    await page.waitForFunction(() => document.querySelector('[data-test=journal-count]')?.textContent?.includes('1 entry found'))
    await page.locator('[data-test=entry-card]').filter({ hasText: 'chest tight' }).click()
    await page.locator('[data-test=entry-edit]').click()
    await page.locator('textarea[data-test=moment-body]').fill('Woke at 4am with my chest tight about the meeting. Tea helped.')
    await page.locator('[data-test=moment-save]').click()
    await page.getByText('Moment updated.').first().waitFor()
    expect(await page.locator('[data-test=entry-body]').textContent()).toContain('Tea helped.')
    await page.goto(origin + '/patterns')
    await page.getByRole('heading', { name: 'Patterns' }).waitFor()

    // Export a locked backup file.
    await page.goto(origin + '/more/backup')
    await page.locator('[data-test=backup-passphrase]').fill('river stones at dusk')
    await page.locator('[data-test=backup-passphrase-repeat]').fill('river stones at dusk')
    const downloading = page.waitForEvent('download')
    await page.locator('[data-test=backup-make-submit]').click()
    const download = await downloading
    const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'rungs-backup-')), download.suggestedFilename())
    await download.saveAs(file)
    const saved = JSON.parse(fs.readFileSync(file, 'utf8'))
    expect(saved.locked).toBe(true)
    expect(JSON.stringify(saved)).not.toContain('present parent')

    // Clear site data (the journal's IndexedDB and localStorage), as a person might by accident.
    const cdp = await context.newCDPSession(page)
    await cdp.send('Storage.clearDataForOrigin', { origin, storageTypes: 'indexeddb,local_storage' })
    await page.goto(origin + '/journal')
    await page.getByText('Nothing here yet').waitFor()

    // Import it back.
    await page.goto(origin + '/more/backup')
    await page.locator('[data-test=backup-restore] input[type=file]').setInputFiles(file)
    await page.locator('[data-test=backup-restore-passphrase]').fill('river stones at dusk')
    await page.locator('[data-test=backup-restore-submit]').click()
    const summary = page.locator('[data-test=backup-restore-summary]')
    await summary.waitFor()
    expect(await summary.textContent()).toContain('2 entries added')

    await page.goto(origin + '/journal')
    await page.locator('[data-test=entry-card]').nth(1).waitFor()
    expect(await page.locator('[data-test=entry-card]').count()).toBe(2)
    await page.locator('[data-test=journal-search]').fill('present parent')
    await page.waitForFunction(() => document.querySelector('[data-test=journal-count]')?.textContent?.includes('1 entry found'))

    // Nothing went to the server, or anywhere else, while journalling.
    const urls = requests.map((r) => r.url()).filter((u) => !u.startsWith('data:') && !u.startsWith('blob:'))
    expect(urls.length).toBeGreaterThan(5)
    expect(urls.filter((u) => new URL(u).pathname.startsWith('/api'))).toEqual([])
    expect(urls.filter((u) => new URL(u).origin !== origin)).toEqual([])
    await close()
  })

  it('brings back a half-written moment after a reload, and undoes a delete', async () => {
    server = await startE2eServer()
    const { context, close } = await freshContext()
    const page = await context.newPage()
    await page.goto(server.url)
    await page.locator('[data-test=first-run-ok]').click()
    await page.getByLabel('What is happening?').click()
    await page.keyboard.type('Half a sentence when the phone')
    await page.waitForTimeout(700)
    await page.reload()
    await page.getByRole('heading', { name: 'A moment', exact: true }).waitFor()
    await page.waitForFunction(() => (document.querySelector('textarea[data-test=moment-body]') as HTMLTextAreaElement | null)?.value === 'Half a sentence when the phone')

    await page.locator('[data-test=moment-save]').click()
    await page.locator('[data-test=entry-card]').first().click()
    await page.locator('[data-test=entry-delete]').click()
    await page.getByText('Nothing here yet').waitFor()
    await page.getByRole('button', { name: 'Undo' }).click()
    await page.locator('[data-test=entry-card]').first().waitFor()
    expect(await page.locator('[data-test=entry-card]').first().textContent()).toContain('Half a sentence when the phone')
    await close()
  })

  it('shows a calm card with Help now when the writing suggests self-harm, without blocking it', async () => {
    server = server ?? (await startE2eServer())
    const { context, close } = await freshContext()
    const page = await context.newPage()
    await page.goto(server.url)
    await page.getByLabel('What is happening?').fill('Tonight I keep thinking I want to end my life')
    const card = page.locator('[data-test=risk-card]')
    await card.waitFor()
    expect(await card.getByRole('button', { name: 'Help now' }).isVisible()).toBe(true)
    await page.locator('[data-test=moment-save]').click()
    await page.getByText('Moment saved, on this device.').first().waitFor()
    await close()
  })
})
