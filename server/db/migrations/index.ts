import type { Sequelize } from 'sequelize'
import { SequelizeStorage, Umzug } from 'umzug'
import * as m0001 from './m0001_accounts'
import * as m0002 from './m0002_links'
import * as m0003 from './m0003_measures'
import * as m0005 from './m0005_rate_limits'
import * as m0006 from './m0006_audit_index'
import * as m0007 from './m0007_caseload_version'

// Listed by hand, in order: a new migration is a new file added here, never an edit to an old one. (0004 was never used.)
const migrations = [m0001, m0002, m0003, m0005, m0006, m0007]

export function migrator(sequelize: Sequelize) {
  return new Umzug({
    migrations: migrations.map((m) => ({ name: m.name, up: m.up, down: m.down })),
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  })
}

/** Applies every pending migration; returns the names applied. */
export async function migrate(sequelize: Sequelize): Promise<string[]> {
  const done = await migrator(sequelize).up()
  return done.map((m) => m.name)
}
