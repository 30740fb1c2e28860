import { rateLimit } from 'express-rate-limit'

/**
 * A per-IP limit that answers in the one error shape. `skipSuccessfulRequests` counts only failures, so people
 * sharing one address (a practice's Wi-Fi, a mobile carrier's NAT) do not lock each other out by signing in.
 */
export function limitPerIp(limit: number, { windowMs = 15 * 60 * 1000, skipSuccessfulRequests = false } = {}) {
  return rateLimit({
    windowMs,
    limit,
    skipSuccessfulRequests,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, res) => {
      res.status(429).json({ error: { code: 'rate_limited', message: 'Too many attempts. Please wait a few minutes and try again.' } })
    },
  })
}
