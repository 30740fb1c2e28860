import type { Plugin } from 'vite'
import { PurgeCSS } from 'purgecss'
import { quasarCssUse } from './quasarCssUse'

/** The prebuilt stylesheet the Quasar plugin puts in place of quasar/src/css/index.sass (sassVariables: false). */
const QUASAR_CSS = /[\\/]quasar[\\/]dist[\\/]quasar(\.prod)?\.css$/
// Stems so general that keeping every ending would keep nearly everything; handled by the word rules below instead.
const GENERAL_STEMS = new Set(['q-', 'text-', 'bg-'])
const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\-]/g, '\\$&')

/**
 * Quasar's CSS minus the rules no file of the app can use. A rule stays when every class (and element) in its selector
 * can be made by the app or by a Quasar module it reaches:
 * - a word written in those files (`q-btn`, `row`, `text-primary`);
 * - `text-<word>` and `bg-<word>` for any word, as colour props become classes (color="primary" → bg-primary);
 * - any ending of a stem the code completes at run time (`q-btn--${design}` keeps every q-btn--…);
 * - every class of a `q-<word>` family whose word Quasar quotes (`q-${type}__inner` with type 'checkbox');
 * - plain one-word names (elements such as body and input, and classes such as row), always;
 * - attribute selectors whose attribute name is written somewhere (`[data-q-vs-anchor]`).
 */
export async function purgeQuasarCss(css: string, clientDir: string): Promise<{ css: string; rejected: string[] }> {
  const use = quasarCssUse(clientDir)
  // Attribute selectors ([data-q-vs-anchor], [aria-busy=true]) stay when the attribute's name is written somewhere.
  const attributes = new Set(use.content.flatMap((text) => text.match(/\b(?:data|aria)-[a-z][a-z-]*/g) ?? []))
  const [result] = await new PurgeCSS().purge({
    content: use.content.map((raw) => ({ raw, extension: 'js' })),
    css: [{ raw: css }],
    defaultExtractor: (text) => {
      const words = text.match(/[A-Za-z0-9_-]+/g) ?? []
      return [...words, ...words.map((w) => `text-${w}`), ...words.map((w) => `bg-${w}`)]
    },
    safelist: {
      standard: [
        /^[a-z][a-z0-9]*$/,
        ...use.dynamicPrefixes.filter((p) => !GENERAL_STEMS.has(p)).map((p) => new RegExp(`^${escape(p)}`)),
        ...use.quotedWords.map((w) => new RegExp(`^q-${escape(w)}(?:--|__|$)`)),
      ],
    },
    dynamicAttributes: [...attributes, 'dir', 'role', 'type', 'disabled', 'tabindex'],
    rejected: true,
  })
  return { css: result!.css, rejected: result!.rejected ?? [] }
}

/** Build only: in development a newly used class must work without restarting the server. */
export function unusedQuasarCss(clientDir: string): Plugin {
  return {
    name: 'rungs:unused-quasar-css',
    apply: 'build',
    enforce: 'pre',
    async transform(code, id) {
      if (!QUASAR_CSS.test(id.split('?')[0]!)) return undefined
      return { code: (await purgeQuasarCss(code, clientDir)).css, map: null }
    },
  }
}
