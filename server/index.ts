import { ConfigError, loadConfig } from './config/env'
import { createLogger } from './log/logger'
import { startServer } from './start'

async function main() {
  let config
  try {
    config = loadConfig()
  } catch (err) {
    if (err instanceof ConfigError) {
      console.error(err.message)
      process.exit(2)
    }
    throw err
  }
  const log = createLogger({ level: config.logLevel })
  const running = await startServer(config, log)
  // The one line a supervisor (or a test) can wait for; the URL carries the port actually chosen with PORT=0.
  log.info({ url: running.url }, `Rungs is running at ${running.url}`)

  let stopping = false
  const stop = (signal: NodeJS.Signals) => {
    // A second signal while closing changes nothing: the first shutdown carries on and exits by itself.
    if (stopping) {
      log.info(`${signal}: already shutting down`)
      return
    }
    stopping = true
    log.info(`${signal}: finishing open requests, then closing the database`)
    running.close().then(
      () => {
        log.info('shutdown: database closed')
        log.flush()
        process.exit(0)
      },
      (err: unknown) => {
        log.error({ err }, 'shutdown failed')
        log.flush()
        process.exit(1)
      },
    )
  }
  process.on('SIGTERM', stop)
  process.on('SIGINT', stop)
}

main().catch((err) => {
  console.error('Rungs could not start:', err instanceof Error ? err.message : err)
  process.exit(1)
})
