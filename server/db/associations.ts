import type { Sequelize } from 'sequelize'
import { AuditEvent } from './models/AuditEvent'
import { EmailToken } from './models/EmailToken'
import { Session } from './models/Session'
import { TherapistProfile } from './models/TherapistProfile'
import { User } from './models/User'

/** Initialises every model and declares every association, in one place. */
export function initModels(sequelize: Sequelize) {
  User.initModel(sequelize)
  TherapistProfile.initModel(sequelize)
  EmailToken.initModel(sequelize)
  AuditEvent.initModel(sequelize)
  Session.initModel(sequelize)

  User.hasOne(TherapistProfile, { foreignKey: { name: 'userId', allowNull: false }, as: 'therapistProfile', onDelete: 'CASCADE' })
  TherapistProfile.belongsTo(User, { foreignKey: 'userId', as: 'user' })
  TherapistProfile.belongsTo(User, { foreignKey: 'approvedById', as: 'approvedBy' })
  User.hasMany(EmailToken, { foreignKey: { name: 'userId', allowNull: false }, onDelete: 'CASCADE' })
  EmailToken.belongsTo(User, { foreignKey: 'userId' })

  return { User, TherapistProfile, EmailToken, AuditEvent, Session }
}
export type Models = ReturnType<typeof initModels>
