import path from 'node:path'
import { quasar, transformAssetUrls } from '@quasar/vite-plugin'
import vue from '@vitejs/plugin-vue'

// How the app's code is compiled, shared by the app's build (vite.config.ts) and the build-time render of its first
// screen (firstScreenHtml.ts), so the prerendered Today is made from the same components the same way.

export const appAliases = (repoRoot: string) => ({ '@': path.join(repoRoot, 'client'), '@shared': path.join(repoRoot, 'shared') })

/** Every component (Rungs' and Quasar's) uses setup(), so Vue's Options API code is left out of the build. */
export const appVue = () => vue({ template: { transformAssetUrls }, features: { optionsAPI: false } })

/**
 * After appVue(), as the Quasar plugin requires. Brand colours live in client/css/brand.css as CSS variables, so the
 * prebuilt Quasar CSS is used and no sass compiler is needed. `ssr-server` for the render in Node.
 */
export const appQuasar = (runMode?: 'ssr-server') => quasar({ sassVariables: false, ...(runMode ? { runMode } : {}) })
