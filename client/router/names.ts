/** Every route name, so a broken link is a compile error. */
export const RouteName = {
  Today: 'today',
  More: 'more',
  Settings: 'settings',
  SignIn: 'signIn',
  SignUp: 'signUp',
  Verify: 'verify',
  Forgot: 'forgot',
  Reset: 'reset',
  TherapistSettings: 'therapistSettings',
  AdminAccounts: 'adminAccounts',
  AdminApprovals: 'adminApprovals',
  AdminSentMail: 'adminSentMail',
  NotFound: 'notFound',
} as const
export type RouteNameValue = (typeof RouteName)[keyof typeof RouteName]
