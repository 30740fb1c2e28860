import fs from 'node:fs'
import path from 'node:path'
import { pathToFileURL } from 'node:url'
import type { OutputBundle, OutputChunk } from 'rolldown'
import { build, type Plugin } from 'vite'
import { appAliases, appQuasar, appVue } from './appCompile'

/** Where index.html asks for the first screen: inside #app, before the static Help now block. */
export const FIRST_SCREEN_MARK = '<!-- first screen -->'

// The service worker's registration has no meaning on a server; the prompt renders closed.
const NO_SW = '\0rungs-no-service-worker'
const noServiceWorker: Plugin = {
  name: 'rungs:no-service-worker',
  resolveId: (id) => (id === 'virtual:pwa-register/vue' ? NO_SW : undefined),
  load: (id) => (id === NO_SW ? 'import { ref } from "vue"; export const useRegisterSW = () => ({ needRefresh: ref(false), offlineReady: ref(false), updateServiceWorker: async () => {} })' : undefined),
}

/** Builds client/prerender/firstScreen.ts for Node with the app's own components and renders both layouts. */
export async function renderFirstScreens(repoRoot: string): Promise<{ phone: string; wide: string }> {
  // Inside the repo, so the render's imports (vue, pinia…) resolve; a folder per build, as builds may run side by side.
  const cache = path.join(repoRoot, 'node_modules', '.cache')
  fs.mkdirSync(cache, { recursive: true })
  const outDir = fs.mkdtempSync(path.join(cache, 'rungs-first-screen-'))
  await build({
    configFile: false,
    root: path.join(repoRoot, 'client'),
    logLevel: 'error',
    resolve: { alias: appAliases(repoRoot) },
    plugins: [appVue(), appQuasar('ssr-server'), noServiceWorker],
    // Quasar's server build is imported as source so its flags (__QUASAR_SSR_SERVER__) are set by the plugin above.
    ssr: { noExternal: [/^quasar/] },
    build: { ssr: path.join(repoRoot, 'client', 'prerender', 'firstScreen.ts'), outDir, emptyOutDir: true, reportCompressedSize: false, minify: false },
  })
  try {
    const mod = (await import(pathToFileURL(path.join(outDir, 'firstScreen.js')).href)) as { renderFirstScreen(wide: boolean): Promise<string> }
    return { phone: await mod.renderFirstScreen(false), wide: await mod.renderFirstScreen(true) }
  } finally {
    fs.rmSync(outDir, { recursive: true, force: true })
  }
}

const DRAWER = '<div class="q-drawer-container"'
const PAGE = '<div class="q-page-container"'

/**
 * One screen for every width, as index.html holds it: the phone render (bottom tabs) with the wide render's side drawer
 * put in; first-paint.css shows the drawer or the tabs by width, as the app's layout does. The page itself is the same
 * in both renders, so each element is there once (one id, one button for each name).
 */
export function firstScreenMarkup({ phone, wide }: { phone: string; wide: string }): string {
  const from = wide.indexOf(DRAWER)
  const to = wide.indexOf(PAGE)
  const at = phone.indexOf(PAGE)
  if (from < 0 || to < from || at < 0 || phone.includes(DRAWER)) throw new Error('the first screen renders do not have the layout this build expects (a drawer only when wide, then the page)')
  return `<div class="first-screen">${phone.slice(0, at)}${wide.slice(from, to)}${phone.slice(at)}</div>`
}

/**
 * The stylesheets of the app's chunk (client/startApp.ts) and of the chunks it imports, in the order they apply: the
 * whole stylesheet the app runs with, which the first screen's rules are picked from (firstScreenCss.ts).
 */
export function appChunkCssFiles(bundle: OutputBundle): string[] {
  const chunks = Object.values(bundle).filter((c): c is OutputChunk => c.type === 'chunk')
  const app = chunks.find((c) => c.facadeModuleId?.replaceAll('\\', '/').endsWith('/client/startApp.ts'))
  if (!app) throw new Error('the build has no chunk for client/startApp.ts')
  const byName = new Map(chunks.map((c) => [c.fileName, c]))
  const seen = new Set<string>()
  const walk = (c: OutputChunk) => {
    if (seen.has(c.fileName)) return
    seen.add(c.fileName)
    for (const dep of c.imports) walk(byName.get(dep)!)
  }
  walk(app)
  return [...new Set([...seen].flatMap((f) => [...(byName.get(f)!.viteMetadata?.importedCss ?? [])]))]
}

/**
 * Build only: index.html carries Today as a first visit sees it, rendered from the app's components, so a phone paints
 * the real first screen as soon as the HTML and CSS are in, seconds before the app's code has run. The app replaces it
 * when it mounts (client/boot/firstScreen.ts carries over anything typed meanwhile).
 */
export function firstScreenHtml(repoRoot: string): Plugin {
  return {
    name: 'rungs:first-screen-html',
    apply: 'build',
    transformIndexHtml: {
      order: 'post',
      async handler(html) {
        if (!html.includes(FIRST_SCREEN_MARK)) throw new Error(`index.html has no ${FIRST_SCREEN_MARK} mark for the first screen`)
        return html.replace(FIRST_SCREEN_MARK, firstScreenMarkup(await renderFirstScreens(repoRoot)))
      },
    },
  }
}
