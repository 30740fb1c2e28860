import type { SignUp } from '../../../shared/schemas/auth.schema'
import { isCommonPassword, isContextPassword } from '../../auth/commonPasswords'
import { hashPassword } from '../../auth/password'
import type { AppDeps } from '../../deps'
import { alreadyRegisteredMail, resetMail, verifyMail } from '../../mail/templates/accountMail'
import type { OutgoingMail } from '../../mail/transport'
import { HttpError } from '../../middleware/HttpError'
import { consumeToken, issueToken, peekToken } from './tokens'

type Deps = Pick<AppDeps, 'config' | 'models' | 'mailer' | 'log' | 'sequelize'>

/**
 * Sends in the background: the answer never waits for the mail server, so its timing does not tell an address with an
 * account from one without. Failures are logged without the address.
 */
function sendQuietly(deps: Deps, mail: OutgoingMail): void {
  deps.mailer.send(mail).catch((err: Error) => deps.log.warn({ err }, `mail: could not send "${mail.subject}"`))
}

const passwordIssue = (message: string) => [{ path: ['body', 'password'], message }]

/**
 * Refuses a password on the common-password list or equal to the account's own address or name (NIST SP 800-63B
 * 5.1.1.2). It looks only at what was typed, never at whether the address has an account, so the answer gives nothing away.
 */
export function checkNewPassword(password: string, context: { email: string; displayName: string }): void {
  if (isCommonPassword(password)) {
    const message = 'That password is too common; choose one that is harder to guess.'
    throw new HttpError(400, 'password_too_common', message, passwordIssue(message))
  }
  if (isContextPassword(password, context)) {
    const message = 'Choose a password that is not your e-mail address or your name.'
    throw new HttpError(400, 'password_is_name', message, passwordIssue(message))
  }
}

/**
 * Creates an account and sends a verification link. For an address that already has an account it sends that
 * address a note instead; the caller answers the same either way.
 */
export async function signUp(deps: Deps, input: SignUp): Promise<void> {
  const { models, config } = deps
  checkNewPassword(input.password, input)
  const passwordHash = await hashPassword(input.password, config.scryptCost)
  const existing = await models.User.findOne({ where: { email: input.email } })
  if (existing) {
    sendQuietly(deps, alreadyRegisteredMail(existing.email, existing.displayName, `${config.appUrl}/signin`, `${config.appUrl}/forgot`))
    return
  }
  const user = await deps.sequelize.transaction(async (transaction) => {
    const created = await models.User.create(
      { email: input.email, passwordHash, role: input.role, displayName: input.displayName, emailVerifiedAt: null, disabledAt: null },
      { transaction },
    )
    if (input.role === 'therapist') {
      await models.TherapistProfile.create(
        { userId: created.id, practice: input.practice, registration: input.registration, approvedAt: null, approvedById: null, approvalChecks: null, approvalNote: null },
        { transaction },
      )
    }
    return created
  })
  const token = await issueToken(models, user.id, 'verify')
  sendQuietly(deps, verifyMail(user.email, user.displayName, `${config.appUrl}/verify?token=${token}`))
}

export async function verifyEmail(deps: Deps, token: string): Promise<void> {
  const userId = await consumeToken(deps.models, token, 'verify')
  if (!userId) throw new HttpError(400, 'link_expired', 'This link has expired or was already used. Sign in to ask for a new one.')
  await deps.models.User.update({ emailVerifiedAt: new Date() }, { where: { id: userId, emailVerifiedAt: null } })
}

export async function resendVerification(deps: Deps, userId: string): Promise<void> {
  const user = await deps.models.User.findByPk(userId)
  if (!user || user.emailVerifiedAt) return
  const token = await issueToken(deps.models, user.id, 'verify')
  sendQuietly(deps, verifyMail(user.email, user.displayName, `${deps.config.appUrl}/verify?token=${token}`))
}

export async function requestReset(deps: Deps, email: string): Promise<void> {
  const user = await deps.models.User.findOne({ where: { email } })
  if (!user || user.disabledAt) return
  const token = await issueToken(deps.models, user.id, 'reset')
  sendQuietly(deps, resetMail(user.email, user.displayName, `${deps.config.appUrl}/reset?token=${token}`))
}

/**
 * Sets the new password, confirms the address (the link proved the mailbox) and signs out every session. A refused
 * password leaves the link unused, so the person can try another one.
 */
export async function resetPassword(deps: Deps, token: string, password: string): Promise<void> {
  const expired = () => new HttpError(400, 'link_expired', 'This link has expired or was already used. Ask for a new one.')
  const owner = await peekToken(deps.models, token, 'reset')
  const user = owner ? await deps.models.User.findByPk(owner) : null
  if (!user) throw expired()
  checkNewPassword(password, user)
  const passwordHash = await hashPassword(password, deps.config.scryptCost)
  const userId = await consumeToken(deps.models, token, 'reset')
  if (userId !== user.id) throw expired()
  await user.update({ passwordHash, emailVerifiedAt: user.emailVerifiedAt ?? new Date() })
  await deps.models.Session.destroy({ where: { userId } })
}

/** Ends every session of the account, on every device, the one asking included. */
export async function signOutEverywhere(deps: Deps, userId: string): Promise<number> {
  return deps.models.Session.destroy({ where: { userId } })
}
