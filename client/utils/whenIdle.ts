/**
 * Runs `run` once the page is idle, and at the latest after `timeoutMs`. Browsers without requestIdleCallback (Safari)
 * run it after `fallbackMs` instead.
 */
export function whenIdle(run: () => void, timeoutMs: number, fallbackMs: number): void {
  if (typeof requestIdleCallback === 'function') requestIdleCallback(run, { timeout: timeoutMs })
  else setTimeout(run, fallbackMs)
}
