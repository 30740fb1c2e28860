import type { PersonLinkRow } from '@shared/schemas/link.schema'
import { dbNow, openDb } from './openDb'
import type { StoredLink } from './RungsDB'

/** Replaces the device's copy of the person's links with what the server just said. */
export async function saveLinks(links: PersonLinkRow[], now = Date.now()): Promise<void> {
  const db = dbNow() ?? (await openDb())
  await db.transaction('rw', db.links, async () => {
    await db.links.clear()
    await db.links.bulkPut(links.map((l) => ({ ...l, syncedAt: now })))
  })
}

export async function saveLink(link: PersonLinkRow, now = Date.now()): Promise<void> {
  const db = dbNow() ?? (await openDb())
  await db.links.put({ ...link, syncedAt: now })
}

export async function listStoredLinks(): Promise<StoredLink[]> {
  const db = dbNow() ?? (await openDb())
  return db.links.toArray()
}

export async function hasActiveLink(): Promise<boolean> {
  const db = dbNow() ?? (await openDb())
  return (await db.links.toArray()).some((l) => l.state === 'active')
}
