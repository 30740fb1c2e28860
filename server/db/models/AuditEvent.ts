import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

/** Who did what to whom, and when. Never holds clinical content. */
export class AuditEvent extends Model<InferAttributes<AuditEvent>, InferCreationAttributes<AuditEvent>> {
  declare id: CreationOptional<string>
  declare actorId: string | null
  declare action: string
  declare subjectUserId: string | null
  declare subjectId: string | null
  declare at: CreationOptional<Date>

  static initModel(sequelize: Sequelize): void {
    this.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        actorId: { type: DataTypes.UUID, allowNull: true },
        action: { type: DataTypes.STRING(64), allowNull: false },
        subjectUserId: { type: DataTypes.UUID, allowNull: true },
        subjectId: { type: DataTypes.STRING(64), allowNull: true },
        at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { sequelize, tableName: 'audit_events', timestamps: false },
    )
  }
}
