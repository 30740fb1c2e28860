// The stylesheets are imported by startApp.ts, so only the first screen's own rules (client/build/firstScreenCss.ts) hold
// up the first paint.
// index.html already holds Today, rendered at build time (client/build/firstScreenHtml.ts). Running the app's code takes
// a slow phone a second or more. A page the service worker serves has that code at hand and would run it before painting
// anything, so there the app starts once the screen is on the glass. Over the network the code arrives after the screen
// has painted anyway, so it is asked for at once. A hidden tab paints nothing: it starts at once too.
const start = () => {
  import('./startApp').catch(() => document.documentElement.classList.add('rungs-app-failed'))
}
if (navigator.serviceWorker?.controller && document.visibilityState !== 'hidden') requestAnimationFrame(() => setTimeout(start))
else start()
