import path from 'node:path'
import type { OutputBundle } from 'rolldown'
import { beforeAll, describe, expect, it } from 'vitest'
import { appChunkCss, firstScreenMarkup, renderFirstScreens } from '../../../client/build/firstScreenHtml'

const repoRoot = path.resolve(__dirname, '../../..')
const count = (html: string, needle: string) => html.split(needle).length - 1

// Renders Today with the app's real components, as the build does for index.html.
describe('the first screen rendered at build time', () => {
  let phone: string
  let wide: string
  beforeAll(async () => {
    ;({ phone, wide } = await renderFirstScreens(repoRoot))
  }, 120_000)

  it('is Today as a first visit sees it: the notice, the form, the tug card and Help now', () => {
    for (const html of [phone, wide]) {
      expect(html).toContain('id="moment-title"')
      expect(html).toContain('data-test="moment-body"')
      expect(html).toContain('data-test="first-run"')
      expect(html).toContain('data-test="tug-start"')
      expect(html).toContain('data-test="help-now"')
      // Nothing from a device: no entry cards and no "Nothing yet" line until the app has read the database.
      expect(html).not.toContain('Nothing yet')
    }
  })

  it('has bottom tabs on phones and a side drawer when wide, as the app layout does', () => {
    expect(phone).toContain('q-footer')
    expect(phone).not.toContain('q-drawer')
    expect(wide).toContain('q-drawer')
    expect(wide).not.toContain('q-footer')
  })

  it('is put in index.html once: one form, one Help now button, the drawer and the tabs both there for the CSS to pick', () => {
    const html = firstScreenMarkup({ phone, wide })
    expect(html.startsWith('<div class="first-screen">')).toBe(true)
    expect(count(html, 'id="moment-title"')).toBe(1)
    expect(count(html, 'data-test="help-now"')).toBe(1)
    expect(count(html, 'class="q-drawer-container"')).toBe(1)
    expect(count(html, '<footer class="q-footer')).toBe(1)
    expect(html.indexOf('q-drawer-container')).toBeLessThan(html.indexOf('q-page-container'))
  })

  it('refuses renders it does not recognise rather than writing a broken screen', () => {
    expect(() => firstScreenMarkup({ phone: wide, wide })).toThrow(/layout/)
    expect(() => firstScreenMarkup({ phone, wide: phone })).toThrow(/layout/)
  })
})

describe("index.html's stylesheets for the app's own chunks", () => {
  const chunk = (fileName: string, facadeModuleId: string | null, imports: string[], css: string[]) =>
    ({ type: 'chunk', fileName, facadeModuleId, imports, viteMetadata: { importedCss: new Set(css), importedAssets: new Set() } }) as unknown
  const bundle = {
    'assets/index-a.js': chunk('assets/index-a.js', '/repo/client/main.ts', [], ['assets/index-a.css']),
    'assets/startApp-b.js': chunk('assets/startApp-b.js', '/repo/client/startApp.ts', ['assets/shared-c.js', 'assets/index-a.js'], ['assets/startApp-b.css']),
    'assets/shared-c.js': chunk('assets/shared-c.js', null, [], ['assets/shared-c.css']),
    'assets/JournalPage-d.js': chunk('assets/JournalPage-d.js', '/repo/client/pages/JournalPage.vue', [], ['assets/JournalPage-d.css']),
  } as unknown as OutputBundle
  const html = '<script type="module" src="/assets/index-a.js"></script><link rel="stylesheet" href="/assets/index-a.css">'

  it("links the stylesheets of the app chunk and of what it imports, once each, and nothing of lazy pages", () => {
    const tags = appChunkCss(bundle, html)
    expect(tags).toContain('<link rel="stylesheet" crossorigin href="/assets/startApp-b.css">')
    expect(tags).toContain('<link rel="stylesheet" crossorigin href="/assets/shared-c.css">')
    expect(tags).not.toContain('index-a')
    expect(tags).not.toContain('JournalPage')
    expect(tags).not.toContain('.js')
  })

  it('fails the build when there is no app chunk', () => {
    const { 'assets/startApp-b.js': _app, ...rest } = bundle as Record<string, unknown>
    expect(() => appChunkCss(rest as OutputBundle, html)).toThrow(/startApp/)
  })
})
