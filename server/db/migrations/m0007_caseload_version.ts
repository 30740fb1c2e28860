import { DataTypes, type QueryInterface } from 'sequelize'

export const name = '0007-caseload-version'

// A counter on each link that the database itself raises, in the same transaction, whenever anything the caseload shows
// for that link changes: its own state or dates, a shared copy, an appointment, an earlier score, or the display name or
// disabled mark of either side. The caseload's fingerprint (count and sum of these counters over the therapist's links)
// then decides whether a cached answer is still the one the database would give (modules/prep/caseloadCache.ts).
// Triggers rather than calls in each service, so a write path added later cannot forget to invalidate.
const children = ['shared_entries', 'appointments', 'earlier_scores'] as const
const linkColumns = ['state', 'personId', 'therapistId', 'startedAt', 'endedAt'] as const
const userColumns = ['displayName', 'disabledAt'] as const
const q = (names: readonly string[]) => names.map((n) => `"${n}"`).join(', ')

const bump = (where: string) => `UPDATE links SET "caseloadVersion" = "caseloadVersion" + 1 WHERE ${where};`

function sqliteUp(): string[] {
  const out: string[] = []
  for (const t of children) {
    out.push(`CREATE TRIGGER caseload_${t}_ins AFTER INSERT ON ${t} BEGIN ${bump('id = NEW."linkId"')} END`)
    out.push(`CREATE TRIGGER caseload_${t}_upd AFTER UPDATE ON ${t} BEGIN ${bump('id IN (OLD."linkId", NEW."linkId")')} END`)
    out.push(`CREATE TRIGGER caseload_${t}_del AFTER DELETE ON ${t} BEGIN ${bump('id = OLD."linkId"')} END`)
  }
  // The column list leaves out caseloadVersion, so the trigger's own update does not fire it again.
  out.push(`CREATE TRIGGER caseload_links_upd AFTER UPDATE OF ${q(linkColumns)} ON links BEGIN ${bump('id = NEW.id')} END`)
  out.push(`CREATE TRIGGER caseload_users_upd AFTER UPDATE OF ${q(userColumns)} ON users BEGIN ${bump('"personId" = NEW.id OR "therapistId" = NEW.id')} END`)
  return out
}

function postgresUp(): string[] {
  const out = [
    `CREATE FUNCTION rungs_caseload_child() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP <> 'INSERT' THEN ${bump('id = OLD."linkId"')} END IF;
  IF TG_OP = 'INSERT' OR (TG_OP = 'UPDATE' AND NEW."linkId" IS DISTINCT FROM OLD."linkId") THEN ${bump('id = NEW."linkId"')} END IF;
  RETURN NULL;
END $$`,
    `CREATE FUNCTION rungs_caseload_link() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  NEW."caseloadVersion" := OLD."caseloadVersion" + 1;
  RETURN NEW;
END $$`,
    `CREATE FUNCTION rungs_caseload_user() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  ${bump('"personId" = NEW.id OR "therapistId" = NEW.id')}
  RETURN NULL;
END $$`,
  ]
  for (const t of children) out.push(`CREATE TRIGGER caseload_${t} AFTER INSERT OR UPDATE OR DELETE ON ${t} FOR EACH ROW EXECUTE FUNCTION rungs_caseload_child()`)
  out.push(`CREATE TRIGGER caseload_links BEFORE UPDATE OF ${q(linkColumns)} ON links FOR EACH ROW EXECUTE FUNCTION rungs_caseload_link()`)
  out.push(`CREATE TRIGGER caseload_users AFTER UPDATE OF ${q(userColumns)} ON users FOR EACH ROW EXECUTE FUNCTION rungs_caseload_user()`)
  return out
}

export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.addColumn('links', 'caseloadVersion', { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 })
  // The fingerprint reads only this index.
  await qi.addIndex('links', ['therapistId', 'caseloadVersion'], { name: 'links_caseload_version' })
  const postgres = qi.sequelize.getDialect() === 'postgres'
  for (const sql of postgres ? postgresUp() : sqliteUp()) await qi.sequelize.query(sql)
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  const postgres = qi.sequelize.getDialect() === 'postgres'
  if (postgres) {
    for (const t of [...children, 'links', 'users']) await qi.sequelize.query(`DROP TRIGGER IF EXISTS caseload_${t} ON ${t}`)
    for (const f of ['child', 'link', 'user']) await qi.sequelize.query(`DROP FUNCTION IF EXISTS rungs_caseload_${f}()`)
  } else {
    for (const t of children) for (const op of ['ins', 'upd', 'del']) await qi.sequelize.query(`DROP TRIGGER IF EXISTS caseload_${t}_${op}`)
    for (const t of ['links', 'users']) await qi.sequelize.query(`DROP TRIGGER IF EXISTS caseload_${t}_upd`)
  }
  await qi.removeIndex('links', 'links_caseload_version')
  await qi.removeColumn('links', 'caseloadVersion')
}
