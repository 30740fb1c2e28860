import { z } from 'zod'
import { download, request, setCsrfToken } from './http'

/** Saves the server's JSON of everything it holds for this account (GDPR Art. 20). */
export const downloadAccountData = () => download('/api/me/export', 'rungs-account.json')

/** Closes the account after the password is confirmed again. The server ends the session, so its CSRF token goes too. */
export async function closeAccount(password: string): Promise<string> {
  const res = await request('DELETE', '/api/me', { password }, z.object({ message: z.string() }))
  setCsrfToken(undefined)
  return res.message
}
