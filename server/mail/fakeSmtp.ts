import { randomUUID } from 'node:crypto'
import type { AddressInfo } from 'node:net'
import { simpleParser } from 'mailparser'
import { SMTPServer } from 'smtp-server'
import type { MailMessage } from '../../shared/schemas/admin.schema'

export interface FakeSmtp {
  port: number
  /** Newest first. */
  messages(): MailMessage[]
  find(id: string): MailMessage | undefined
  /** Resolves with the first message (old or new) that matches, for tests. */
  waitFor(match: (m: MailMessage) => boolean, timeoutMs?: number): Promise<MailMessage>
  close(): Promise<void>
}

const KEEP = 200

/**
 * A real SMTP server on loopback that keeps what it receives in memory, so someone trying Rungs can read the mail it
 * sends on the admin "Sent mail" page. It refuses to run in production, where it would expose reset links.
 */
export async function startFakeSmtp(opts: { port?: number; env: string; allowInProduction?: boolean }): Promise<FakeSmtp> {
  if (opts.env === 'production' && !opts.allowInProduction) {
    throw new Error('The local fake mail server does not run when NODE_ENV=production. Set SMTP_URL to a real mail server.')
  }
  const store: MailMessage[] = []
  const waiters = new Set<{ match: (m: MailMessage) => boolean; resolve: (m: MailMessage) => void }>()

  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    banner: 'Rungs local fake mail',
    logger: false,
    size: 1024 * 1024,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          const to = Array.isArray(parsed.to) ? parsed.to.map((a) => a.text).join(', ') : (parsed.to?.text ?? '')
          const message: MailMessage = {
            id: randomUUID(),
            to,
            from: parsed.from?.text ?? '',
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            receivedAt: new Date().toISOString(),
          }
          store.unshift(message)
          store.length = Math.min(store.length, KEEP)
          for (const w of waiters) if (w.match(message)) { waiters.delete(w); w.resolve(message) }
          callback()
        })
        .catch((err: Error) => callback(err))
    },
  })
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(opts.port ?? 0, '127.0.0.1', () => resolve())
  })
  const port = ((server.server.address() as AddressInfo) ?? { port: 0 }).port

  return {
    port,
    messages: () => store.slice(),
    find: (id) => store.find((m) => m.id === id),
    waitFor(match, timeoutMs = 5000) {
      const found = store.find(match)
      if (found) return Promise.resolve(found)
      return new Promise((resolve, reject) => {
        const w = { match, resolve: (m: MailMessage) => { clearTimeout(timer); resolve(m) } }
        const timer = setTimeout(() => { waiters.delete(w); reject(new Error('No matching mail arrived in time')) }, timeoutMs)
        waiters.add(w)
      })
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  }
}
