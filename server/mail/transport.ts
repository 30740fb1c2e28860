import nodemailer from 'nodemailer'

export interface OutgoingMail {
  to: string
  subject: string
  text: string
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<void>
  close(): void
}

/** One nodemailer transport: the real server when SMTP_URL is set, otherwise the local fake on loopback. */
export function createMailer(opts: { smtpUrl?: string; fakePort?: number; from: string }): Mailer {
  const transport = opts.smtpUrl
    ? nodemailer.createTransport(opts.smtpUrl)
    : nodemailer.createTransport({ host: '127.0.0.1', port: opts.fakePort, secure: false, ignoreTLS: true })
  return {
    async send(mail) {
      await transport.sendMail({ from: opts.from, ...mail })
    },
    close: () => transport.close(),
  }
}
