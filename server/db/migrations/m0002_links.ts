import { DataTypes, type QueryInterface } from 'sequelize'

export const name = '0002-links'

export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.createTable('invitations', {
    id: { type: DataTypes.UUID, primaryKey: true },
    therapistId: { type: DataTypes.UUID, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    codeHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    email: { type: DataTypes.STRING(254), allowNull: true },
    usedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('invitations', ['therapistId', 'usedAt'])
  await qi.createTable('links', {
    id: { type: DataTypes.UUID, primaryKey: true },
    personId: { type: DataTypes.UUID, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    therapistId: { type: DataTypes.UUID, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    state: { type: DataTypes.STRING(16), allowNull: false },
    startedAt: { type: DataTypes.DATE, allowNull: true },
    endedAt: { type: DataTypes.DATE, allowNull: true },
    endedBy: { type: DataTypes.UUID, allowNull: true },
    createdAt: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('links', ['personId', 'state'])
  await qi.addIndex('links', ['therapistId', 'state'])
  // At most one active link per pair, enforced by the database as well as by the service. The column names are quoted:
  // PostgreSQL folds unquoted names to lower case. (SQLite reads both spellings alike, so databases made before keep
  // the same index.)
  await qi.sequelize.query(`CREATE UNIQUE INDEX links_one_active_per_pair ON links ("personId", "therapistId") WHERE state = 'active'`)
  await qi.createTable('appointments', {
    id: { type: DataTypes.UUID, primaryKey: true },
    linkId: { type: DataTypes.UUID, allowNull: false, references: { model: 'links', key: 'id' }, onDelete: 'CASCADE' },
    at: { type: DataTypes.DATE, allowNull: false },
    createdAt: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('appointments', ['linkId', 'at'])
  await qi.createTable('shared_entries', {
    id: { type: DataTypes.UUID, primaryKey: true },
    linkId: { type: DataTypes.UUID, allowNull: false, references: { model: 'links', key: 'id' }, onDelete: 'CASCADE' },
    entryId: { type: DataTypes.UUID, allowNull: false },
    kind: { type: DataTypes.STRING(16), allowNull: true },
    version: { type: DataTypes.INTEGER, allowNull: false },
    payload: { type: DataTypes.TEXT, allowNull: true },
    withdrawnAt: { type: DataTypes.DATE, allowNull: true },
    readAt: { type: DataTypes.DATE, allowNull: true },
    toDiscuss: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    riskFlag: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    sharedAt: { type: DataTypes.DATE, allowNull: true },
    updatedAt: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('shared_entries', ['linkId', 'entryId'], { unique: true })
  await qi.createTable('prep_notes', {
    id: { type: DataTypes.UUID, primaryKey: true },
    linkId: { type: DataTypes.UUID, allowNull: false, references: { model: 'links', key: 'id' }, onDelete: 'CASCADE' },
    therapistId: { type: DataTypes.UUID, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    text: { type: DataTypes.TEXT, allowNull: false },
    createdAt: { type: DataTypes.DATE, allowNull: false },
    updatedAt: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('prep_notes', ['linkId', 'therapistId'])
  await qi.addIndex('audit_events', ['action', 'subjectId'])
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.removeIndex('audit_events', ['action', 'subjectId'])
  for (const t of ['prep_notes', 'shared_entries', 'appointments', 'links', 'invitations']) await qi.dropTable(t)
}
