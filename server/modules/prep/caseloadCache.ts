import { createHash } from 'node:crypto'
import type { CaseloadRow } from '../../../shared/schemas/prep.schema'
import type { AppDeps } from '../../deps'
import { plainSelect } from '../../db/plainSelect'
import { clock } from '../links/linkAccess'
import { READ_WINDOW_MS } from '../shares/recordReads'
import { caseload } from './prep.service'

type Deps = Pick<AppDeps, 'models' | 'sequelize' | 'now'>

/** The caseload answer as sent: the JSON body once serialised, and its ETag. */
export interface CaseloadAnswer {
  body: Buffer
  etag: string
}

interface Cached extends CaseloadAnswer {
  fingerprint: string
  builtAt: number
  /** The answer depends on the clock too: it is rebuilt once an appointment falls due or the access-log window ends. */
  expiresAt: number
}

/** The fingerprint of the links of the therapist whose id `therapistId` (SQL) names, as one text: count, then sum. */
const fingerprintOf = (therapistId: string) =>
  `SELECT CAST(COUNT(*) AS TEXT) || ':' || CAST(COALESCE(SUM(l."caseloadVersion"), 0) AS TEXT) FROM "links" AS l WHERE l."therapistId" = ${therapistId}`

const FINGERPRINT_SQL = `SELECT (${fingerprintOf('?')}) AS "f"`

/**
 * The fingerprint as a rider of the session read (auth/loadSessionUser.ts), for therapists only: a cached caseload then
 * costs one statement per request, the session's, instead of two.
 */
export const CASELOAD_FINGERPRINT_RIDER = 'caseloadFingerprint'
export const caseloadFingerprintRider = { [CASELOAD_FINGERPRINT_RIDER]: `CASE WHEN u."role" = 'therapist' THEN (${fingerprintOf('u."id"')}) END` }

/**
 * The database's word on whether a therapist's caseload changed: the number of their links and the sum of the links'
 * caseloadVersion counters, which triggers raise in the same transaction as every write the caseload shows (migration
 * 0007). Counters only grow and links are never deleted by the app, so any committed change gives a new fingerprint, on
 * whichever instance wrote it.
 */
export async function caseloadFingerprint(deps: Deps, therapistId: string): Promise<string> {
  const [row] = await plainSelect<{ f: string }>(deps.sequelize, FINGERPRINT_SQL, [therapistId])
  return String(row?.f ?? '0:0')
}

/** When the answer built at `now` stops being true by the clock alone: the earliest coming appointment turns into the last session. */
function expiryOf(rows: CaseloadRow[], now: number): number {
  let at = now + READ_WINDOW_MS
  for (const r of rows) if (r.nextAppointment) at = Math.min(at, Date.parse(r.nextAppointment))
  return at
}

/**
 * GET /api/therapist/caseload for each therapist, kept in this process and reused while the database's fingerprint
 * (one indexed query per request) and the clock say it is still the answer. Correct with several instances on one
 * database: nothing is trusted without asking the database first, and the fingerprint is read before a rebuild, so a
 * write landing during one makes the next request rebuild again. After READ_WINDOW_MS the caseload is rebuilt, which
 * writes the access-log rows for the shared questionnaires behind the measure columns again, as an uncached read would.
 * Concurrent requests for the same therapist and fingerprint share one build.
 */
export function caseloadCache(deps: Deps, options: { maxTherapists?: number; build?: typeof caseload } = {}) {
  const max = options.maxTherapists ?? 100
  const build = options.build ?? caseload
  const entries = new Map<string, Cached>()
  const building = new Map<string, Promise<Cached>>()

  async function rebuild(therapistId: string, fingerprint: string): Promise<Cached> {
    const builtAt = clock(deps).getTime()
    const rows = await build(deps, therapistId)
    const body = Buffer.from(JSON.stringify({ caseload: rows }))
    const etag = `W/"${createHash('sha1').update(body).digest('base64url')}"`
    const cached = { body, etag, fingerprint, builtAt, expiresAt: expiryOf(rows, builtAt) }
    entries.delete(therapistId)
    entries.set(therapistId, cached)
    // The least recently used therapist goes first.
    if (entries.size > max) entries.delete(entries.keys().next().value!)
    return cached
  }

  return {
    /** `readAhead`: the fingerprint as the session read of this same request brought it (caseloadFingerprintRider). */
    async get(therapistId: string, readAhead?: string): Promise<CaseloadAnswer> {
      const fingerprint = readAhead ?? (await caseloadFingerprint(deps, therapistId))
      const now = clock(deps).getTime()
      const hit = entries.get(therapistId)
      if (hit && hit.fingerprint === fingerprint && hit.builtAt <= now && now < hit.expiresAt) {
        entries.delete(therapistId)
        entries.set(therapistId, hit)
        return hit
      }
      const key = `${therapistId}|${fingerprint}`
      let pending = building.get(key)
      if (!pending) {
        pending = rebuild(therapistId, fingerprint).finally(() => building.delete(key))
        building.set(key, pending)
      }
      return pending
    },
    /** How many therapists' answers are held (for tests). */
    get size() {
      return entries.size
    },
  }
}
