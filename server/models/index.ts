import type { Sequelize } from 'sequelize';
import { AuditEntry } from './audit-entry';
import { Session } from './session';
import { User } from './user';
import { Consultation } from './consultation';
import { ConsultationEvent } from './consultation-event';

export { AuditEntry, Consultation, ConsultationEvent, Session, User };

/** Initialise every model and wire associations once. */
export function initModels(sequelize: Sequelize) {
  User.initModel(sequelize);
  Session.initModel(sequelize);
  AuditEntry.initModel(sequelize);
  Consultation.initModel(sequelize);
  ConsultationEvent.initModel(sequelize);

  Session.belongsTo(User, { foreignKey: 'userId', as: 'user' });
  AuditEntry.belongsTo(User, { foreignKey: 'actorId', as: 'actor', constraints: false });

  Consultation.belongsTo(User, { foreignKey: 'riderId', as: 'rider' });
  Consultation.belongsTo(User, { foreignKey: 'fitterId', as: 'fitter' });
  Consultation.hasMany(ConsultationEvent, { foreignKey: 'consultationId', as: 'events' });

  return { User, Session, AuditEntry, Consultation, ConsultationEvent };
}
export type Models = ReturnType<typeof initModels>;
