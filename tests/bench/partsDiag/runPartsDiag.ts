import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import express from 'express'
import { build } from 'vite'
import viteConfig from '../../../vite.config'
import { freshContext } from '../../helpers/chromium'
const root = fileURLToPath(new URL('.', import.meta.url))
const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'rungsDiag-'))
await build({ configFile: false, root, base: './', logLevel: 'warn', publicDir: false, cacheDir: path.join(tmp, 'c'), resolve: { alias: viteConfig.resolve?.alias }, build: { outDir: path.join(tmp, 'd'), emptyOutDir: true } })
const app = express()
app.use((_q, res, next) => { res.set({ 'Cross-Origin-Opener-Policy': 'same-origin', 'Cross-Origin-Embedder-Policy': 'require-corp' }); next() })
app.use(express.static(path.join(tmp, 'd')))
const server = app.listen(0, '127.0.0.1')
await new Promise((r) => server.once('listening', r))
const port = (server.address() as any).port
const b = await freshContext()
const page = await b.context.newPage()
page.on('pageerror', (e) => console.error(e))
await page.goto(`http://127.0.0.1:${port}/`)
const out = await page.evaluate(() => (window as any).runDiag())
for (const [k, v] of Object.entries(out)) console.log(k.padEnd(56), v)
await b.close(); server.closeAllConnections(); server.close(); fs.rmSync(tmp, { recursive: true, force: true })
