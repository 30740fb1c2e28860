import type { AppDeps } from '../../deps'
import type { Link } from '../../db/models/Link'
import type { User } from '../../db/models/User'
import type { OutgoingMail } from '../../mail/transport'
import { HttpError } from '../../middleware/HttpError'

type Deps = Pick<AppDeps, 'models' | 'now'>

/** The one clock for every time rule in links, shares and prep. */
export const clock = (deps: Pick<AppDeps, 'now'>): Date => deps.now?.() ?? new Date()

// One answer for "no such link" and "not your link", so ids cannot be probed (see DESIGN decisions in the report).
const noLink = () => new HttpError(404, 'not_found', 'There is no such link.')

/** The link if `user` is its person or its therapist; otherwise 404, whether or not the id exists. */
export async function linkOfEitherSide(deps: Deps, user: User, linkId: string): Promise<Link> {
  const link = await deps.models.Link.findByPk(linkId)
  if (!link) throw noLink()
  if (user.role === 'person' && link.personId === user.id) return link
  if (user.role === 'therapist' && link.therapistId === user.id) return link
  throw noLink()
}

/** The person's own link, in any state; 404 for anyone else's. */
export async function linkOfPerson(deps: Deps, personId: string, linkId: string): Promise<Link> {
  const link = await deps.models.Link.findOne({ where: { id: linkId, personId } })
  if (!link) throw noLink()
  return link
}

/**
 * The therapist's own link. Shared content and the working view exist only while the link is active, so by default an
 * ended link answers 404 like a stranger's; `anyState` is for the therapist's own notes, which outlive the link.
 */
export async function linkOfTherapist(deps: Deps, therapistId: string, linkId: string, opts: { anyState?: boolean } = {}): Promise<Link> {
  const link = await deps.models.Link.findOne({ where: { id: linkId, therapistId } })
  if (!link || (!opts.anyState && link.state !== 'active')) throw noLink()
  return link
}

/**
 * Sends a notice unless the person turned notices off. Mail trouble never fails the request that caused it, and the log
 * line names no one and holds no content.
 */
export async function sendNotice(deps: Pick<AppDeps, 'mailer' | 'log'>, to: User, mail: OutgoingMail): Promise<boolean> {
  if (!to.emailNotices || to.disabledAt) return false
  try {
    await deps.mailer.send(mail)
    return true
  } catch (err) {
    deps.log.warn({ err }, 'mail: a notice could not be sent')
    return false
  }
}
