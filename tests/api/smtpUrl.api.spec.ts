import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import supertest from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { loadConfig } from '../../server/config/env'
import { demoAccounts } from '../../server/db/seed'
import { startFakeSmtp, type FakeSmtp } from '../../server/mail/fakeSmtp'
import { silentLogger } from '../../server/log/logger'
import { startServer, type Running } from '../../server/start'

// Stands in for an outside mail server: a real SMTP listener that Rungs only knows through SMTP_URL.
let outside: FakeSmtp
let running: Running
let dataDir: string

beforeAll(async () => {
  outside = await startFakeSmtp({ port: 0, env: 'test' })
  dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'rungs-smtpurl-'))
  const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: dataDir, PORT: '0', SCRYPT_COST: '1024', SMTP_URL: `smtp://127.0.0.1:${outside.port}` })
  running = await startServer(config, silentLogger())
})
afterAll(async () => {
  await running.close()
  await outside.close()
  fs.rmSync(dataDir, { recursive: true, force: true })
})

describe('with SMTP_URL set', () => {
  it('starts no local fake and sends through the configured server', async () => {
    expect(running.deps.fakeSmtp).toBeUndefined()
    const agent = supertest.agent(running.server)
    const { csrfToken } = (await agent.get('/api/auth/csrf').expect(200)).body
    await agent.post('/api/auth/reset/request').set('x-csrf-token', csrfToken).send({ email: demoAccounts.person.email }).expect(202)
    const mail = await outside.waitFor((m) => m.to.includes(demoAccounts.person.email))
    expect(mail.subject).toBe('Choose a new password')
    expect(mail.text).toMatch(/\/reset\?token=[A-Za-z0-9_-]{43}/)
  })

  it('has no Sent mail page, even for an admin', async () => {
    const agent = supertest.agent(running.server)
    const token = (await agent.get('/api/auth/csrf')).body.csrfToken
    const signIn = await agent.post('/api/auth/signin').set('x-csrf-token', token).send({ email: demoAccounts.admin.email, password: demoAccounts.admin.password })
    expect(signIn.status).toBe(200)
    expect((await agent.get('/api/admin/mail')).status).toBe(404)
    expect((await agent.get('/api/me')).body.features).toEqual({ sentMail: false })
  })
})
