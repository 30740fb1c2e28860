import { accountRowSchema, mailMessageSchema, mailSummarySchema, type Approve } from '@shared/schemas/admin.schema'
import { z } from 'zod'
import { request } from './http'

export const fetchAccounts = () => request('GET', '/api/admin/accounts', undefined, z.object({ accounts: z.array(accountRowSchema) }))
export const setAccountDisabled = (id: string, disabled: boolean) =>
  request('PATCH', `/api/admin/accounts/${encodeURIComponent(id)}`, { disabled }, z.object({ account: accountRowSchema }))
export const fetchPending = () => request('GET', '/api/admin/approvals', undefined, z.object({ pending: z.array(accountRowSchema) }))
export const approveTherapist = (id: string, input: Approve) => request('POST', `/api/admin/approvals/${encodeURIComponent(id)}`, input)
export const revokeApproval = (id: string) => request('DELETE', `/api/admin/approvals/${encodeURIComponent(id)}`)
export const fetchSentMail = () => request('GET', '/api/admin/mail', undefined, z.object({ messages: z.array(mailSummarySchema) }))
export const fetchMail = (id: string) => request('GET', `/api/admin/mail/${encodeURIComponent(id)}`, undefined, z.object({ message: mailMessageSchema }))
