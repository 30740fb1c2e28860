import { createHash, randomInt } from 'node:crypto'
import { inviteCodeAlphabet, inviteCodeLength } from '../../../shared/schemas/link.schema'

/** A fresh code of 8 unambiguous characters (31^8, about 8.5e11 codes), bare, without the display dash. */
export function newInviteCode(): string {
  let code = ''
  for (let i = 0; i < inviteCodeLength; i++) code += inviteCodeAlphabet[randomInt(inviteCodeAlphabet.length)]
  return code
}

/** XXXX-XXXX, as shown to people. */
export const displayInviteCode = (code: string) => `${code.slice(0, 4)}-${code.slice(4)}`

/** Only this hash is stored, so a leaked database gives no usable codes. */
export const hashInviteCode = (code: string) => createHash('sha256').update(code).digest('hex')
