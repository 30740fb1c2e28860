import type { RequestHandler } from 'express'

export const notFound: RequestHandler = (req, res) => {
  res.status(404).json({ error: { code: 'not_found', message: `There is no ${req.method} ${req.originalUrl.split('?')[0]}.` } })
}
