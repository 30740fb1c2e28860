import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

/** The measure columns of a copy that holds no scored questionnaire. */
export const NO_MEASURE = { measureInstrument: null, measureTotal: null, measureBand: null, measureTakenAt: null } as const

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
  /**
   * A questionnaire's score as the server computed it from the answers when the copy was stored (migration 0006): all null
   * for other kinds, and for copies stored before the columns existed, which are scored from the payload instead. A form
   * still in progress has its instrument and a null total. Cleared with the payload.
   */
  declare measureInstrument: CreationOptional<string | null>
  declare measureTotal: CreationOptional<number | null>
  declare measureBand: CreationOptional<string | null>
  declare measureTakenAt: CreationOptional<Date | null>
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
        measureInstrument: { type: DataTypes.STRING(8), allowNull: true },
        measureTotal: { type: DataTypes.INTEGER, allowNull: true },
        measureBand: { type: DataTypes.STRING(24), allowNull: true },
        measureTakenAt: { type: DataTypes.DATE, allowNull: true },
        updatedAt: DataTypes.DATE,
      },
      {
        sequelize,
        tableName: 'shared_entries',
        createdAt: false,
        indexes: [{ unique: true, fields: ['linkId', 'entryId'] }],
        hooks: {
          // A score is content: whatever drops a payload (withdrawal, a link ending) drops the score with it.
          beforeUpdate(row) {
            if (row.changed('payload') && row.payload === null) Object.assign(row, NO_MEASURE)
          },
          beforeBulkUpdate(options: { attributes?: Record<string, unknown>; fields?: string[] }) {
            if (options.attributes && 'payload' in options.attributes && options.attributes.payload === null) {
              Object.assign(options.attributes, NO_MEASURE)
              if (options.fields) options.fields = [...new Set([...options.fields, ...Object.keys(NO_MEASURE)])]
            }
          },
        },
      },
    )
  }
}
