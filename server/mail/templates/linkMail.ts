import type { OutgoingMail } from '../transport'

// Subjects stay discreet: nothing says what Rungs is for, and no one's name is in a subject. No journal text ever.

export function invitationMail(to: string, fromName: string, code: string, appUrl: string): OutgoingMail {
  return {
    to,
    subject: 'An invitation to connect on Rungs',
    text: `Hello,\n\n${fromName} has invited you to connect on Rungs.\n\nTo accept, sign in to Rungs, open More, then Share, and enter this code:\n\n    ${code}\n\n${appUrl}\n\nThe code works once, for 7 days. If you were not expecting this, you can ignore this message.\n`,
  }
}

export function linkStartedMail(to: string, name: string, otherName: string): OutgoingMail {
  return {
    to,
    subject: 'A new link on your Rungs account',
    text: `Hello ${name},\n\nYour Rungs account is now linked with ${otherName}.\n\nYou can see and end your links in Rungs at any time.\n`,
  }
}

export function linkEndedMail(to: string, name: string, otherName: string): OutgoingMail {
  return {
    to,
    subject: 'A link on your Rungs account has ended',
    text: `Hello ${name},\n\nThe link between your Rungs account and ${otherName} has ended. Copies shared over it have been removed from Rungs.\n`,
  }
}

export function sharedDigestMail(to: string, name: string, entries: number, people: number, appUrl: string): OutgoingMail {
  const what = `${entries} new shared ${entries === 1 ? 'entry' : 'entries'}`
  const who = people === 1 ? 'one person' : `${people} people`
  return {
    to,
    subject: 'New activity on Rungs',
    text: `Hello ${name},\n\nThere ${entries === 1 ? 'is' : 'are'} ${what} from ${who} on Rungs.\n\nSign in to read them: ${appUrl}\n`,
  }
}
