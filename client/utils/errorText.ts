import { ApiError } from '@/api/http'

/** A plain sentence for any error thrown by the API client. */
export function errorText(err: unknown): string {
  if (err instanceof ApiError) return err.message
  return 'Something went wrong. Please try again.'
}
