// Renders public/icons/icon.svg to the PNG sizes the web manifest lists, with the system Chromium.
import fs from 'node:fs'
import path from 'node:path'
import { freshContext } from '../helpers/chromium'

const svg = fs.readFileSync(path.resolve('public/icons/icon.svg'), 'utf8')
const { context, close } = await freshContext({ width: 512, height: 512 })
const page = await context.newPage()
for (const [name, size, pad] of [['icon-192.png', 192, 0], ['icon-512.png', 512, 0], ['icon-maskable-512.png', 512, 0.12]] as const) {
  await page.setViewportSize({ width: size, height: size })
  const inner = Math.round(size * (1 - 2 * pad))
  const bg = pad ? '#3D4A7A' : 'transparent'
  await page.setContent(`<html><body style="margin:0;background:${bg};display:grid;place-items:center;width:${size}px;height:${size}px">
    <div style="width:${inner}px;height:${inner}px">${svg.replace('<svg ', `<svg width="${inner}" height="${inner}" `)}</div></body></html>`)
  await page.screenshot({ path: path.resolve('public/icons', name), omitBackground: !pad })
}
await close()
console.log('icons written to public/icons')
