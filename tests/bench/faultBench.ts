// The server killed with SIGKILL part way through the clients' outbox drains, then started again on the same data folder
// and port; the outboxes must finish with every share stored exactly once.
import { randomUUID } from 'node:crypto'
import fs from 'node:fs'
import path from 'node:path'
import { setTimeout as sleep } from 'node:timers/promises'
import { BenchClient } from './benchClient'
import { group, ms, row } from './benchFormat'
import { benchMoment, seedBench } from './benchSeed'
import { compareShares, storedShares } from './benchSqlite'
import { freePort, startRungsProcess, type RungsProcess } from './rungsProcess'

const PEOPLE = 40
const ITEMS_EACH = 25
/** Kill once this share of all items has been acknowledged. */
const KILL_AT = 0.4
// client/sync/outbox.ts waits 2 s doubling to 10 min with full jitter; the bench scales both down so it ends in seconds.
const BACKOFF_BASE_MS = 100
const BACKOFF_CAP_MS = 2_000
const DEADLINE_MS = 90_000

interface Item {
  entryId: string
  /** The outbox row holds only the newest op, so an entry edited before it was sent goes once, at its latest version. */
  version: number
}

export async function benchFault(tmp: string, track: (p: RungsProcess | undefined) => void): Promise<string> {
  const dataDir = path.join(tmp, 'faultData')
  fs.mkdirSync(dataDir, { recursive: true })
  const seeded = await seedBench(dataDir, PEOPLE)
  const port = await freePort()
  let server = await startRungsProcess({ dataDir, port })
  track(server)
  const clients = seeded.people.map(() => new BenchClient(server.origin))
  await Promise.all(clients.map((c, i) => c.signIn(seeded.people[i]!.email, seeded.people[i]!.password)))

  const outboxes = seeded.people.map((_, p) => Array.from({ length: ITEMS_EACH }, (_, k): Item => ({ entryId: randomUUID(), version: 1 + ((p + k) % 3) })))
  const total = PEOPLE * ITEMS_EACH
  const expected = new Map<string, number>()
  outboxes.forEach((items, p) => items.forEach((it) => expected.set(`${seeded.people[p]!.linkId}:${it.entryId}`, it.version)))

  let done = 0
  let attempts = 0
  const retriesBy = new Map<string, number>()
  const retried = (why: string) => retriesBy.set(why, (retriesBy.get(why) ?? 0) + 1)
  let gaveUp = 0
  let unchangedAfterRetry = 0
  let killAt: { done: number; at: number } | undefined
  let restartAt: number | undefined
  const start = performance.now()
  const stopBy = start + DEADLINE_MS

  // The fault: SIGKILL once enough has drained, wait a moment with the port closed, start again on the same folder and port.
  let killed!: () => void
  const killNow = new Promise<void>((resolve) => (killed = resolve))
  const fault = (async () => {
    await killNow
    killAt = { done, at: performance.now() - start }
    await server.kill9()
    await sleep(1_000)
    server = await startRungsProcess({ dataDir, port })
    track(server)
    restartAt = performance.now() - start
  })()

  await Promise.all(
    outboxes.map(async (items, p) => {
      const { linkId } = seeded.people[p]!
      const client = clients[p]!
      for (const it of items) {
        let tries = 0
        for (;;) {
          if (performance.now() > stopBy) return
          tries++
          attempts++
          let why: string
          try {
            const res = await client.send('PUT', `/api/links/${linkId}/shares/${it.entryId}`, { version: it.version, payload: benchMoment(it.entryId, it.version, p) })
            if (res.status === 200) {
              if (tries > 1 && res.body.status === 'unchanged') unchangedAfterRetry++
              done++
              if (!killAt && done >= total * KILL_AT) killed()
              break
            }
            if (res.status === 401) {
              // The device pauses and asks the person to sign in again; the bench signs in at once.
              retried('401, signed in again')
              await client.signIn(seeded.people[p]!.email, seeded.people[p]!.password).catch(() => undefined)
              continue
            }
            if (res.status !== 429 && res.status < 500) {
              gaveUp++
              break
            }
            why = String(res.status)
          } catch (err) {
            why = `network (${String(((err as Error).cause as { code?: string } | undefined)?.code ?? (err as Error).message)})`
          }
          retried(why)
          await sleep(Math.floor(Math.random() * Math.min(BACKOFF_CAP_MS, BACKOFF_BASE_MS * 2 ** (tries - 1))))
        }
      }
    }),
  )
  const drainMs = performance.now() - start
  if (!killAt) killed()
  await fault
  const exitCode = await server.stop()
  track(undefined)
  const { rows, integrity } = await storedShares(path.join(dataDir, 'rungs.sqlite'))
  const c = compareShares(expected, rows)
  const once = c.lost === 0 && c.duplicated === 0 && c.exact === total && c.unexpected === 0 && done === total
  return [
    `Fault: server killed with SIGKILL mid-drain, restarted on the same DATA_DIR and port (${PEOPLE} people × ${ITEMS_EACH} outbox items)`,
    `  each item retried until a 200, full-jitter backoff ${BACKOFF_BASE_MS} ms doubling to ${BACKOFF_CAP_MS / 1000} s (client/sync/outbox.ts semantics, times scaled down)`,
    row('SIGKILL after / restarted and listening after', killAt ? `${ms(killAt.at)} / ${ms((restartAt ?? 0) - killAt.at)} ms later` : 'not reached'),
    row('  items acknowledged before the kill', `${group(killAt?.done ?? 0)} of ${group(total)}`),
    row(`Drain of ${group(total)} items, start to last 200`, `${ms(drainMs)} ms`, `   ${group(attempts)} PUTs, ${gaveUp} given up`),
    row('  retries by cause', [...retriesBy].map(([s, n]) => `${s}: ${group(n)}`).join(', ') || 'none'),
    row("  retries answered 'unchanged' (stored before the kill, answer lost)", `${unchangedAfterRetry}`),
    row(
      'Every share present exactly once',
      once ? 'yes' : 'no',
      `   ${group(c.exact)} of ${group(total)} at their version, ${c.lost} lost, ${c.duplicated} duplicated, ${c.ahead} above, ${c.unexpected} unexpected${once ? '' : '   MISSES BUDGET'}`,
    ),
    row(`  PRAGMA integrity_check (after SIGTERM, exit code ${exitCode})`, integrity, integrity === 'ok' ? '' : '   MISSES BUDGET'),
    ...(server.errors.length ? [`  server stderr: ${server.errors.slice(0, 5).join(' | ')}`] : []),
    '',
  ].join('\n')
}
