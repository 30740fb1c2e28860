import type { Sequelize } from 'sequelize'
import type { Config } from './config/env'
import type { Models } from './db/associations'
import type { FakeSmtp } from './mail/fakeSmtp'
import type { Mailer } from './mail/transport'
import type { Logger } from './log/logger'

/** What createApp needs; built once by server/start.ts (or by a test). */
export interface AppDeps {
  config: Readonly<Config>
  sequelize: Sequelize
  models: Models
  mailer: Mailer
  /** Present only when the local fake mail server is in use. */
  fakeSmtp?: FakeSmtp
  /** pino; never give it bodies, entry text, passwords, tokens or cookies. */
  log: Logger
  /** The clock for time rules (invitation expiry, digest period, "since the last session"); tests may replace it. */
  now?: () => Date
}
