import { createHash, randomBytes } from 'node:crypto'
import { Op } from 'sequelize'
import type { Models } from '../../db/associations'
import type { TokenPurpose } from '../../db/models/EmailToken'

const LIFETIME_MS: Record<TokenPurpose, number> = { verify: 24 * 60 * 60 * 1000, reset: 60 * 60 * 1000 }

const sha256 = (token: string) => createHash('sha256').update(token).digest('hex')

/** Issues a single-use token; earlier unused tokens of the same purpose stop working. */
export async function issueToken(models: Models, userId: string, purpose: TokenPurpose, now = new Date()): Promise<string> {
  const token = randomBytes(32).toString('base64url')
  await models.EmailToken.update({ usedAt: now }, { where: { userId, purpose, usedAt: null } })
  await models.EmailToken.create({ userId, purpose, tokenHash: sha256(token), expiresAt: new Date(now.getTime() + LIFETIME_MS[purpose]), usedAt: null })
  return token
}

/** Marks the token used and returns its user id, or undefined when it is unknown, used or expired. */
export async function consumeToken(models: Models, token: string, purpose: TokenPurpose, now = new Date()): Promise<string | undefined> {
  const row = await models.EmailToken.findOne({ where: { tokenHash: sha256(token), purpose, usedAt: null, expiresAt: { [Op.gt]: now } } })
  if (!row) return undefined
  // The conditional update makes a race between two uses of one link succeed only once.
  const [changed] = await models.EmailToken.update({ usedAt: now }, { where: { id: row.id, usedAt: null } })
  return changed === 1 ? row.userId : undefined
}

/** The user id a token would sign for, without using it up: a reset can refuse a weak password and keep the link working. */
export async function peekToken(models: Models, token: string, purpose: TokenPurpose, now = new Date()): Promise<string | undefined> {
  const row = await models.EmailToken.findOne({ where: { tokenHash: sha256(token), purpose, usedAt: null, expiresAt: { [Op.gt]: now } } })
  return row?.userId
}
