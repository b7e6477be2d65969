import type { Sequelize } from 'sequelize';
import { Account } from './account.js';
import { Attachment, AuditEvent, Component, Contact, FarmSite, Install, Planter, Toolbar, Tractor } from './fleet.js';
import { Session } from './session.js';
import { Territory } from './territory.js';
import { User, UserTerritory } from './user.js';

export { Account, Attachment, AuditEvent, Component, Contact, FarmSite, Install, Planter, Session, Territory, Toolbar, Tractor, User, UserTerritory };

/** Registers every model and association on one Sequelize instance. */
export function initModels(sequelize: Sequelize) {
  for (const model of [User, UserTerritory, Territory, Account, Session, Contact, FarmSite, Tractor, Planter, Toolbar, Component, Install, Attachment, AuditEvent]) {
    model.initModel(sequelize);
  }
  User.belongsToMany(Territory, { through: UserTerritory, foreignKey: 'userId', otherKey: 'territoryId', as: 'territories' });
  Territory.belongsToMany(User, { through: UserTerritory, foreignKey: 'territoryId', otherKey: 'userId', as: 'users' });
  Account.belongsTo(Territory, { foreignKey: 'territoryId', as: 'territory' });
  Account.belongsTo(User, { foreignKey: 'specialistId', as: 'specialist' });
  Territory.hasMany(Account, { foreignKey: 'territoryId', as: 'accounts' });
  User.belongsTo(Account, { foreignKey: 'accountId', as: 'account' });

  Account.hasMany(Contact, { foreignKey: 'accountId', as: 'contacts' });
  Account.hasMany(FarmSite, { foreignKey: 'accountId', as: 'farmSites' });
  Account.hasMany(Tractor, { foreignKey: 'accountId', as: 'tractors' });
  Account.hasMany(Planter, { foreignKey: 'accountId', as: 'planters' });
  Planter.belongsTo(Account, { foreignKey: 'accountId', as: 'account' });
  Planter.belongsTo(Tractor, { foreignKey: 'tractorId', as: 'tractor' });
  Planter.hasMany(Toolbar, { foreignKey: 'planterId', as: 'toolbars' });
  Planter.hasMany(Install, { foreignKey: 'planterId', as: 'installs' });
  Install.belongsTo(Component, { foreignKey: 'componentId', as: 'component' });
  Install.belongsTo(Planter, { foreignKey: 'planterId', as: 'planter' });
  Toolbar.belongsTo(Planter, { foreignKey: 'planterId', as: 'planter' });
}
