import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

/**
 * The copy of one entry shared over one link, keyed by (linkId, entryId). A withdrawn copy stays as a tombstone: no
 * payload, withdrawnAt set, and its version, so a late PUT of an older version cannot bring the content back.
 */
export class SharedEntry extends Model<InferAttributes<SharedEntry>, InferCreationAttributes<SharedEntry>> {
  declare id: CreationOptional<string>
  declare linkId: string
  declare entryId: string
  declare kind: string | null
  declare version: number
  /** The entry as JSON text; null once withdrawn. */
  declare payload: string | null
  declare withdrawnAt: Date | null
  declare readAt: Date | null
  declare toDiscuss: CreationOptional<boolean>
  declare riskFlag: CreationOptional<boolean>
  declare sharedAt: Date | null
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize): void {
    this.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        linkId: { type: DataTypes.UUID, allowNull: false },
        entryId: { type: DataTypes.UUID, allowNull: false },
        kind: { type: DataTypes.STRING(16), allowNull: true },
        version: { type: DataTypes.INTEGER, allowNull: false },
        payload: { type: DataTypes.TEXT, allowNull: true },
        withdrawnAt: { type: DataTypes.DATE, allowNull: true },
        readAt: { type: DataTypes.DATE, allowNull: true },
        toDiscuss: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        riskFlag: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        sharedAt: { type: DataTypes.DATE, allowNull: true },
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'shared_entries', createdAt: false, indexes: [{ unique: true, fields: ['linkId', 'entryId'] }] },
    )
  }
}
