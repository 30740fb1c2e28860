import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import type { Page, Request } from 'playwright-core'
import { loadConfig } from '../../server/config/env'
import { silentLogger } from '../../server/log/logger'
import { startServer, type Running } from '../../server/start'

/**
 * The real server on a free loopback port, serving the built client, with a fresh SQLite file and the demo seed.
 * `env` adds settings, e.g. a tiny SESSION_IDLE_MINUTES.
 */
export async function startE2eServer(env: Record<string, string> = {}): Promise<Running & { dataDir: string }> {
  if (!fs.existsSync(path.resolve('dist/index.html'))) throw new Error('dist/ is missing: run `npm run build` first (npm test does).')
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'rungs-e2e-'))
  const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: dataDir, PORT: '0', SCRYPT_COST: '1024', SEED_DEMO: 'true', ...env })
  const running = await startServer(config, silentLogger())
  const close = running.close
  return {
    ...running,
    dataDir,
    async close() {
      await close()
      fs.rmSync(dataDir, { recursive: true, force: true })
    },
  }
}

/** Records every request a page makes, for privacy assertions. */
export function recordRequests(page: Page): Request[] {
  const seen: Request[] = []
  page.on('request', (r) => seen.push(r))
  return seen
}

export async function signInThroughForm(page: Page, base: string, email: string, password: string): Promise<void> {
  await page.goto(`${base}/signin`)
  await page.getByLabel('E-mail', { exact: true }).fill(email)
  await page.getByLabel('Password').fill(password)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.waitForURL((u) => !u.pathname.startsWith('/signin'))
}
