import type { Sequelize } from 'sequelize';
import { Account } from './account.js';
import { Attachment, AuditEvent, Component, Contact, FarmSite, Install, Planter, Toolbar, Tractor } from './fleet.js';
import { ComponentRule, Goal, PlannedReplacement, Quote, RoadmapItem, RoadmapVersion, SeasonBudget, Setting, Visit } from './planning.js';
import { ReceivedMail, ReminderCampaign, ReminderCampaignTerritory, ReminderOutbox, SeasonWindow } from './reminders.js';
import { Session } from './session.js';
import { Territory } from './territory.js';
import { User, UserTerritory } from './user.js';

export { ComponentRule, Goal, PlannedReplacement, Quote, RoadmapItem, RoadmapVersion, SeasonBudget, Setting, Visit };
export { ReceivedMail, ReminderCampaign, ReminderCampaignTerritory, ReminderOutbox, SeasonWindow };
export { Account, Attachment, AuditEvent, Component, Contact, FarmSite, Install, Planter, Session, Territory, Toolbar, Tractor, User, UserTerritory };

/** Registers every model and association on one Sequelize instance. */
export function initModels(sequelize: Sequelize) {
  for (const model of [User, UserTerritory, Territory, Account, Session, Contact, FarmSite, Tractor, Planter, Toolbar, Component, Install, Attachment, AuditEvent, Setting, ComponentRule, Goal, SeasonBudget, PlannedReplacement, RoadmapItem, RoadmapVersion, Quote, Visit]) {
    model.initModel(sequelize);
  }
  // Pre-season reminders (server/db/models/reminders.ts).
  for (const model of [SeasonWindow, ReminderCampaign, ReminderCampaignTerritory, ReminderOutbox, ReceivedMail]) model.initModel(sequelize);
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

  ComponentRule.belongsTo(Component, { foreignKey: 'componentId', as: 'component' });
  Component.hasMany(ComponentRule, { foreignKey: 'componentId', as: 'rules' });
  Account.hasMany(Goal, { foreignKey: 'accountId', as: 'goals' });
  Account.hasMany(RoadmapItem, { foreignKey: 'accountId', as: 'roadmapItems' });
  RoadmapItem.belongsTo(Account, { foreignKey: 'accountId', as: 'account' });
  RoadmapItem.belongsTo(Component, { foreignKey: 'componentId', as: 'component' });
  RoadmapItem.belongsTo(Planter, { foreignKey: 'planterId', as: 'planter' });
  RoadmapItem.belongsTo(User, { foreignKey: 'specialistId', as: 'specialist' });
  Visit.belongsTo(Account, { foreignKey: 'accountId', as: 'account' });
  Visit.belongsTo(User, { foreignKey: 'specialistId', as: 'specialist' });
}
