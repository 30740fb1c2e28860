import { rateLimit } from 'express-rate-limit'

/** A per-IP limit that answers in the one error shape. */
export function limitPerIp(limit: number, windowMs = 15 * 60 * 1000) {
  return rateLimit({
    windowMs,
    limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, res) => {
      res.status(429).json({ error: { code: 'rate_limited', message: 'Too many attempts. Please wait a few minutes and try again.' } })
    },
  })
}
