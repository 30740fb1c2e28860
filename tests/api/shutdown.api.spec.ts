import { type ChildProcess, spawn } from 'node:child_process'
import fs from 'node:fs'
import http from 'node:http'
import os from 'node:os'
import path from 'node:path'
import sqlite3 from 'sqlite3'
import { afterAll, describe, expect, it } from 'vitest'
import { demoAccounts } from '../../server/db/seed'

interface Child {
  proc: ChildProcess
  lines: { msg?: string; url?: string }[]
  waitFor(match: (msg: string) => boolean): Promise<{ msg?: string; url?: string }>
  exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }>
}

const dataDirs: string[] = []
afterAll(() => { for (const d of dataDirs) fs.rmSync(d, { recursive: true, force: true }) })

/** The real server as its own process (node with the tsx loader), with a fresh data folder and a port chosen by the OS. */
function startChild(dataDir: string): Child {
  const proc = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    env: { ...process.env, NODE_ENV: 'test', DATA_DIR: dataDir, PORT: '0', SCRYPT_COST: '1024', SEED_DEMO: 'true', LOG_REQUESTS: 'false', LOG_LEVEL: 'info' },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  const lines: Child['lines'] = []
  const waiters: { match: (msg: string) => boolean; resolve: (l: Child['lines'][number]) => void }[] = []
  let buffer = ''
  let stderr = ''
  proc.stderr!.on('data', (d: Buffer) => { stderr += d.toString() })
  proc.stdout!.on('data', (d: Buffer) => {
    buffer += d.toString()
    let nl: number
    while ((nl = buffer.indexOf('\n')) >= 0) {
      const raw = buffer.slice(0, nl)
      buffer = buffer.slice(nl + 1)
      let line: Child['lines'][number]
      try { line = JSON.parse(raw) } catch { line = { msg: raw } }
      lines.push(line)
      for (const w of [...waiters]) if (w.match(line.msg ?? '')) { waiters.splice(waiters.indexOf(w), 1); w.resolve(line) }
    }
  })
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) => proc.on('exit', (code, signal) => resolve({ code, signal })))
  return {
    proc,
    lines,
    exited,
    waitFor: (match) => {
      const seen = lines.find((l) => match(l.msg ?? ''))
      if (seen) return Promise.resolve(seen)
      return new Promise((resolve, reject) => {
        waiters.push({ match, resolve })
        void exited.then(({ code }) => reject(new Error(`server exited (${code}) before the expected line; stderr:\n${stderr}`)))
      })
    },
  }
}

/** A sign-in whose body is sent in two halves: the request is in flight until `finish()` sends the rest. */
async function slowSignIn(url: string) {
  const csrf = await fetch(`${url}/api/auth/csrf`)
  const cookie = csrf.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ')
  const { csrfToken } = (await csrf.json()) as { csrfToken: string }
  const body = JSON.stringify({ email: demoAccounts.person.email, password: demoAccounts.person.password })
  const half = Math.floor(body.length / 2)
  const req = http.request(`${url}/api/auth/signin`, {
    method: 'POST',
    agent: false,
    // 100-continue: the server answers "Continue" once it has read the headers, so the test knows the request is open.
    headers: { 'content-type': 'application/json', 'content-length': Buffer.byteLength(body), cookie, 'x-csrf-token': csrfToken, expect: '100-continue' },
  })
  const response = new Promise<{ status: number; body: string }>((resolve, reject) => {
    req.on('response', (res) => {
      let text = ''
      res.on('data', (d: Buffer) => { text += d.toString() })
      res.on('end', () => resolve({ status: res.statusCode!, body: text }))
    })
    req.on('error', reject)
  })
  await new Promise<void>((resolve) => req.on('continue', () => resolve()))
  req.write(body.slice(0, half))
  return {
    response,
    finish: () => { req.end(body.slice(half)) },
  }
}

function integrityCheck(file: string): Promise<string> {
  return new Promise((resolve, reject) => {
    const db = new sqlite3.Database(file, sqlite3.OPEN_READONLY, (err) => {
      if (err) return reject(err)
      db.get('PRAGMA integrity_check', (e, row: { integrity_check: string }) => {
        db.close()
        if (e) reject(e)
        else resolve(row.integrity_check)
      })
    })
  })
}

describe('graceful shutdown on SIGTERM', () => {
  it('finishes the request in flight, refuses new connections, ignores a second signal, checkpoints and closes the database, exits 0', async () => {
    const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'rungs-shutdown-'))
    dataDirs.push(dataDir)
    const child = startChild(dataDir)
    const ready = await child.waitFor((m) => m.startsWith('Rungs is running at'))
    const url = ready.url!
    expect(url).toMatch(/^http:\/\/localhost:\d+$/)

    const slow = await slowSignIn(url)
    child.proc.kill('SIGTERM')
    await child.waitFor((m) => m.startsWith('SIGTERM: finishing open requests'))

    // New connections are refused while the open request is still being served.
    await expect(fetch(`${url}/api/auth/csrf`)).rejects.toThrow()
    // A second signal during shutdown changes nothing.
    child.proc.kill('SIGINT')
    await child.waitFor((m) => m.startsWith('SIGINT: already shutting down'))

    slow.finish()
    const res = await slow.response
    expect(res.status).toBe(200)
    expect(JSON.parse(res.body).user.email).toBe(demoAccounts.person.email)

    expect(await child.exited).toEqual({ code: 0, signal: null })
    expect(child.lines.some((l) => l.msg === 'shutdown: database closed')).toBe(true)

    const file = path.join(dataDir, 'rungs.sqlite')
    expect(await integrityCheck(file)).toBe('ok')
    // The WAL was folded back into the database file before it closed.
    const wal = `${file}-wal`
    expect(fs.existsSync(wal) ? fs.statSync(wal).size : 0).toBe(0)
    // The sign-in that finished during shutdown was written: its session row is in the file.
    const sessions = await new Promise<number>((resolve, reject) => {
      const db = new sqlite3.Database(file, sqlite3.OPEN_READONLY, (err) => {
        if (err) return reject(err)
        db.get("SELECT COUNT(*) AS n FROM sessions WHERE userId IS NOT NULL", (e, row: { n: number }) => { db.close(); if (e) reject(e); else resolve(row.n) })
      })
    })
    expect(sessions).toBe(1)
  }, 60_000)

  it('with nothing in flight, exits 0 on SIGINT too', async () => {
    const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'rungs-shutdown-'))
    dataDirs.push(dataDir)
    const child = startChild(dataDir)
    await child.waitFor((m) => m.startsWith('Rungs is running at'))
    child.proc.kill('SIGINT')
    expect(await child.exited).toEqual({ code: 0, signal: null })
    expect(await integrityCheck(path.join(dataDir, 'rungs.sqlite'))).toBe('ok')
  }, 60_000)
})
