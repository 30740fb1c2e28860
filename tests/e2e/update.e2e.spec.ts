import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { loadConfig } from '../../server/config/env'
import { silentLogger } from '../../server/log/logger'
import { startServer, type Running } from '../../server/start'
import { freshContext } from '../helpers/chromium'

// A copy of dist/ that the test can change, as a new deploy would.
let clientDir: string
let dataDir: string
let running: Running

beforeAll(async () => {
  if (!fs.existsSync(path.resolve('dist/sw.js'))) throw new Error('dist/ is missing: run `npm run build` first (npm test does).')
  clientDir = fs.mkdtempSync(path.join(os.tmpdir(), 'rungs-dist-'))
  fs.cpSync(path.resolve('dist'), clientDir, { recursive: true })
  dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'rungs-update-'))
  const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: dataDir, PORT: '0', SCRYPT_COST: '1024' }, { clientDir })
  running = await startServer(config, silentLogger())
})
afterAll(async () => {
  await running?.close()
  for (const d of [clientDir, dataDir]) fs.rmSync(d, { recursive: true, force: true })
})

describe('a new version of the app', () => {
  it('waits for the person to choose "Reload now" instead of swapping code under them', async () => {
    const { context, close } = await freshContext()
    const page = await context.newPage()
    await page.goto(running.url)
    await page.getByRole('heading', { name: 'A moment', exact: true }).waitFor()
    await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined))
    await page.reload()
    await page.waitForFunction(() => navigator.serviceWorker.controller !== null)
    await page.evaluate(() => { (window as unknown as { stillHere: boolean }).stillHere = true })

    // Deploy a new service worker, then let the page check for it.
    fs.appendFileSync(path.join(clientDir, 'sw.js'), '\n// next release\n')
    await page.evaluate(async () => { await (await navigator.serviceWorker.getRegistration())?.update() })
    const prompt = page.locator('[data-test=update-prompt]')
    await prompt.waitFor()
    expect(await page.evaluate(() => (window as unknown as { stillHere?: boolean }).stillHere)).toBe(true)

    await prompt.getByRole('button', { name: 'Reload now' }).click()
    await page.waitForFunction(() => !(window as unknown as { stillHere?: boolean }).stillHere)
    await page.getByRole('heading', { name: 'A moment', exact: true }).waitFor()
    expect(await page.locator('[data-test=update-prompt]').count()).toBe(0)
    await close()
  })
})
