import { outboxCounts } from '@/db/outboxRepository'
import { drainOutbox, type DrainReport } from './outbox'

/** While rows wait, the timer looks for due ones this often; the look is a local query, so it costs no request. */
export const OUTBOX_TICK_MS = 30_000

export interface OutboxRunnerOptions {
  /** Checked before every drain: signed in, an active link, not paused. */
  canSend: () => boolean | Promise<boolean>
  onReport?: (report: DrainReport) => void
  intervalMs?: number
}

let options: OutboxRunnerOptions | undefined
let inFlight: Promise<void> | undefined
let again = false
let ignoreBackoff = false
let soon: ReturnType<typeof setTimeout> | undefined

async function runOnce(): Promise<void> {
  do {
    again = false
    if (!options || !(await options.canSend())) return
    const report = await drainOutbox(Date.now, Math.random, { ignoreBackoff })
    ignoreBackoff = false
    options?.onReport?.(report)
    if (report.paused) return
  } while (again)
  await wakeForNextRetry()
}

/** A retry due before the next tick gets its own wake-up, so a short backoff is not stretched to the tick. */
async function wakeForNextRetry(): Promise<void> {
  clearTimeout(soon)
  const { nextAttemptAt } = await outboxCounts()
  const tick = options?.intervalMs ?? OUTBOX_TICK_MS
  if (!options || nextAttemptAt === undefined) return
  const wait = Math.max(0, nextAttemptAt - Date.now())
  if (wait < tick) soon = setTimeout(() => void kickOutbox(), wait + 50)
}

/**
 * Drains now, or once more right after the drain already running, so a share made mid-drain is not left waiting.
 * `backOnline` sends every waiting row without waiting out its backoff.
 */
export function kickOutbox(backOnline = false): Promise<void> {
  if (backOnline) ignoreBackoff = true
  if (inFlight) {
    again = true
    return inFlight
  }
  inFlight = runOnce()
    .catch(() => undefined)
    .finally(() => {
      inFlight = undefined
    })
  return inFlight
}

/** Starts draining: at once, whenever the browser comes back online, and on a timer. Returns the stop function. */
export function startOutbox(opts: OutboxRunnerOptions): () => void {
  stopOutbox()
  options = opts
  const onOnline = () => void kickOutbox(true)
  const onTick = () => void kickOutbox()
  window.addEventListener('online', onOnline)
  const timer = setInterval(onTick, opts.intervalMs ?? OUTBOX_TICK_MS)
  stop = () => {
    window.removeEventListener('online', onOnline)
    clearInterval(timer)
    clearTimeout(soon)
    options = undefined
  }
  void kickOutbox()
  return stopOutbox
}

let stop: (() => void) | undefined
export function stopOutbox(): void {
  stop?.()
  stop = undefined
}
