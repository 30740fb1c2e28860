import { DataTypes, type ModelStatic, type Model } from 'sequelize'
import { plainSelect } from '../db/plainSelect'
import type { Models } from '../db/associations'
import type { User } from '../db/models/User'

type Row = Record<string, unknown>

type Kind = 'date' | 'boolean' | 'plain'

/**
 * A driver value as the model would hold it. SQLite hands back dates as text and booleans as 0/1, PostgreSQL as Date
 * and boolean; both become what findByPk would give (the SQLite text is read as Sequelize does, UTC when no offset).
 */
function modelValue(kind: Kind, v: unknown): unknown {
  if (v === null || v === undefined) return null
  if (kind === 'date') return v instanceof Date ? v : new Date(String(v).includes('+') ? String(v) : `${String(v)}+00:00`)
  if (kind === 'boolean') return typeof v === 'boolean' ? v : Number(v) === 1
  return v
}

// Decided once per column: Sequelize's data types are Proxies, which make instanceof slow (about 0.3 µs a check here),
// and every signed-in request converts each column of the user and their profile.
const kindOf = (type: unknown): Kind => (type instanceof DataTypes.DATE ? 'date' : type instanceof DataTypes.BOOLEAN ? 'boolean' : 'plain')

function columns(model: ModelStatic<Model>, alias: string) {
  return Object.entries(model.getAttributes()).map(([name, a]) => ({ field: a.field ?? name, name, as: `${alias}.${name}`, kind: kindOf(a.type) }))
}

function valuesOf(row: Row, cols: ReturnType<typeof columns>): Row {
  const out: Row = {}
  for (const c of cols) out[c.name] = modelValue(c.kind, row[c.as])
  return out
}

/**
 * Further reads about the signed-in user made in the session's own statement, by name: each a scalar SQL expression
 * over the user's id, `u."id"`. A value read this way costs no statement of its own, so no trip through the driver's
 * thread pool (on SQLite the dearest part of a small read), and it is as fresh as the session itself: read in the same
 * statement, in the same request.
 */
export type SessionRiders = Readonly<Record<string, string>>

const riderValues = new WeakMap<User, Record<string, unknown>>()

/** A rider's value read with the session that brought this user, or undefined (no such rider, or the user came another way). */
export function sessionRider(user: Express.User | undefined, name: string): unknown {
  return user ? riderValues.get(user as User)?.[name] : undefined
}

/** The few steps of Sequelize's own include handling, which findAll runs once for all the rows it builds. */
interface IncludeSteps {
  _conformIncludes(options: object, self: unknown): void
  _expandIncludeAll(options: object): void
  _validateIncludedElements(options: object): void
}

/**
 * Build options for a user with their therapist profile, with the include already checked and resolved, as findAll
 * (through bulkBuild) does once per query. Checking it on every build cloned the include tree, about half the cost of
 * building the user. The options are only read by build, so one object serves every request.
 */
function validatedInclude(models: Models) {
  const options = { isNewRecord: false, raw: true, include: [{ model: models.TherapistProfile, as: 'therapistProfile' }] }
  const user = models.User as unknown as IncludeSteps
  user._conformIncludes(options, models.User)
  user._expandIncludeAll(options)
  user._validateIncludedElements(options)
  return { ...options, includeValidated: true }
}

/**
 * What passport's deserializeUser needs on every signed-in request: the user with their therapist profile, as a model
 * instance equal to `User.findByPk(id, { include: therapistProfile })`, from plain JOINs with double-quoted names (the
 * same text on SQLite and PostgreSQL), without the Sequelize SQLite driver's per-table PRAGMA lookups and include
 * machinery, which cost more than the query itself on every request.
 *
 * `readSession` is the session store's read: the session row and, through its userId column, the user in the same
 * statement. The user is handed to `take` for the deserialiser of the same request, which runs synchronously right after
 * the store answers; anything not taken is dropped before the next turn of the event loop. `load` is the fallback (a
 * session row written before it carried userId, or a user id that does not match).
 */
export function sessionUsers(models: Models, riders: SessionRiders = {}) {
  const userCols = columns(models.User as unknown as ModelStatic<Model>, 'u')
  const profileCols = columns(models.TherapistProfile as unknown as ModelStatic<Model>, 'p')
  const select = [...userCols.map((c) => `u."${c.field}" AS "${c.as}"`), ...profileCols.map((c) => `p."${c.field}" AS "${c.as}"`)].join(', ')
  const userTable = `"${models.User.getTableName() as string}" AS u`
  const profileJoin = `LEFT JOIN "${models.TherapistProfile.getTableName() as string}" AS p ON p."userId" = u."id"`
  const byId = `SELECT ${select} FROM ${userTable} ${profileJoin} WHERE u."id" = ?`
  const sequelize = models.User.sequelize!
  const riderNames = Object.keys(riders)
  const riderSelect = riderNames.map((n, i) => `, (${riders[n]}) AS "r.${i}"`).join('')
  const handed = new Map<string, User>()
  const buildOptions = validatedInclude(models)

  const fromRow = (row: Row): User => {
    const profile = row['p.id'] === null || row['p.id'] === undefined ? null : valuesOf(row, profileCols)
    return models.User.build({ ...valuesOf(row, userCols), therapistProfile: profile } as never, buildOptions)
  }

  return {
    async load(id: string): Promise<User | null> {
      const [row] = await plainSelect<Row>(sequelize, byId, [id])
      return row ? fromRow(row) : null
    },
    /** The session's stored data (JSON text) or null, keeping its user (and the riders read with it) for `take`. */
    async readSession(sessionTable: string, sid: string): Promise<string | null> {
      const sql = `SELECT s."data" AS "s.data", ${select}${riderSelect} FROM "${sessionTable}" AS s LEFT JOIN ${userTable} ON u."id" = s."userId" ${profileJoin} WHERE s."sid" = ?`
      const [row] = await plainSelect<Row>(sequelize, sql, [sid])
      if (!row) return null
      if (row['u.id'] !== null && row['u.id'] !== undefined) {
        const user = fromRow(row)
        if (riderNames.length) riderValues.set(user, Object.fromEntries(riderNames.map((n, i) => [n, row[`r.${i}`]])))
        handed.set(sid, user)
        setImmediate(() => handed.delete(sid))
      }
      return row['s.data'] as string
    },
    /** The user read with this request's session, if it is the one the session names. */
    take(sid: string | undefined, id: string): User | undefined {
      if (!sid) return undefined
      const user = handed.get(sid)
      handed.delete(sid)
      return user && user.id === id ? user : undefined
    },
  }
}

export type SessionUsers = ReturnType<typeof sessionUsers>
