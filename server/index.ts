import { ConfigError, loadConfig } from './config/env'
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
  const running = await startServer(config)
  console.log(`Rungs is running at ${running.url}`)
  const stop = (signal: string) => {
    console.log(`${signal}: finishing open requests, then closing the database`)
    running.close().then(() => process.exit(0), (err) => { console.error(err); process.exit(1) })
  }
  process.once('SIGTERM', () => stop('SIGTERM'))
  process.once('SIGINT', () => stop('SIGINT'))
}

main().catch((err) => {
  console.error('Rungs could not start:', err instanceof Error ? err.message : err)
  process.exit(1)
})
