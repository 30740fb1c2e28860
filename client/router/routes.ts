import type { RouteRecordRaw } from 'vue-router'
import type { Role } from '@shared/schemas/auth.schema'
import PersonLayout from '@/layouts/PersonLayout.vue'
import TodayPage from '@/pages/TodayPage.vue'
import { RouteName } from './names'

declare module 'vue-router' {
  interface RouteMeta {
    /** Signed-in roles allowed here; absent means anyone, signed in or not. */
    roles?: Role[]
    title?: string
  }
}

export const routes: RouteRecordRaw[] = [
  {
    path: '/',
    // The first route (the layout and Today) is in the entry chunk: loaded lazily it was a second wave of some 40 small
    // files after the entry, about a second on a slow phone network. Every other page stays lazy.
    component: PersonLayout,
    children: [
      { path: '', name: RouteName.Today, component: TodayPage, meta: { title: 'Today' } },
      { path: 'journal', name: RouteName.Journal, component: () => import('@/pages/JournalPage.vue'), meta: { title: 'Journal' } },
      { path: 'journal/:id', name: RouteName.Entry, component: () => import('@/pages/EntryPage.vue'), meta: { title: 'Entry' } },
      { path: 'moment/:id', name: RouteName.MomentEdit, component: () => import('@/pages/MomentEditPage.vue'), meta: { title: 'Edit moment' } },
      { path: 'tug', name: RouteName.Tug, component: () => import('@/pages/TugPage.vue'), meta: { title: 'Tug' } },
      { path: 'tug/:id', name: RouteName.TugEdit, component: () => import('@/pages/TugPage.vue'), meta: { title: 'Edit tug' } },
      { path: 'grounding', name: RouteName.Grounding, component: () => import('@/pages/GroundingPage.vue'), meta: { title: 'A pause' } },
      { path: 'patterns', name: RouteName.Patterns, component: () => import('@/pages/PatternsPage.vue'), meta: { title: 'Patterns' } },
      { path: 'measures', name: RouteName.Measures, component: () => import('@/pages/MeasuresPage.vue'), meta: { title: 'Measures' } },
      { path: 'measures/new/:instrument', name: RouteName.MeasureForm, component: () => import('@/pages/MeasureFormPage.vue'), meta: { title: 'Questionnaire' } },
      { path: 'measures/:id', name: RouteName.MeasureEntry, component: () => import('@/pages/MeasureEntryPage.vue'), meta: { title: 'Questionnaire result' } },
      { path: 'more', name: RouteName.More, component: () => import('@/pages/MorePage.vue'), meta: { title: 'More' } },
      { path: 'more/settings', name: RouteName.Settings, component: () => import('@/pages/SettingsPage.vue'), meta: { title: 'Settings' } },
      { path: 'more/privacy', name: RouteName.Privacy, component: () => import('@/pages/PrivacyPage.vue'), meta: { title: 'Your data' } },
      { path: 'more/backup', name: RouteName.Backup, component: () => import('@/pages/BackupPage.vue'), meta: { title: 'Backup' } },
      { path: 'more/share', name: RouteName.Share, component: () => import('@/pages/SharePage.vue'), meta: { title: 'Sharing' } },
      { path: 'more/safety-plan', name: RouteName.SafetyPlan, component: () => import('@/pages/SafetyPlanPage.vue'), meta: { title: 'Safety plan' } },
      { path: 'more/summary', name: RouteName.Summary, component: () => import('@/pages/SummaryPage.vue'), meta: { title: 'Summary for an appointment' } },
    ],
  },
  {
    path: '/',
    component: () => import('@/layouts/AuthLayout.vue'),
    children: [
      { path: 'signin', name: RouteName.SignIn, component: () => import('@/pages/SignInPage.vue'), meta: { title: 'Sign in' } },
      { path: 'signup', name: RouteName.SignUp, component: () => import('@/pages/SignUpPage.vue'), meta: { title: 'Create an account' } },
      { path: 'verify', name: RouteName.Verify, component: () => import('@/pages/VerifyPage.vue'), meta: { title: 'Confirm your e-mail' } },
      { path: 'forgot', name: RouteName.Forgot, component: () => import('@/pages/ForgotPasswordPage.vue'), meta: { title: 'Forgot your password' } },
      { path: 'reset', name: RouteName.Reset, component: () => import('@/pages/ResetPasswordPage.vue'), meta: { title: 'Choose a new password' } },
    ],
  },
  {
    path: '/therapist',
    component: () => import('@/layouts/TherapistLayout.vue'),
    meta: { roles: ['therapist'] },
    children: [
      { path: '', redirect: { name: RouteName.Caseload } },
      { path: 'caseload', name: RouteName.Caseload, component: () => import('@/pages/CaseloadPage.vue'), meta: { title: 'Caseload' } },
      { path: 'prep/:linkId', name: RouteName.Prep, component: () => import('@/pages/PrepPage.vue'), meta: { title: 'Prep' } },
      { path: 'invitations', name: RouteName.Invitations, component: () => import('@/pages/InvitationsPage.vue'), meta: { title: 'Invitations' } },
      { path: 'settings', name: RouteName.TherapistSettings, component: () => import('@/pages/TherapistSettingsPage.vue'), meta: { title: 'Settings' } },
    ],
  },
  {
    path: '/admin',
    component: () => import('@/layouts/AdminLayout.vue'),
    meta: { roles: ['admin'] },
    children: [
      { path: '', redirect: { name: RouteName.AdminApprovals } },
      { path: 'approvals', name: RouteName.AdminApprovals, component: () => import('@/pages/ApprovalsPage.vue'), meta: { title: 'Approvals' } },
      { path: 'accounts', name: RouteName.AdminAccounts, component: () => import('@/pages/AccountsPage.vue'), meta: { title: 'Accounts' } },
      { path: 'mail', name: RouteName.AdminSentMail, component: () => import('@/pages/SentMailPage.vue'), meta: { title: 'Sent mail' } },
    ],
  },
  {
    path: '/:pathMatch(.*)*',
    component: () => import('@/layouts/AuthLayout.vue'),
    children: [{ path: '', name: RouteName.NotFound, component: () => import('@/pages/NotFoundPage.vue'), meta: { title: 'Not found' } }],
  },
]
