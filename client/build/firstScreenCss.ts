import fs from 'node:fs'
import path from 'node:path'
import { PurgeCSS } from 'purgecss'
import type { OutputAsset, OutputBundle } from 'rolldown'
import type { Plugin } from 'vite'
import { appChunkCssFiles } from './firstScreenHtml'

/**
 * The rules of the app's stylesheet that index.html's prerendered Today can match. A rule stays when every class, id,
 * element and attribute in its selector is written in `content` (index.html as built, and first-paint.js, which sets
 * body--dark or body--light before the first paint); @font-face, @keyframes and custom properties all stay.
 */
export async function firstScreenRules(css: string, content: string[]): Promise<string> {
  const [result] = await new PurgeCSS().purge({
    content: content.map((raw) => ({ raw, extension: 'html' })),
    css: [{ raw: css }],
  })
  return result!.css
}

export const FIRST_PAINT_LINK = '<link rel="stylesheet" href="/first-paint.css" />'

const asset = (bundle: OutputBundle, fileName: string): OutputAsset => {
  const a = bundle[fileName]
  if (a?.type !== 'asset') throw new Error(`the build has no ${fileName}`)
  return a
}

/**
 * Build only: index.html links just the first screen's rules, so a phone lays out and paints Today without parsing and
 * matching the whole stylesheet first (about 20 KB gzip, mostly Quasar's). The whole stylesheet is the app chunk's
 * own, which loads with that chunk (main.ts imports it once the screen is painted, when the service worker serves the
 * page); it comes after the first screen's rules and holds every rule in its original order, so once it is in, each
 * element is styled exactly as without this step. The chunk's code is not preloaded: measured, a modulepreload of it
 * held back the stylesheets and fonts on a slow network and the first paint from the service worker.
 */
export function firstScreenCss(repoRoot: string): Plugin {
  return {
    name: 'rungs:first-screen-css',
    apply: 'build',
    enforce: 'post',
    async generateBundle(_options, bundle) {
      const page = asset(bundle, 'index.html')
      const html = String(page.source)
      const whole = appChunkCssFiles(bundle).map((f) => String(asset(bundle, f).source)).join('\n')
      const firstPaintJs = fs.readFileSync(path.join(repoRoot, 'public', 'first-paint.js'), 'utf8')
      const ref = this.emitFile({ type: 'asset', name: 'first-screen.css', source: await firstScreenRules(whole, [html, firstPaintJs]) })
      // Right after first-paint.css, so it is asked for before the fonts and the entry script.
      if (!html.includes(FIRST_PAINT_LINK)) throw new Error(`index.html has no ${FIRST_PAINT_LINK} to put the first screen's stylesheet after`)
      page.source = html.replace(FIRST_PAINT_LINK, `${FIRST_PAINT_LINK}\n    <link rel="stylesheet" href="/${this.getFileName(ref)}" />`)
    },
  }
}
