import type { SignIn, SignUp } from '@shared/schemas/auth.schema'
import { meSchema } from '@shared/schemas/user.schema'
import { z } from 'zod'
import { request, setCsrfToken } from './http'

const messageSchema = z.object({ message: z.string() })
const signInResponse = z.object({ user: meSchema, csrfToken: z.string() })

export async function signIn(input: SignIn) {
  const res = await request('POST', '/api/auth/signin', input, signInResponse)
  setCsrfToken(res.csrfToken)
  return res.user
}

export async function signOut(): Promise<void> {
  const res = await request('POST', '/api/auth/signout', {}, z.object({ csrfToken: z.string() }))
  setCsrfToken(res.csrfToken)
}

/** Ends every session of the account, this one included; the next request fetches a new CSRF token. */
export async function signOutEverywhere(): Promise<void> {
  await request('POST', '/api/auth/signout-everywhere', {}, messageSchema)
  setCsrfToken(undefined)
}

export const signUp = (input: SignUp) => request('POST', '/api/auth/signup', input, messageSchema)
export const verifyEmail = (token: string) => request('POST', '/api/auth/verify', { token }, messageSchema)
export const resendVerification = () => request('POST', '/api/auth/verify/resend', {}, messageSchema)
export const requestReset = (email: string) => request('POST', '/api/auth/reset/request', { email }, messageSchema)
export const resetPassword = (token: string, password: string) => request('POST', '/api/auth/reset', { token, password }, messageSchema)
