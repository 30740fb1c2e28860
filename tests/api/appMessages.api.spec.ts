import fs from 'node:fs'
import http, { type IncomingMessage, type ServerResponse } from 'node:http'
import type { AddressInfo } from 'node:net'
import os from 'node:os'
import path from 'node:path'
import express, { type Express } from 'express'
import supertest from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { appMessages } from '../../server/appMessages'
import { loadConfig } from '../../server/config/env'
import { demoAccounts } from '../../server/db/seed'
import { silentLogger } from '../../server/log/logger'
import { startServer, type Running } from '../../server/start'

interface Seen {
  request: object | null
  response: object | null
}

/** The prototypes of each request and response as node:http made them, before Express has touched them. */
function watchPrototypes(server: http.Server): Seen[] {
  const seen: Seen[] = []
  server.prependListener('request', (req: IncomingMessage, res: ServerResponse) => {
    seen.push({ request: Object.getPrototypeOf(req) as object, response: Object.getPrototypeOf(res) as object })
  })
  return seen
}

describe('appMessages on a bare server', () => {
  let server: http.Server
  let app: Express
  let messages: ReturnType<typeof appMessages>
  let seen: Seen[]
  let base: string
  beforeAll(async () => {
    messages = appMessages()
    server = http.createServer(messages.options)
    seen = watchPrototypes(server)
    app = express()
    app.get('/echo', (req, res) => {
      res.setHeader('X-Seen-Path', req.path)
      res.status(201).json({ method: req.method, query: req.query, secure: req.secure })
    })
    server.on('request', app)
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve))
    base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`
  })
  afterAll(async () => {
    await new Promise<void>((resolve) => server.close(() => resolve()))
  })

  it('is in use on this Node', () => {
    expect(messages.usable).toBe(true)
  })

  it('makes plain messages until the app is adopted, and messages with the app prototypes after', async () => {
    const before = await fetch(`${base}/echo?n=1`)
    expect(before.status).toBe(201)
    expect(seen.at(-1)).toEqual({ request: http.IncomingMessage.prototype, response: http.ServerResponse.prototype })

    messages.adopt(app)
    for (let i = 0; i < 3; i++) {
      const res = await fetch(`${base}/echo?n=${i}`)
      // Express's request and response methods work as before: status, json, headers, query parsing.
      expect(res.status).toBe(201)
      expect(res.headers.get('x-seen-path')).toBe('/echo')
      expect(await res.json()).toEqual({ method: 'GET', query: { n: String(i) }, secure: false })
      expect(seen.at(-1)!.request).toBe(app.request)
      expect(seen.at(-1)!.response).toBe(app.response)
    }
  })

  it('still makes node:http messages', async () => {
    let checked = false
    server.prependOnceListener('request', (req: IncomingMessage, res: ServerResponse) => {
      checked = req instanceof http.IncomingMessage && res instanceof http.ServerResponse && req.socket === res.socket
    })
    expect((await fetch(`${base}/echo`)).status).toBe(201)
    expect(checked).toBe(true)
  })
})

describe('the real server', () => {
  let running: Running
  let dataDir: string
  let seen: Seen[]
  beforeAll(async () => {
    dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'rungs-messages-'))
    running = await startServer(loadConfig({ NODE_ENV: 'test', DATA_DIR: dataDir, PORT: '0', SCRYPT_COST: '1024', LOG_REQUESTS: 'false' }), silentLogger())
    seen = watchPrototypes(running.server)
  })
  afterAll(async () => {
    await running.close()
    fs.rmSync(dataDir, { recursive: true, force: true })
  })

  it('serves the signed-in API through requests born with the app prototypes', async () => {
    const app = running.server.listeners('request').find((l) => 'request' in l && 'response' in l) as unknown as Express
    expect(app).toBeDefined()
    const agent = supertest.agent(running.server)
    const csrf = await agent.get('/api/auth/csrf').expect(200)
    // The headers set per request are all still there.
    expect(csrf.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/)
    expect(csrf.headers['content-security-policy']).toContain("default-src 'self'")
    const signIn = await agent.post('/api/auth/signin').set('x-csrf-token', csrf.body.csrfToken).send({ email: demoAccounts.therapist.email, password: demoAccounts.therapist.password })
    expect(signIn.status).toBe(200)
    const first = await agent.get('/api/therapist/caseload').expect(200)
    expect(Array.isArray(first.body.caseload)).toBe(true)
    await agent.get('/api/therapist/caseload').set('if-none-match', first.headers.etag!).expect(304)
    // Without the session cookie the same route is refused, as before.
    expect((await supertest(running.server).get('/api/therapist/caseload')).status).toBe(401)
    expect(seen.length).toBeGreaterThanOrEqual(5)
    for (const s of seen) {
      expect(s.request).toBe(app.request)
      expect(s.response).toBe(app.response)
    }
  })
})
