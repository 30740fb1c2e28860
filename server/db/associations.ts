import type { Sequelize } from 'sequelize'
import { Appointment } from './models/Appointment'
import { AuditEvent } from './models/AuditEvent'
import { EarlierScore } from './models/EarlierScore'
import { EmailToken } from './models/EmailToken'
import { Invitation } from './models/Invitation'
import { Link } from './models/Link'
import { PrepNote } from './models/PrepNote'
import { RateLimitCounter } from './models/RateLimitCounter'
import { Session } from './models/Session'
import { SharedEntry } from './models/SharedEntry'
import { TherapistProfile } from './models/TherapistProfile'
import { User } from './models/User'

/** Initialises every model and declares every association, in one place. */
export function initModels(sequelize: Sequelize) {
  User.initModel(sequelize)
  TherapistProfile.initModel(sequelize)
  EmailToken.initModel(sequelize)
  AuditEvent.initModel(sequelize)
  Session.initModel(sequelize)
  Invitation.initModel(sequelize)
  Link.initModel(sequelize)
  Appointment.initModel(sequelize)
  SharedEntry.initModel(sequelize)
  PrepNote.initModel(sequelize)
  EarlierScore.initModel(sequelize)
  RateLimitCounter.initModel(sequelize)

  User.hasOne(TherapistProfile, { foreignKey: { name: 'userId', allowNull: false }, as: 'therapistProfile', onDelete: 'CASCADE' })
  TherapistProfile.belongsTo(User, { foreignKey: 'userId', as: 'user' })
  TherapistProfile.belongsTo(User, { foreignKey: 'approvedById', as: 'approvedBy' })
  User.hasMany(EmailToken, { foreignKey: { name: 'userId', allowNull: false }, onDelete: 'CASCADE' })
  EmailToken.belongsTo(User, { foreignKey: 'userId' })

  Invitation.belongsTo(User, { foreignKey: 'therapistId', as: 'therapist' })
  Link.belongsTo(User, { foreignKey: 'personId', as: 'person' })
  Link.belongsTo(User, { foreignKey: 'therapistId', as: 'therapist' })
  Link.hasMany(Appointment, { foreignKey: 'linkId', as: 'appointments', onDelete: 'CASCADE' })
  Appointment.belongsTo(Link, { foreignKey: 'linkId', as: 'link' })
  Link.hasMany(SharedEntry, { foreignKey: 'linkId', as: 'sharedEntries', onDelete: 'CASCADE' })
  SharedEntry.belongsTo(Link, { foreignKey: 'linkId', as: 'link' })
  Link.hasMany(PrepNote, { foreignKey: 'linkId', as: 'prepNotes', onDelete: 'CASCADE' })
  PrepNote.belongsTo(Link, { foreignKey: 'linkId', as: 'link' })
  Link.hasMany(EarlierScore, { foreignKey: 'linkId', as: 'earlierScores', onDelete: 'CASCADE' })
  EarlierScore.belongsTo(Link, { foreignKey: 'linkId', as: 'link' })
  EarlierScore.belongsTo(User, { foreignKey: 'enteredById', as: 'enteredBy' })

  return { User, TherapistProfile, EmailToken, AuditEvent, Session, Invitation, Link, Appointment, SharedEntry, PrepNote, EarlierScore, RateLimitCounter }
}
export type Models = ReturnType<typeof initModels>
