// Runs as index.html's body starts, before anything is painted: a plain script, so it works where the app cannot start.
// It only sets classes that first-paint.css reads; the app decides everything again as it mounts.
;(function () {
  var html = document.documentElement
  function hint(key) {
    try {
      return window.localStorage.getItem(key)
    } catch (e) {
      return null
    }
  }
  // The prerendered screen is Today; any other address shows the plain block until the app has started.
  if (location.pathname !== '/') html.classList.add('rungs-other-page')
  // Mirrored from the device database by the app (client/db/startupHints.ts).
  if (hint('rungs.lockSet') === 'yes') html.classList.add('rungs-locked')
  if (hint('rungs.firstRunSeen') === 'yes') html.classList.add('rungs-first-run-seen')
  // As the app's appearance setting does (client/stores/deviceSettings.ts), so a dark screen does not flash light first.
  var look = hint('rungs.appearance')
  var dark = look === 'dark' || (look !== 'light' && !!window.matchMedia && window.matchMedia('(prefers-color-scheme: dark)').matches)
  document.body.classList.add(dark ? 'body--dark' : 'body--light')
  // The app's code failed to load: the emergency numbers show at once instead of after a wait.
  window.addEventListener(
    'error',
    function (e) {
      var t = e.target
      if (t && (t.tagName === 'SCRIPT' || t.tagName === 'LINK')) html.classList.add('rungs-app-failed')
    },
    true,
  )
  // Help now tapped before the app has started: the numbers show at once; the app opens its own Help now as it mounts.
  document.addEventListener('click', function (e) {
    var t = e.target
    if (t && t.closest && t.closest('.first-screen [data-test=help-now]')) html.classList.add('rungs-help-asked')
  })
})()
