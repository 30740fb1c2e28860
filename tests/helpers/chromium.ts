import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { chromium, type BrowserContext } from 'playwright-core'

const CANDIDATES = [process.env.CHROME_PATH, '/usr/bin/chromium', '/usr/bin/chromium-browser', '/usr/bin/google-chrome'].filter(Boolean) as string[]

/** The system Chromium; fails loudly with how to install it, never skips. */
export function chromiumPath(): string {
  const found = CANDIDATES.find((p) => fs.existsSync(p))
  if (!found) {
    throw new Error('Browser tests need Chromium. Install it with `apt-get install -y chromium`, or set CHROME_PATH to a Chromium or Chrome binary.')
  }
  return found
}

export const chromiumArgs = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
]

/** A fresh profile in a temp folder, so service workers and IndexedDB start empty. */
export async function freshContext(opts: { width?: number; height?: number; colorScheme?: 'light' | 'dark'; locale?: string } = {}): Promise<{ context: BrowserContext; close(): Promise<void> }> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'rungs-chromium-'))
  const context = await chromium.launchPersistentContext(dir, {
    executablePath: chromiumPath(),
    headless: true,
    args: chromiumArgs,
    viewport: { width: opts.width ?? 390, height: opts.height ?? 844 },
    colorScheme: opts.colorScheme ?? 'light',
    locale: opts.locale ?? 'en-GB',
  })
  return {
    context,
    async close() {
      await context.close()
      fs.rmSync(dir, { recursive: true, force: true })
    },
  }
}
