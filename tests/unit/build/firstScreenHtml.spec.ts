import path from 'node:path'
import type { OutputBundle } from 'rolldown'
import { beforeAll, describe, expect, it } from 'vitest'
import { firstScreenRules } from '../../../client/build/firstScreenCss'
import { appChunkCssFiles, firstScreenMarkup, renderFirstScreens } from '../../../client/build/firstScreenHtml'

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

describe("the app's whole stylesheet, and the first screen's rules picked from it", () => {
  const chunk = (fileName: string, facadeModuleId: string | null, imports: string[], css: string[]) =>
    ({ type: 'chunk', fileName, facadeModuleId, imports, viteMetadata: { importedCss: new Set(css), importedAssets: new Set() } }) as unknown
  const bundle = {
    'assets/index-a.js': chunk('assets/index-a.js', '/repo/client/main.ts', [], []),
    'assets/startApp-b.js': chunk('assets/startApp-b.js', '/repo/client/startApp.ts', ['assets/shared-c.js', 'assets/index-a.js'], ['assets/startApp-b.css']),
    'assets/shared-c.js': chunk('assets/shared-c.js', null, [], ['assets/shared-c.css']),
    'assets/JournalPage-d.js': chunk('assets/JournalPage-d.js', '/repo/client/pages/JournalPage.vue', [], ['assets/JournalPage-d.css']),
  } as unknown as OutputBundle

  it('is the stylesheets of the app chunk and of what it imports, once each, and nothing of lazy pages', () => {
    expect(appChunkCssFiles(bundle)).toEqual(['assets/startApp-b.css', 'assets/shared-c.css'])
  })

  it('fails the build when there is no app chunk', () => {
    const { 'assets/startApp-b.js': _app, ...rest } = bundle as Record<string, unknown>
    expect(() => appChunkCssFiles(rest as OutputBundle)).toThrow(/startApp/)
  })

  it('keeps, in their order, the rules the screen can match, the dark ones its first-paint script can switch on, and every font face', async () => {
    const css = [
      '@font-face{font-family:Lora;src:url(/a.woff2)}',
      '.q-btn{color:red}',
      '.q-dialog{color:blue}',
      '.body--dark .paper-card{background:#222}',
      '.q-btn:hover .q-focus-helper{opacity:.1}',
      '@media (min-width:1024px){.q-drawer{width:232px}.q-table{width:1px}}',
    ].join('')
    const html = '<body><div class="paper-card"><button class="q-btn"><span class="q-focus-helper"></span></button></div><aside class="q-drawer"></aside></body>'
    const out = (await firstScreenRules(css, [html, "document.body.classList.add(dark ? 'body--dark' : 'body--light')"])).replace(/\s*([{};,])\s*/g, '$1').replace(/;}/g, '}')
    expect(out).toContain('@font-face{font-family:Lora')
    expect(out).toContain('.q-btn{color:red}')
    expect(out).toContain('.body--dark .paper-card{background:#222}')
    expect(out).toContain('.q-btn:hover .q-focus-helper{opacity:.1}')
    expect(out).toContain('.q-drawer{width:232px}')
    expect(out).not.toContain('q-dialog')
    expect(out).not.toContain('q-table')
    expect(out.indexOf('.q-btn{')).toBeLessThan(out.indexOf('.body--dark'))
  })
})
