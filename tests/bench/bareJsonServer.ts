// The yardstick for the caseload figure: a bare Express app with one small JSON route, in its own process like Rungs.
import express from 'express'

const app = express()
app.get('/bare', (_req, res) => {
  res.json({ ok: true, at: '2026-01-01T00:00:00.000Z', items: [1, 2, 3] })
})
app.listen(Number(process.env.PORT), '127.0.0.1', () => console.log('bare JSON server listening'))
