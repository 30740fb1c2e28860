// The app itself, imported by main.ts once index.html's prerendered Today has been painted.
// First, before any module that builds a zod schema (see boot/zodConfig.ts).
import './boot/zodConfig'
// The whole stylesheet, loaded with this chunk: index.html's first paint needs only the rules its prerendered Today uses
// (client/build/firstScreenCss.ts), and these come after them with every rule in its original order.
import '@fontsource/lora/latin-400.css'
import '@fontsource/lora/latin-600.css'
import '@quasar/extras/material-icons/material-icons.css'
import 'quasar/src/css/index.sass'
import './css/brand.css'
import './css/app.css'

import { createPinia } from 'pinia'
import { Dark, Dialog, Notify, Quasar } from 'quasar'
import { createApp } from 'vue'
import App from './App.vue'
import { bootAppearance } from './boot/appearance'
import { bootAppLock } from './boot/appLock'
import { bootDeviceSettings } from './boot/deviceSettings'
import { carryEarlyUse, readEarlyUse } from './boot/firstScreen'
import { bootHttp } from './boot/http'
import { bootJournal } from './boot/journal'
import { bootSync } from './boot/sync'
import { probeNoDatabase } from './db/startupHints'
import { router } from './router'

// Asked before any boot file opens Dexie (which creates the database): a first visit then paints without waiting on it.
void probeNoDatabase()
const app = createApp(App)
app.use(createPinia())
app.use(Quasar, { plugins: { Notify, Dialog, Dark }, config: { notify: { position: 'top', timeout: 2500, group: false } } })
bootAppearance()
bootHttp()
bootDeviceSettings()
bootJournal()
bootSync()
app.use(router)
// The lock is decided before the first paint, and the first route's code is loaded (the router starts navigating at
// app.use), so the app replaces index.html's prerendered Today (or its static Help now block) with a whole screen,
// never with a blank one. What was typed or tapped on the prerendered screen is carried over.
void Promise.allSettled([bootAppLock(), router.isReady()]).finally(() => {
  const early = readEarlyUse()
  app.mount('#app')
  void carryEarlyUse(early)
})
