// Rendered at build time in Node (client/build/firstScreenHtml.ts), never shipped to the browser.
import { createPinia } from 'pinia'
import { Quasar } from 'quasar'
import { createSSRApp, h } from 'vue'
import { renderToString } from 'vue/server-renderer'
import { createMemoryHistory, createRouter, RouterView } from 'vue-router'
import { assumeNoDatabase } from '@/db/startupHints'
import { routes } from '@/router/routes'

/**
 * Today as a first visit sees it (no device database yet, so the first-run notice shows and nothing is listed), in the
 * phone layout (bottom tabs) or the wide one (side drawer), which the app picks from Quasar's screen size at start.
 */
export async function renderFirstScreen(wide: boolean): Promise<string> {
  assumeNoDatabase()
  const router = createRouter({ history: createMemoryHistory(), routes })
  const app = createSSRApp({ render: () => h(RouterView) })
  app.use(createPinia())
  const ssrContext = { req: { headers: {}, url: '/' }, res: {}, _meta: {}, onRendered: () => undefined }
  // Quasar's server build takes the SSR context as a third argument, which its client types do not declare.
  ;(app.use as (plugin: unknown, ...options: unknown[]) => unknown)(Quasar, {}, ssrContext)
  // Quasar's screen sizes are unknown on a server; the app's layouts read only gt.sm (≥ 1024 px).
  ;(app.config.globalProperties.$q as { screen: { gt: { sm: boolean } } }).screen.gt.sm = wide
  app.use(router)
  await router.push('/')
  await router.isReady()
  return renderToString(app, ssrContext)
}
