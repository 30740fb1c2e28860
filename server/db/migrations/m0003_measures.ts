import { DataTypes, type QueryInterface } from 'sequelize'

export const name = '0003-measures'

export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.createTable('earlier_scores', {
    id: { type: DataTypes.UUID, primaryKey: true },
    linkId: { type: DataTypes.UUID, allowNull: false, references: { model: 'links', key: 'id' }, onDelete: 'CASCADE' },
    instrument: { type: DataTypes.STRING(8), allowNull: false },
    takenOn: { type: DataTypes.DATEONLY, allowNull: false },
    total: { type: DataTypes.INTEGER, allowNull: false },
    item9: { type: DataTypes.INTEGER, allowNull: true },
    enteredById: { type: DataTypes.UUID, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    createdAt: { type: DataTypes.DATE, allowNull: false },
    updatedAt: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('earlier_scores', ['linkId', 'takenOn'])
  // The caseload's measure column reads shared questionnaires by link and kind.
  await qi.addIndex('shared_entries', ['linkId', 'kind'])
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.removeIndex('shared_entries', ['linkId', 'kind'])
  await qi.dropTable('earlier_scores')
}
