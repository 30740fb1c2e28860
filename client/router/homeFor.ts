import type { Role } from '@shared/schemas/auth.schema'
import { RouteName, type RouteNameValue } from './names'

/** Where each role lands after signing in. */
export function homeFor(role: Role | undefined): RouteNameValue {
  if (role === 'therapist') return RouteName.Caseload
  if (role === 'admin') return RouteName.AdminApprovals
  return RouteName.Today
}
