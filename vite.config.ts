import { fileURLToPath, URL } from 'node:url'
import { VitePWA } from 'vite-plugin-pwa'
import { defineConfig } from 'vitest/config'
import { appAliases, appQuasar, appVue } from './client/build/appCompile'
import { firstScreenCss } from './client/build/firstScreenCss'
import { firstScreenHtml } from './client/build/firstScreenHtml'
import { unusedQuasarCss } from './client/build/unusedQuasarCss'

export default defineConfig({
  root: 'client',
  publicDir: fileURLToPath(new URL('./public', import.meta.url)),
  resolve: { alias: appAliases(fileURLToPath(new URL('.', import.meta.url))) },
  plugins: [
    // Shared with the build-time render of the first screen (client/build/appCompile.ts).
    appVue(),
    appQuasar(),
    // Quasar's stylesheet covers every component it has; the build keeps the rules the app's code can use.
    unusedQuasarCss(fileURLToPath(new URL('./client', import.meta.url))),
    // index.html carries Today rendered from the app's components, so the first screen paints before the app's code runs.
    firstScreenHtml(fileURLToPath(new URL('.', import.meta.url))),
    // …and links only the rules that screen uses; the whole stylesheet loads with the app's code.
    firstScreenCss(fileURLToPath(new URL('.', import.meta.url))),
    VitePWA({
      registerType: 'prompt',
      injectRegister: false,
      manifest: {
        name: 'Rungs',
        short_name: 'Rungs',
        description: 'A private reflection journal for people in therapy.',
        lang: 'en',
        start_url: '/',
        scope: '/',
        display: 'standalone',
        background_color: '#FAF7F2',
        theme_color: '#3D4A7A',
        icons: [
          { src: '/icons/icon-192.png', sizes: '192x192', type: 'image/png' },
          { src: '/icons/icon-512.png', sizes: '512x512', type: 'image/png' },
          { src: '/icons/icon-maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
        ],
      },
      workbox: {
        // Fonts too, so Lora and the icons render offline after one visit.
        globPatterns: ['**/*.{js,css,html,woff,woff2,png,svg,ico,webmanifest}'],
        // The lazy PDF chunk (pdf-lib + fontkit, about 1.1 MB) must stay in the precache so summaries build offline.
        maximumFileSizeToCacheInBytes: 3 * 1024 * 1024,
        navigateFallback: 'index.html',
        navigateFallbackDenylist: [/^\/api\//],
        cleanupOutdatedCaches: true,
      },
    }),
  ],
  build: {
    outDir: fileURLToPath(new URL('./dist', import.meta.url)),
    emptyOutDir: true,
  },
  server: {
    port: 5173,
    proxy: { '/api': 'http://localhost:3000' },
  },
  test: {
    root: fileURLToPath(new URL('.', import.meta.url)),
    projects: [
      {
        extends: true,
        test: { name: 'unit', root: fileURLToPath(new URL('.', import.meta.url)), include: ['tests/unit/shared/**/*.spec.ts', 'tests/unit/server/**/*.spec.ts', 'tests/unit/build/**/*.spec.ts'], environment: 'node' },
      },
      {
        extends: true,
        // Page tests click through whole flows and load chunks on first use; on a busy 2-core machine 5 s is too short.
        test: { name: 'dom', root: fileURLToPath(new URL('.', import.meta.url)), include: ['tests/unit/client/**/*.spec.ts'], environment: 'happy-dom', setupFiles: ['tests/setup/dom.ts'], testTimeout: 15000 },
      },
      {
        extends: true,
        test: { name: 'api', root: fileURLToPath(new URL('.', import.meta.url)), include: ['tests/api/**/*.spec.ts'], environment: 'node', testTimeout: 20000 },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          root: fileURLToPath(new URL('.', import.meta.url)),
          include: ['tests/e2e/**/*.spec.ts'],
          environment: 'node',
          testTimeout: 60000,
          hookTimeout: 60000,
          fileParallelism: false,
        },
      },
    ],
  },
})
