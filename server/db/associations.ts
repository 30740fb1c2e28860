import { Model, type Sequelize } from 'sequelize'
import { Appointment as AppointmentBase } from './models/Appointment'
import { AuditEvent as AuditEventBase } from './models/AuditEvent'
import { EarlierScore as EarlierScoreBase } from './models/EarlierScore'
import { EmailToken as EmailTokenBase } from './models/EmailToken'
import { Invitation as InvitationBase } from './models/Invitation'
import { Link as LinkBase } from './models/Link'
import { PrepNote as PrepNoteBase } from './models/PrepNote'
import { RateLimitCounter as RateLimitCounterBase } from './models/RateLimitCounter'
import { Session as SessionBase } from './models/Session'
import { SharedEntry as SharedEntryBase } from './models/SharedEntry'
import { TherapistProfile as TherapistProfileBase } from './models/TherapistProfile'
import { User as UserBase } from './models/User'

/**
 * A subclass of the model for one Sequelize instance. Model classes are bound to the database they are initialised on,
 * so two databases in one process (two app instances in a test) would otherwise take each other's models.
 */
function bound<M extends { name: string }>(base: M): M {
  const Base = base as unknown as typeof Model
  const named = { [base.name]: class extends Base {} }
  return named[base.name] as unknown as M
}

/** Initialises every model (fresh classes for this database) and declares every association, in one place. */
export function initModels(sequelize: Sequelize) {
  const Appointment = bound(AppointmentBase)
  const AuditEvent = bound(AuditEventBase)
  const EarlierScore = bound(EarlierScoreBase)
  const EmailToken = bound(EmailTokenBase)
  const Invitation = bound(InvitationBase)
  const Link = bound(LinkBase)
  const PrepNote = bound(PrepNoteBase)
  const RateLimitCounter = bound(RateLimitCounterBase)
  const Session = bound(SessionBase)
  const SharedEntry = bound(SharedEntryBase)
  const TherapistProfile = bound(TherapistProfileBase)
  const User = bound(UserBase)

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
