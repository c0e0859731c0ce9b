import type { Sequelize } from 'sequelize';
import { Invitation, initInvitation } from './Invitation';
import { Organisation, initOrganisation } from './Organisation';
import { User, initUser } from './User';

export { Invitation, Organisation, User };

const initialised = new WeakSet<Sequelize>();

/**
 * Binds every model to the Sequelize instance and declares the associations. Idempotent per
 * instance, so createApp(), commands and tests may all call it. Add new models here (init first,
 * then associations).
 */
export function initModels(sequelize: Sequelize): void {
  if (initialised.has(sequelize)) return;
  initialised.add(sequelize);

  initOrganisation(sequelize);
  initUser(sequelize);
  initInvitation(sequelize);

  Organisation.hasMany(User, { foreignKey: 'organisationId', as: 'users' });
  User.belongsTo(Organisation, { foreignKey: 'organisationId', as: 'organisation' });
  Invitation.belongsTo(User, { foreignKey: 'invitedById', as: 'invitedBy' });
}
