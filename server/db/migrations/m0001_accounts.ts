import { DataTypes, type QueryInterface } from 'sequelize'

export const name = '0001-accounts'

export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.createTable('users', {
    id: { type: DataTypes.UUID, primaryKey: true },
    email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
    passwordHash: { type: DataTypes.STRING, allowNull: false },
    role: { type: DataTypes.STRING(16), allowNull: false },
    displayName: { type: DataTypes.STRING(80), allowNull: false },
    emailVerifiedAt: { type: DataTypes.DATE, allowNull: true },
    emailNotices: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    disabledAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: { type: DataTypes.DATE, allowNull: false },
    updatedAt: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.createTable('therapist_profiles', {
    id: { type: DataTypes.UUID, primaryKey: true },
    userId: { type: DataTypes.UUID, allowNull: false, unique: true, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    practice: { type: DataTypes.STRING(120), allowNull: false },
    registration: { type: DataTypes.STRING(200), allowNull: false },
    approvedAt: { type: DataTypes.DATE, allowNull: true },
    approvedById: { type: DataTypes.UUID, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    approvalChecks: { type: DataTypes.TEXT, allowNull: true },
    approvalNote: { type: DataTypes.TEXT, allowNull: true },
    createdAt: { type: DataTypes.DATE, allowNull: false },
    updatedAt: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.createTable('email_tokens', {
    id: { type: DataTypes.UUID, primaryKey: true },
    userId: { type: DataTypes.UUID, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    purpose: { type: DataTypes.STRING(16), allowNull: false },
    tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    usedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('email_tokens', ['userId', 'purpose'])
  await qi.createTable('audit_events', {
    id: { type: DataTypes.UUID, primaryKey: true },
    actorId: { type: DataTypes.UUID, allowNull: true },
    action: { type: DataTypes.STRING(64), allowNull: false },
    subjectUserId: { type: DataTypes.UUID, allowNull: true },
    subjectId: { type: DataTypes.STRING(64), allowNull: true },
    at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('audit_events', ['subjectUserId', 'at'])
  await qi.createTable('sessions', {
    sid: { type: DataTypes.STRING(64), primaryKey: true },
    expires: { type: DataTypes.DATE, allowNull: true },
    data: { type: DataTypes.TEXT, allowNull: true },
    userId: { type: DataTypes.UUID, allowNull: true },
    createdAt: { type: DataTypes.DATE, allowNull: false },
    updatedAt: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('sessions', ['userId'])
  await qi.addIndex('sessions', ['expires'])
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  for (const t of ['sessions', 'audit_events', 'email_tokens', 'therapist_profiles', 'users']) await qi.dropTable(t)
}
