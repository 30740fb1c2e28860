import type { OutgoingMail } from '../transport'

// A duty notice (GDPR Art. 19, from memory: recipients are told of an erasure), so it goes even to someone who turned
// notices off. The subject says nothing about what Rungs is for; the body holds no entry text and no score.

export function accountClosedMail(to: string, name: string, otherName: string): OutgoingMail {
  return {
    to,
    subject: 'A linked account on Rungs was closed',
    text:
      `Hello ${name},\n\n${otherName}, who was linked with your Rungs account, has closed their account.\n\n` +
      'The link has ended. Every copy they shared with you, the earlier scores entered for them and the appointments on ' +
      'the link have been removed from Rungs. Your own prep notes for the link stay with you.\n',
  }
}
