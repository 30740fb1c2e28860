// The app itself, imported by main.ts once index.html's prerendered Today has been painted.
// First, before any module that builds a zod schema (see boot/zodConfig.ts).
import './boot/zodConfig'

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
