import type { Sequelize } from 'sequelize';
import { Account } from './account.js';
import { Session } from './session.js';
import { Territory } from './territory.js';
import { User, UserTerritory } from './user.js';

export { Account, Session, Territory, User, UserTerritory };

/** Registers every model and association on one Sequelize instance. */
export function initModels(sequelize: Sequelize) {
  for (const model of [User, UserTerritory, Territory, Account, Session]) model.initModel(sequelize);
  User.belongsToMany(Territory, { through: UserTerritory, foreignKey: 'userId', otherKey: 'territoryId', as: 'territories' });
  Territory.belongsToMany(User, { through: UserTerritory, foreignKey: 'territoryId', otherKey: 'userId', as: 'users' });
  Account.belongsTo(Territory, { foreignKey: 'territoryId', as: 'territory' });
  Account.belongsTo(User, { foreignKey: 'specialistId', as: 'specialist' });
  Territory.hasMany(Account, { foreignKey: 'territoryId', as: 'accounts' });
  User.belongsTo(Account, { foreignKey: 'accountId', as: 'account' });
}
