import type { Sequelize } from 'sequelize';
import { AuditEntry } from './audit-entry';
import { Session } from './session';
import { User } from './user';

export { AuditEntry, Session, User };

/** Initialise every model and wire associations once. */
export function initModels(sequelize: Sequelize) {
  User.initModel(sequelize);
  Session.initModel(sequelize);
  AuditEntry.initModel(sequelize);

  Session.belongsTo(User, { foreignKey: 'userId', as: 'user' });
  AuditEntry.belongsTo(User, { foreignKey: 'actorId', as: 'actor', constraints: false });

  return { User, Session, AuditEntry };
}
export type Models = ReturnType<typeof initModels>;
