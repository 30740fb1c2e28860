import { createHash } from 'node:crypto'
import { rateLimit, type Store } from 'express-rate-limit'
import type { AppDeps } from '../deps'
import { DatabaseRateLimitStore } from './DatabaseRateLimitStore'

/**
 * Counters in the database, named per limiter, so that every app instance on one database shares them. Each limiter
 * needs its own store (express-rate-limit refuses to share one); the same name on two instances means the same counters.
 */
export function sharedCounters(deps: Pick<AppDeps, 'models'>, name: string): Store {
  return new DatabaseRateLimitStore(deps.models.RateLimitCounter, name)
}

export interface LimitOptions {
  /** Where the hits are counted: `sharedCounters(deps, name)`. */
  store: Store
  windowMs?: number
  skipSuccessfulRequests?: boolean
}

/**
 * A per-IP limit that answers in the one error shape. `skipSuccessfulRequests` counts only failures, so people
 * sharing one address (a practice's Wi-Fi, a mobile carrier's NAT) do not lock each other out by signing in.
 */
export function limitPerIp(limit: number, { store, windowMs = 15 * 60 * 1000, skipSuccessfulRequests = false }: LimitOptions) {
  return rateLimit({
    windowMs,
    limit,
    skipSuccessfulRequests,
    store,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, res) => {
      res.status(429).json({ error: { code: 'rate_limited', message: 'Too many attempts. Please wait a few minutes and try again.' } })
    },
  })
}

const accountKey = (email: string) => `account:${createHash('sha256').update(email).digest('hex')}`

/**
 * A limit per account, from any number of IPs: the key is the normalised e-mail address of the body (hashed, so a
 * shared counter store never holds addresses). Only failures count. Made-up addresses are counted and answered
 * exactly like real ones, so the limit tells nobody which addresses have an account. The counters are shared
 * between servers through `store`.
 */
export function limitPerAccount(limit: number, { windowMs = 15 * 60 * 1000, store }: { windowMs?: number; store: Store }) {
  return rateLimit({
    windowMs,
    limit,
    skipSuccessfulRequests: true,
    store,
    keyGenerator: (req) => accountKey(String(req.body?.email ?? '').trim().toLowerCase()),
    skip: (req) => typeof req.body?.email !== 'string',
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    // The same answer as limitPerIp's.
    handler: (_req, res) => {
      res.status(429).json({ error: { code: 'rate_limited', message: 'Too many attempts. Please wait a few minutes and try again.' } })
    },
  })
}
