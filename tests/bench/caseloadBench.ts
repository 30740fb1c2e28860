// GET /api/therapist/caseload with 200 people on it, under autocannon at 50 connections, beside a bare Express route.
import { spawn } from 'node:child_process'
import fs from 'node:fs'
import path from 'node:path'
import autocannon from 'autocannon'
import { BenchClient } from './benchClient'
import { group, ms, row } from './benchFormat'
import { percentile } from './benchResults'
import { seedBench, THERAPIST } from './benchSeed'
import { readSqlite } from './benchSqlite'
import { freePort, repoRoot, startRungsProcess, type RungsProcess } from './rungsProcess'

const PEOPLE = 200
const CONNECTIONS = 50
const SECONDS = 10
// Each server first gets a few seconds of the same load, not counted: the figures are for a server that has been running,
// not one whose code V8 has yet to optimise (in the first seconds after a start the p99 was two to three times as high).
const WARM_UP_SECONDS = 5
// One at a time first, so the cost of a single request is seen apart from queueing.
const SEQUENTIAL = 10
const RATIO_BUDGET = 0.25
const P99_BUDGET_MS = 50

async function startBare(port: number, bodyBytes: number, appMessages = false): Promise<{ stop(): Promise<void> }> {
  const env = { ...process.env, PORT: String(port), BODY_BYTES: String(bodyBytes), APP_MESSAGES: appMessages ? '1' : '0' }
  const child = spawn(process.execPath, ['--import', 'tsx', path.join('tests', 'bench', 'bareJsonServer.ts')], { cwd: repoRoot, stdio: ['ignore', 'pipe', 'inherit'], env })
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()))
  await new Promise<void>((resolve, reject) => {
    child.stdout!.setEncoding('utf8').on('data', (d: string) => d.includes('listening') && resolve())
    void exited.then(() => reject(new Error('the bare JSON server exited before it listened')))
  })
  return {
    async stop() {
      child.kill('SIGTERM')
      await exited
    },
  }
}

function cannon(url: string, headers: Record<string, string> = {}, duration = SECONDS): Promise<autocannon.Result> {
  // A slow answer is counted, not dropped: autocannon's own timeout is 10 s.
  return autocannon({ url, connections: CONNECTIONS, duration, headers, timeout: 60 })
}

/** The warm-up run, then the measured one. */
async function warmThenCannon(url: string, headers: Record<string, string> = {}) {
  const warmUp = await cannon(url, headers, WARM_UP_SECONDS)
  return { warmUp, run: await cannon(url, headers) }
}

