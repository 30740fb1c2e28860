// The stylesheets stay in the entry, so index.html links them and its prerendered Today paints styled.
import '@fontsource/lora/latin-400.css'
import '@fontsource/lora/latin-600.css'
import '@quasar/extras/material-icons/material-icons.css'
import 'quasar/src/css/index.sass'
import './css/brand.css'
import './css/app.css'

// index.html already holds Today, rendered at build time (client/build/firstScreenHtml.ts). Running the app's code takes
// a slow phone a second or more, and a browser that has the code at hand (from the service worker) runs it before it
// paints anything, so the app starts only once that screen is on the glass. A hidden tab paints nothing: it starts at once.
const start = () => {
  import('./startApp').catch(() => document.documentElement.classList.add('rungs-app-failed'))
}
if (document.visibilityState === 'hidden') start()
else requestAnimationFrame(() => setTimeout(start))
