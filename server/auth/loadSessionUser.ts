import { DataTypes, type ModelStatic, type Model } from 'sequelize'
import { plainSelect } from '../db/plainSelect'
import type { Models } from '../db/associations'
import type { User } from '../db/models/User'

type Row = Record<string, unknown>

/**
 * A driver value as the model would hold it. SQLite hands back dates as text and booleans as 0/1, PostgreSQL as Date
 * and boolean; both become what findByPk would give (the SQLite text is read as Sequelize does, UTC when no offset).
 */
function modelValue(type: unknown, v: unknown): unknown {
  if (v === null || v === undefined) return null
  if (type instanceof DataTypes.DATE) return v instanceof Date ? v : new Date(String(v).includes('+') ? String(v) : `${String(v)}+00:00`)
  if (type instanceof DataTypes.BOOLEAN) return typeof v === 'boolean' ? v : Number(v) === 1
  return v
}

function columns(model: ModelStatic<Model>, alias: string) {
  return Object.entries(model.getAttributes()).map(([name, a]) => ({ field: a.field ?? name, name, as: `${alias}.${name}`, type: a.type }))
}

function valuesOf(row: Row, cols: ReturnType<typeof columns>): Row {
  const out: Row = {}
  for (const c of cols) out[c.name] = modelValue(c.type, row[c.as])
  return out
}

/**
 * What passport's deserializeUser needs on every signed-in request: the user with their therapist profile, as a model
 * instance equal to `User.findByPk(id, { include: therapistProfile })`. One plain JOIN with double-quoted names (the same
 * text on SQLite and PostgreSQL), without the Sequelize SQLite driver's per-table PRAGMA lookups and include
 * machinery, which cost more than the query itself on every request.
 */
export function sessionUserLoader(models: Models) {
  const userCols = columns(models.User as unknown as ModelStatic<Model>, 'u')
  const profileCols = columns(models.TherapistProfile as unknown as ModelStatic<Model>, 'p')
  const select = [...userCols.map((c) => `u."${c.field}" AS "${c.as}"`), ...profileCols.map((c) => `p."${c.field}" AS "${c.as}"`)].join(', ')
  const sql = `SELECT ${select} FROM "${models.User.getTableName() as string}" AS u LEFT JOIN "${models.TherapistProfile.getTableName() as string}" AS p ON p."userId" = u."id" WHERE u."id" = ?`
  const include = [{ model: models.TherapistProfile, as: 'therapistProfile' }]
  return async (id: string): Promise<User | null> => {
    const [row] = await plainSelect<Row>(models.User.sequelize!, sql, [id])
    if (!row) return null
    const profile = row['p.id'] === null || row['p.id'] === undefined ? null : valuesOf(row, profileCols)
    return models.User.build({ ...valuesOf(row, userCols), therapistProfile: profile } as never, { isNewRecord: false, raw: true, include })
  }
}
