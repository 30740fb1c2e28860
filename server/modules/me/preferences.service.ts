import type { Preferences } from '../../../shared/schemas/user.schema'
import type { User } from '../../db/models/User'

/** An account's own choices: the name used in e-mails, and whether notices are sent at all. */
export async function updatePreferences(user: User, prefs: Preferences): Promise<User> {
  return user.update(prefs)
}
