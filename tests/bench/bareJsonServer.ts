// The yardstick for the caseload figure: a bare Express app with one small JSON route, in its own process like Rungs.
import http from 'node:http'
import express from 'express'
import { appMessages } from '../../server/appMessages'

const app = express()
app.get('/bare', (_req, res) => {
  res.json({ ok: true, at: '2026-01-01T00:00:00.000Z', items: [1, 2, 3] })
})
// Not the yardstick: the same bare app sending a prebuilt body of BODY_BYTES, to show how much of the caseload's cost is
// only moving its answer (server and autocannon share the machine's cores).
const big = Buffer.from(JSON.stringify({ pad: 'x'.repeat(Math.max(0, Number(process.env.BODY_BYTES ?? 0) - 10)) }))
app.get('/bare-body', (_req, res) => {
  res.type('application/json').send(big)
})
// APP_MESSAGES=1: for comparison only, the same app on a server built like Rungs' own (server/appMessages.ts).
const messages = process.env.APP_MESSAGES === '1' ? appMessages() : undefined
const server = messages ? http.createServer(messages.options, app) : http.createServer(app)
messages?.adopt(app)
server.listen(Number(process.env.PORT), '127.0.0.1', () => console.log('bare JSON server listening'))
