// The real Rungs server as a child process, so it can be killed with SIGKILL and started again on the same data folder.
import { spawn, type ChildProcess } from 'node:child_process'
import net from 'node:net'
import path from 'node:path'
import { fileURLToPath } from 'node:url'

export const repoRoot = fileURLToPath(new URL('../..', import.meta.url))

/** A port that was free a moment ago (the kernel picks it; the listener is closed again at once). */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = net.createServer()
    probe.once('error', reject)
    probe.listen(0, '127.0.0.1', () => {
      const { port } = probe.address() as net.AddressInfo
      probe.close(() => resolve(port))
    })
  })
}

export interface RungsProcess {
  child: ChildProcess
  origin: string
  /** Resolves with the exit code (null when killed by a signal). */
  exited: Promise<number | null>
  /** SIGKILL: no shutdown code runs, whatever was in flight is cut off. */
  kill9(): Promise<void>
  /** SIGTERM: the server finishes open requests and closes the database. */
  stop(): Promise<number | null>
  /** Lines the server printed to stderr (start-up failures, unhandled errors). */
  errors: string[]
}

/**
 * Starts `server/index.ts` in one node process (`node --import tsx`, no npx or tsx wrapper process in between, so a
 * SIGKILL reaches the server itself). Resolves once it prints that it is running.
 */
export function startRungsProcess(opts: { dataDir: string; port: number; env?: Record<string, string> }): Promise<RungsProcess> {
  const child = spawn(process.execPath, ['--import', 'tsx', path.join('server', 'index.ts')], {
    cwd: repoRoot,
    stdio: ['ignore', 'pipe', 'pipe'],
    env: {
      ...process.env,
      NODE_ENV: 'test',
      HOST: '127.0.0.1',
      DATA_DIR: opts.dataDir,
      PORT: String(opts.port),
      // The bench server only: sign-in of hundreds of accounts must not be the thing measured or throttled.
      SCRYPT_COST: '1024',
      SEED_DEMO: 'false',
      SIGNIN_LIMIT: '100000',
      RESET_LIMIT: '100000',
      LOG_REQUESTS: 'false',
      ...opts.env,
    },
  })
  const errors: string[] = []
  const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)))
  child.stderr!.setEncoding('utf8').on('data', (chunk: string) => errors.push(...chunk.split('\n').filter(Boolean)))
  const origin = `http://127.0.0.1:${opts.port}`
  return new Promise((resolve, reject) => {
    let out = ''
    const timer = setTimeout(() => reject(new Error(`the Rungs server did not start within 30 s: ${errors.join(' | ')}`)), 30_000)
    child.stdout!.setEncoding('utf8').on('data', (chunk: string) => {
      out += chunk
      if (out.includes('Rungs is running at')) {
        clearTimeout(timer)
        resolve({
          child,
          origin,
          exited,
          errors,
          async kill9() {
            child.kill('SIGKILL')
            await exited
          },
          async stop() {
            child.kill('SIGTERM')
            return exited
          },
        })
      }
    })
    void exited.then((code) => {
      clearTimeout(timer)
      reject(new Error(`the Rungs server exited (${code}) before it started: ${errors.join(' | ')}`))
    })
  })
}
