import type { OutgoingMail } from '../transport'

// Subjects stay discreet: nothing in them says what Rungs is for. No journal text ever goes into mail.

export function verifyMail(to: string, name: string, link: string): OutgoingMail {
  return {
    to,
    subject: 'Confirm your e-mail address',
    text: `Hello ${name},\n\nPlease confirm this address for your Rungs account by opening this link:\n\n${link}\n\nThe link works for 24 hours. If you did not ask for this, you can ignore this message.\n`,
  }
}

export function alreadyRegisteredMail(to: string, name: string, signInLink: string, resetLink: string): OutgoingMail {
  return {
    to,
    subject: 'About your Rungs account',
    text: `Hello ${name},\n\nSomeone tried to create a Rungs account with this address, which already has one.\n\nIf it was you, sign in here: ${signInLink}\nForgot the password? Choose a new one here: ${resetLink}\n\nIf it was not you, no action is needed; nothing has changed.\n`,
  }
}

export function resetMail(to: string, name: string, link: string): OutgoingMail {
  return {
    to,
    subject: 'Choose a new password',
    text: `Hello ${name},\n\nTo choose a new password for your Rungs account, open this link:\n\n${link}\n\nIt works once, for 1 hour. If you did not ask for this, you can ignore this message; your password stays as it is.\n`,
  }
}