export async function benchCaseload(tmp: string, track: (p: RungsProcess | undefined) => void, onClose: (close: () => Promise<void>) => void): Promise<string> {
  const dataDir = path.join(tmp, 'caseloadData')
  fs.mkdirSync(dataDir, { recursive: true })
  await seedBench(dataDir, PEOPLE, { caseload: true })
  const server = await startRungsProcess({ dataDir, port: await freePort() })
  track(server)
  const therapist = new BenchClient(server.origin)
  await therapist.signIn(THERAPIST.email, THERAPIST.password)
  const probe = await therapist.send('GET', '/api/therapist/caseload')
  const caseload = (probe.body.caseload ?? []) as { measures: { phq9: unknown; gad7: unknown } }[]
  const withMeasures = caseload.filter((r) => r.measures.phq9 && r.measures.gad7).length
  const bodyBytes = Buffer.byteLength(JSON.stringify(probe.body))
  const barePort = await freePort()
  const bare = await startBare(barePort, bodyBytes)
  onClose(bare.stop)
  const alone: number[] = []
  for (let i = 0; i < SEQUENTIAL; i++) alone.push((await therapist.send('GET', '/api/therapist/caseload')).ms)

  // Bare first, then the caseload: each gets the machine to itself while it runs.
  const bareRun = (await warmThenCannon(`http://127.0.0.1:${barePort}/bare`)).run
  const bareBodyRun = await cannon(`http://127.0.0.1:${barePort}/bare-body`)
  const { warmUp: caseWarmUp, run: caseRun } = await warmThenCannon(`${server.origin}/api/therapist/caseload`, { cookie: therapist.sessionCookie, accept: 'application/json' })
  await bare.stop()
  // Rungs' server makes requests with the app's prototypes (server/appMessages.ts), which plain Express does not: the
  // same bare route on such a server shows how much of the ratio that alone is worth.
  const likePort = await freePort()
  const bareLike = await startBare(likePort, bodyBytes, true)
  onClose(bareLike.stop)
  const bareLikeRun = (await warmThenCannon(`http://127.0.0.1:${likePort}/bare`)).run
  await bareLike.stop()
  await server.stop()
  track(undefined)
  const { auditPerRequest } = await afterRun(dataDir, 1 + SEQUENTIAL + caseWarmUp.requests.sent + caseRun.requests.sent)

  const ratio = caseRun.requests.average / bareRun.requests.average
  const non2xx = (r: autocannon.Result) => r.non2xx + r.errors + r.timeouts
  return [
    `Caseload API: GET /api/therapist/caseload, ${PEOPLE} people on it (${withMeasures} with PHQ-9 and GAD-7 columns, ${group(bodyBytes)} bytes of JSON), autocannon ${CONNECTIONS} connections × ${SECONDS} s, each server after ${WARM_UP_SECONDS} s of the same load`,
    row('Bare Express JSON route, same machine, own process (requests/s; p50 / p99)', `${group(bareRun.requests.average)}/s`, `   ${bareRun.latency.p50} / ${bareRun.latency.p99} ms`),
    row(`  for scale: the bare app sending a prebuilt ${group(bodyBytes)}-byte body (requests/s; p50 / p99)`, `${group(bareBodyRun.requests.average)}/s`, `   ${bareBodyRun.latency.p50} / ${bareBodyRun.latency.p99} ms   ratio ${(bareBodyRun.requests.average / bareRun.requests.average).toFixed(3)}`),
    row(`Caseload, one request at a time (median / max of ${SEQUENTIAL})`, `${ms(percentile(alone, 50))} ms`, `   max ${ms(Math.max(...alone))} ms`),
    row('Caseload (requests/s; p50 / p99)', `${group(caseRun.requests.average)}/s`, `   ${caseRun.latency.p50} / ${caseRun.latency.p99} ms   ${group(caseRun.requests.total)} requests, ${non2xx(caseRun)} not 2xx`),
    row(`  for comparison, not the budget: the caseload's ${WARM_UP_SECONDS}-s warm-up, right after the server started (requests/s; p50 / p99)`, `${group(caseWarmUp.requests.average)}/s`, `   ${caseWarmUp.latency.p50} / ${caseWarmUp.latency.p99} ms`),
    row('Caseload throughput as a ratio to the bare route', ratio.toFixed(3), `   budget ≥ ${RATIO_BUDGET}${ratio < RATIO_BUDGET ? '   MISSES BUDGET' : ''}`),
    row('  for comparison, not the budget: the bare route on a server built like Rungs\' (appMessages.ts)', `${group(bareLikeRun.requests.average)}/s`, `   ${bareLikeRun.latency.p50} / ${bareLikeRun.latency.p99} ms   caseload ratio to it ${(caseRun.requests.average / bareLikeRun.requests.average).toFixed(3)}`),
    row('Caseload p99 latency', `${ms(caseRun.latency.p99)} ms`, `   budget ≤ ${P99_BUDGET_MS} ms${caseRun.latency.p99 > P99_BUDGET_MS ? '   MISSES BUDGET' : ''}`),
    row("  shares.read access-log rows written per caseload request", auditPerRequest === undefined ? 'n/a' : auditPerRequest.toFixed(1)),
    ...(probe.status !== 200 ? [`  the caseload answered ${probe.status}: ${JSON.stringify(probe.body).slice(0, 200)}`] : []),
    '',
  ].join('\n')
}

/** Read from the database file once the server has stopped. */
async function afterRun(dataDir: string, requests: number) {
  let audit = 0
  await readSqlite<Record<string, number>>(path.join(dataDir, 'rungs.sqlite'), async (all) => {
    audit = (await all("SELECT COUNT(*) AS n FROM audit_events WHERE action = 'shares.read'"))[0]!.n!
  })
  // Every request sent wrote its rows, including those still in flight when autocannon stopped counting.
  return { auditPerRequest: requests ? audit / requests : undefined }
}
