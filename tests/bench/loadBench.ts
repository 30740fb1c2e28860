// 200 people syncing at once for 60 s against the real server on loopback: every acknowledged share must be stored
// exactly once, at its highest version.
import { randomUUID } from 'node:crypto'
import fs from 'node:fs'
import path from 'node:path'
import { BenchClient } from './benchClient'
import { group, ms, row } from './benchFormat'
import { percentile } from './benchResults'
import { benchMoment, seedBench } from './benchSeed'
import { compareShares, storedShares } from './benchSqlite'
import { freePort, startRungsProcess, type RungsProcess } from './rungsProcess'

const PEOPLE = 200
const SECONDS = 60
const ENTRIES_EACH = 12
/** Share of PUTs that re-send the version already sent, as an outbox retry after a lost response would. */
const RETRY_SHARE = 0.2

export interface LoadOptions {
  people?: number
  seconds?: number
}

export async function benchLoad(tmp: string, track: (p: RungsProcess | undefined) => void, opts: LoadOptions = {}): Promise<string> {
  const people = opts.people ?? PEOPLE
  const seconds = opts.seconds ?? SECONDS
  const dataDir = path.join(tmp, 'loadData')
  fs.mkdirSync(dataDir, { recursive: true })
  const seeded = await seedBench(dataDir, people)
  const server = await startRungsProcess({ dataDir, port: await freePort() })
  track(server)

  const clients = seeded.people.map(() => new BenchClient(server.origin))
  const signInStart = performance.now()
  for (let i = 0; i < clients.length; i += 25) {
    await Promise.all(clients.slice(i, i + 25).map((c, k) => c.signIn(seeded.people[i + k]!.email, seeded.people[i + k]!.password)))
  }
  const signInMs = performance.now() - signInStart

  const acked = new Map<string, number>()
  const latencies: number[] = []
  const byStatus = new Map<string, number>()
  let retries = 0
  const count = (what: string) => byStatus.set(what, (byStatus.get(what) ?? 0) + 1)
  const deadline = performance.now() + seconds * 1000
  const start = performance.now()

  await Promise.all(
    clients.map(async (client, p) => {
      const { linkId } = seeded.people[p]!
      const entries = Array.from({ length: ENTRIES_EACH }, () => ({ id: randomUUID(), sent: 0 }))
      let i = p
      while (performance.now() < deadline) {
        const e = entries[i++ % entries.length]!
        const retry = e.sent > 0 && Math.random() < RETRY_SHARE
        const version = retry ? e.sent : e.sent + 1
        if (retry) retries++
        e.sent = version
        try {
          const res = await client.send('PUT', `/api/links/${linkId}/shares/${e.id}`, { version, payload: benchMoment(e.id, version, p) })
          latencies.push(res.ms)
          count(String(res.status))
          if (res.status === 200) {
            const key = `${linkId}:${e.id}`
            acked.set(key, Math.max(acked.get(key) ?? 0, version))
          }
        } catch (err) {
          count(`network (${(err as Error).cause ? String(((err as Error).cause as { code?: string }).code) : (err as Error).message})`)
        }
      }
    }),
  )
  const elapsed = (performance.now() - start) / 1000
  const exitCode = await server.stop()
  track(undefined)
  const { rows, integrity } = await storedShares(path.join(dataDir, 'rungs.sqlite'))
  const c = compareShares(acked, rows)
  const total = latencies.length
  const errors = [...byStatus].filter(([s]) => s !== '200')
  return [
    `Load: ${people} people syncing at once for ${seconds} s against the real server (child process, loopback, keep-alive fetch)`,
    `  each person: ${ENTRIES_EACH} entries of their own, PUT one share at a time, ${Math.round(RETRY_SHARE * 100)} % of PUTs re-send the version already sent`,
    row(`Sign in ${people} people (25 at a time, scrypt cost lowered for the bench)`, `${ms(signInMs)} ms`),
    row(`Share PUTs in ${elapsed.toFixed(1)} s (${group(retries)} of them re-sends)`, `${group(total)}`, `   ${group(total / elapsed)} requests/s`),
    row('  latency p50 / p99 / max', `${ms(percentile(latencies, 50))} / ${ms(percentile(latencies, 99))} / ${ms(Math.max(...latencies))} ms`),
    row('  answers by status', [...byStatus].map(([s, n]) => `${s}: ${group(n)}`).join(', ')),
    row('  errors by status', errors.length ? errors.map(([s, n]) => `${s}: ${group(n)}`).join(', ') : 'none'),
    row(`Database after the run (${group(acked.size)} acknowledged entry/link pairs)`, `lost ${c.lost}, duplicated ${c.duplicated}`, c.lost || c.duplicated ? '   MISSES BUDGET (0 and 0)' : '   budget 0 and 0'),
    row('  stored at the highest acknowledged version / above it (a PUT whose answer was an error) / not acknowledged', `${group(c.exact)} / ${c.ahead} / ${c.unexpected}`),
    row('  PRAGMA integrity_check (server stopped with SIGTERM, exit code ' + exitCode + ')', integrity, integrity === 'ok' ? '' : '   MISSES BUDGET'),
    ...(server.errors.length ? [`  server stderr: ${server.errors.slice(0, 5).join(' | ')}`] : []),
    '',
  ].join('\n')
}
