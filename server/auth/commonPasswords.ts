import { dictionary } from '@zxcvbn-ts/language-common'

let common: Set<string> | undefined

/**
 * True when the password is on @zxcvbn-ts/language-common's list of common passwords (about 49 000), ignoring case.
 * NIST SP 800-63B 5.1.1.2 asks for a check against commonly used or breached passwords. The list is loaded once, on the
 * server only, so it never reaches the client bundle.
 */
export function isCommonPassword(password: string): boolean {
  common ??= new Set(dictionary['passwords-common'].map((p) => p.toLowerCase()))
  return common.has(password.toLowerCase())
}

/**
 * True when the password is the account's own e-mail address, the part before the @, or the display name, ignoring case
 * and surrounding spaces (NIST SP 800-63B 5.1.1.2: context-specific words such as the username).
 */
export function isContextPassword(password: string, context: { email: string; displayName: string }): boolean {
  const p = password.trim().toLowerCase()
  const email = context.email.trim().toLowerCase()
  const words = [email, email.split('@')[0] ?? '', context.displayName.trim().toLowerCase()]
  return words.some((w) => w.length > 0 && w === p)
}
