import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import supertest from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { demoAccounts } from '../../server/db/seed'
import { apiErrorSchema } from '../../shared/schemas/error.schema'
import { agentWithCsrf, makeTestApp, type TestApp } from '../helpers/testApp'

let t: TestApp
let clientDir: string
beforeAll(async () => {
  // A small built client, so static files and the app shell are served too.
  clientDir = fs.mkdtempSync(path.join(os.tmpdir(), 'rungs-client-'))
  fs.mkdirSync(path.join(clientDir, 'assets'))
  fs.writeFileSync(path.join(clientDir, 'index.html'), '<!doctype html><title>Rungs</title><script type="module" src="/assets/app.js"></script>')
  fs.writeFileSync(path.join(clientDir, 'assets', 'app.js'), 'console.log(1)')
  t = await makeTestApp({}, { clientDir })
})
afterAll(async () => {
  await t.close()
  fs.rmSync(clientDir, { recursive: true, force: true })
})

function directives(csp: string): Map<string, string[]> {
  return new Map(csp.split(';').map((d) => d.trim().split(/\s+/)).filter((d) => d[0]).map(([name, ...values]) => [name!, values]))
}

describe('Content-Security-Policy', () => {
  it('allows scripts only from the app itself, with no inline or eval, and locks objects, base, frames and forms', async () => {
    const res = await supertest(t.app).get('/')
    const csp = directives(res.headers['content-security-policy'] as string)
    expect(csp.get('script-src')).toEqual(["'self'"])
    expect(csp.get('object-src')).toEqual(["'none'"])
    expect(csp.get('base-uri')).toEqual(["'self'"])
    expect(csp.get('frame-ancestors')).toEqual(["'none'"])
    expect(csp.get('form-action')).toEqual(["'self'"])
    expect(csp.get('default-src')).toEqual(["'self'"])
    expect(res.headers['content-security-policy']).not.toMatch(/unsafe-eval|script-src[^;]*unsafe-inline/)
  })

  it('the built index.html has no inline script and no inline event handler', () => {
    const built = path.resolve('dist/index.html')
    expect(fs.existsSync(built), 'run `npm run build` first (npm test does)').toBe(true)
    const html = fs.readFileSync(built, 'utf8')
    const scripts = [...html.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/gi)]
    expect(scripts.length).toBeGreaterThan(0)
    for (const [, attrs, body] of scripts) {
      if (/type=["']?application\/(ld\+)?json/i.test(attrs!)) continue
      expect(body!.trim(), `inline script: ${attrs}`).toBe('')
      expect(attrs).toMatch(/\bsrc=/)
    }
    expect(html).not.toMatch(/<[^>]+\son[a-z]+\s*=/i)
    expect(html).not.toMatch(/javascript:/i)
  })
})

describe('Strict-Transport-Security', () => {
  it('is absent over plain http on localhost', async () => {
    const res = await supertest(t.app).get('/api/auth/csrf')
    expect(res.headers['strict-transport-security']).toBeUndefined()
  })

  it('is ignored when an untrusted client claims X-Forwarded-Proto https', async () => {
    const res = await supertest(t.app).get('/api/auth/csrf').set('X-Forwarded-Proto', 'https')
    expect(res.headers['strict-transport-security']).toBeUndefined()
  })

  it('is sent when APP_URL is https', async () => {
    const https = await makeTestApp({ APP_URL: 'https://rungs.example.org' })
    try {
      const res = await supertest(https.app).get('/api/auth/csrf')
      expect(res.headers['strict-transport-security']).toBe('max-age=31536000; includeSubDomains')
      expect(res.headers['content-security-policy']).toContain('upgrade-insecure-requests')
    } finally {
      await https.close()
    }
  })

  it('is sent behind a trusted proxy that says the request came over https, and not when it says http', async () => {
    const proxied = await makeTestApp({ TRUST_PROXY: 'true' })
    try {
      const tls = await supertest(proxied.app).get('/api/auth/csrf').set('X-Forwarded-Proto', 'https')
      expect(tls.headers['strict-transport-security']).toBe('max-age=31536000; includeSubDomains')
      const plain = await supertest(proxied.app).get('/api/auth/csrf').set('X-Forwarded-Proto', 'http')
      expect(plain.headers['strict-transport-security']).toBeUndefined()
    } finally {
      await proxied.close()
    }
  })
})

describe('Referrer-Policy and Permissions-Policy', () => {
  for (const [what, url] of [['an API answer', '/api/auth/csrf'], ['an API 404', '/api/nowhere'], ['the app shell', '/journal'], ['a static file', '/assets/app.js'], ['a missing static file under a non-GET', '/assets/nope.js']] as const) {
    it(`are set on ${what}`, async () => {
      const req = what.includes('non-GET') ? supertest(t.app).post(url) : supertest(t.app).get(url)
      const res = await req
      expect(res.headers['referrer-policy']).toBe('no-referrer')
      expect(res.headers['permissions-policy']).toMatch(/camera=\(\).*microphone=\(\).*geolocation=\(\)/)
      expect(res.headers['x-content-type-options']).toBe('nosniff')
      if (url.startsWith('/api/nowhere') || what.includes('non-GET')) {
        expect(res.status).toBe(404)
        expect(apiErrorSchema.safeParse(res.body).success).toBe(true)
      }
    })
  }
})

describe('errors never carry server details', () => {
  it('a malformed JSON body answers 400 bad_json in the error shape', async () => {
    const a = await agentWithCsrf(t.app)
    const res = await a.agent.post('/api/auth/signin').set('x-csrf-token', a.token).set('content-type', 'application/json').send('{"email": "x@example.org", "password": ')
    expect(res.status).toBe(400)
    expect(res.body).toEqual({ error: { code: 'bad_json', message: 'The request body is not valid JSON.' } })
  })

  it('a field error names the field, its kind and a plain message, without check patterns or echoed unknown keys', async () => {
    const a = await agentWithCsrf(t.app)
    expect((await a.signIn(demoAccounts.therapist.email, demoAccounts.therapist.password)).status).toBe(200)
    const res = await a.post("/api/therapist/links/'; DROP TABLE users; --/notes", { text: 'a note', 'key-12:34:56': 1 })
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('invalid_input')
    expect(res.body.error.details).toEqual([
      { path: ['params', 'linkId'], code: 'invalid_format', message: 'That link id is not valid.' },
      { path: ['body'], code: 'unrecognized_keys', message: 'This field is not expected here.' },
    ])
    expect(res.text).not.toMatch(/pattern|\[0-9a-fA-F\]|key-12/)
  })

  it('a body over the limit answers 413 too_large in the error shape', async () => {
    const a = await agentWithCsrf(t.app)
    const res = await a.agent.post('/api/auth/signin').set('x-csrf-token', a.token).send({ email: 'x@example.org', password: 'y'.repeat(400_000) })
    expect(res.status).toBe(413)
    expect(res.body).toEqual({ error: { code: 'too_large', message: 'That request is too large.' } })
  })

  it('a real internal failure (the database closed under the app) answers 500 without stack, paths or SQL', async () => {
    const broken = await makeTestApp()
    try {
      const a = await agentWithCsrf(broken.app)
      await broken.deps.sequelize.close()
      const res = await a.agent.post('/api/auth/signin').set('x-csrf-token', a.token).send({ email: demoAccounts.person.email, password: demoAccounts.person.password })
      expect(res.status).toBe(500)
      expect(res.body).toEqual({ error: { code: 'internal', message: 'Something went wrong on our side. Nothing you sent was lost; please try again.' } })
      expect(res.text).not.toMatch(/\bat |\.ts|node_modules|SQLITE|SELECT|Sequelize|\/work\//)
      expect(res.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/)
    } finally {
      // The database is already closed; close the rest.
      broken.app.stop()
      broken.deps.mailer.close()
      await broken.deps.fakeSmtp.close()
      fs.rmSync(broken.dataDir, { recursive: true, force: true })
    }
  })

  it('a URL too long for the HTTP parser answers 431 in the error shape', async () => {
    const http = await import('node:http')
    const { answerClientErrors } = await import('../../server/start')
    const server = http.createServer(t.app)
    answerClientErrors(server)
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve))
    try {
      const port = (server.address() as import('node:net').AddressInfo).port
      const res = await fetch(`http://127.0.0.1:${port}/api/me?q=${'x'.repeat(20_000)}`)
      expect(res.status).toBe(431)
      expect(apiErrorSchema.safeParse(await res.json()).success).toBe(true)
    } finally {
      server.closeAllConnections()
      await new Promise((resolve) => server.close(resolve))
    }
  })
})

describe('compression', () => {
  it('compresses the app’s own files but never an /api answer', async () => {
    const app = await makeTestApp({}, { clientDir: path.resolve('dist') })
    try {
      const js = fs.readdirSync('dist/assets').find((f) => f.endsWith('.js') && fs.statSync(`dist/assets/${f}`).size > 4096)!
      const asset = await supertest(app.app).get(`/assets/${js}`).set('Accept-Encoding', 'gzip')
      expect(asset.headers['content-encoding']).toBe('gzip')
      const csrf = await supertest(app.app).get('/api/auth/csrf').set('Accept-Encoding', 'gzip')
      expect(csrf.status).toBe(200)
      expect(csrf.headers['content-encoding']).toBeUndefined()
    } finally {
      await app.close()
    }
  })
})
