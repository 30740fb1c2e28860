import fs from 'node:fs'
import path from 'node:path'
import compression from 'compression'
import { csrfSync } from 'csrf-sync'
import express, { type Express, type RequestHandler } from 'express'
import helmet from 'helmet'
import { createSessionMiddleware } from './auth/session'
import { sessionUsers } from './auth/loadSessionUser'
import { createPassport } from './auth/passport'
import type { AppDeps } from './deps'
import { httpLogger, requestIds } from './log/logger'
import { errorHandler } from './middleware/errorHandler'
import { notFound } from './middleware/notFound'
import { sessionTimeouts } from './middleware/sessionTimeouts'
import { adminRoutes } from './modules/admin/admin.routes'
import { authRoutes } from './modules/auth/auth.routes'
import { linksRoutes } from './modules/links/links.routes'
import { sentMailRoutes } from './modules/mail/mail.routes'
import { measuresRoutes } from './modules/measures/measures.routes'
import { meRoutes } from './modules/me/me.routes'
import { personRoutes } from './modules/person/person.routes'
import { caseloadFingerprintRider } from './modules/prep/caseloadCache'
import { prepRoutes } from './modules/prep/prep.routes'
import { privacyRoutes } from './modules/privacy/privacy.routes'
import { sharesRoutes } from './modules/shares/shares.routes'
import { therapistRoutes } from './modules/therapist/therapist.routes'

/** HSTS for a year, sent only when the request arrived over TLS (`req.secure`, through a trusted proxy too). */
const HSTS = 'max-age=31536000; includeSubDomains'

function securityHeaders(https: boolean): RequestHandler[] {
  return [
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          // Vue and Quasar set style attributes at run time; no outside origin is allowed for anything.
          styleSrc: ["'self'", "'unsafe-inline'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          fontSrc: ["'self'", 'data:'],
          connectSrc: ["'self'"],
          workerSrc: ["'self'"],
          manifestSrc: ["'self'"],
          objectSrc: ["'none'"],
          baseUri: ["'self'"],
          formAction: ["'self'"],
          frameAncestors: ["'none'"],
          // Only over https: on plain http to a non-loopback address it blanks the page.
          ...(https ? { upgradeInsecureRequests: [] } : {}),
        },
      },
      // Set below per request, so a TLS-terminating proxy (TRUST_PROXY + X-Forwarded-Proto) gets it too.
      strictTransportSecurity: false,
      referrerPolicy: { policy: 'no-referrer' },
    }),
    (req, res, next) => {
      res.setHeader('Permissions-Policy', 'camera=(), microphone=(), geolocation=(), payment=(), usb=()')
      // Never over plain http: browsers ignore it there, and a local http setup must stay reachable.
      if (https || req.secure) res.setHeader('Strict-Transport-Security', HSTS)
      next()
    },
  ]
}

/** Builds the Express app without listening, so tests can drive it with Supertest. */
export function createApp(deps: AppDeps): Express & { stop: () => void } {
  const { config } = deps
  const app = express()
  app.disable('x-powered-by')
  app.set('trust proxy', config.trustProxy ? 1 : false)
  app.use(securityHeaders(config.appUrl.startsWith('https:')))
  // Every request gets an id (X-Request-Id) and req.log; LOG_REQUESTS decides whether each one is also logged.
  app.use(config.logRequests ? httpLogger(deps.log) : requestIds(deps.log, app.request))
  // The app's own files are compressed; /api answers are not, since they can hold a CSRF token next to text a request
  // chose (the BREACH attack on compressed secrets).
  // Mounted past /api altogether: wrapping every API response only to decline it cost about a tenth of a caseload request.
  const compress = compression()
  app.use((req, res, next) => (req.path.startsWith('/api') ? next() : compress(req, res, next)))

  // The session read brings the signed-in user along for passport, and a therapist's caseload fingerprint: one statement
  // per request instead of two (three for a cached caseload).
  const users = sessionUsers(deps.models, caseloadFingerprintRider)
  const session = createSessionMiddleware(config, deps.sequelize, users)
  const passport = createPassport(deps.models, config.scryptCost, users)
  const csrf = csrfSync({ getTokenFromRequest: (req) => req.get('x-csrf-token') })

  // Sessions live only under /api, so the static app never sets a cookie.
  const api = express.Router()
  api.use(express.json({ limit: '256kb' }))
  api.use(session.middleware)
  api.use(passport.initialize())
  api.use(passport.session())
  // Before CSRF, so a timed-out session answers session_expired rather than csrf.
  api.use(sessionTimeouts(deps))
  api.use(csrf.csrfSynchronisedProtection)
  api.use('/auth', authRoutes(deps, passport, csrf.generateToken))
  api.use('/me', meRoutes(deps))
  api.use('/person', personRoutes(deps))
  api.use('/therapist', therapistRoutes(deps))
  api.use('/admin', adminRoutes(deps))
  // Links, shares and prep name their full paths and guard each route themselves.
  api.use(linksRoutes(deps))
  api.use(sharesRoutes(deps))
  api.use(prepRoutes(deps))
  api.use(measuresRoutes(deps))
  api.use(privacyRoutes(deps))
  if (deps.fakeSmtp && config.env !== 'production') api.use('/admin/mail', sentMailRoutes(deps.fakeSmtp))
  api.use(notFound)
  app.use('/api', api)

  const clientDir = config.clientDir
  if (clientDir && fs.existsSync(path.join(clientDir, 'index.html'))) {
    app.use(
      express.static(clientDir, {
        index: false,
        setHeaders(res, file) {
          // Hashed assets never change; the shell and the service worker must be re-checked on every visit.
          if (file.includes(`${path.sep}assets${path.sep}`)) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable')
          else res.setHeader('Cache-Control', 'no-cache')
        },
      }),
    )
    app.get('/{*splat}', (_req, res) => {
      res.setHeader('Cache-Control', 'no-cache')
      res.sendFile(path.join(clientDir, 'index.html'))
    })
  }
  app.use(notFound)
  app.use(errorHandler(deps.log))
  return Object.assign(app, { stop: session.stop })
}
