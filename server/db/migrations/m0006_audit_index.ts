import { DataTypes, type QueryInterface } from 'sequelize'

export const name = '0006-audit-index'

const measureColumns = {
  measureInstrument: { type: DataTypes.STRING(8), allowNull: true },
  measureTotal: { type: DataTypes.INTEGER, allowNull: true },
  measureBand: { type: DataTypes.STRING(24), allowNull: true },
  measureTakenAt: { type: DataTypes.DATE, allowNull: true },
} as const

export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  // recordReads asks "which of these copies did this actor open in the last minutes?" before it writes access-log rows.
  await qi.addIndex('audit_events', ['actorId', 'action', 'subjectId', 'at'], { name: 'audit_events_actor_reads' })
  // The score of a shared questionnaire, computed by the server when it is stored, so the caseload need not parse payloads.
  // Rows stored before this migration keep nulls and are scored from the payload on read.
  for (const [column, spec] of Object.entries(measureColumns)) await qi.addColumn('shared_entries', column, spec)
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  for (const column of Object.keys(measureColumns).reverse()) await qi.removeColumn('shared_entries', column)
  await qi.removeIndex('audit_events', 'audit_events_actor_reads')
}
