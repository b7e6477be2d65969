import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrate.js';

const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
};
const innodb = { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci', engine: 'InnoDB' };

export async function up({ queryInterface: q }: MigrationContext) {
  await q.createTable(
    'territories',
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      name: { type: DataTypes.STRING(120), allowNull: false, unique: true },
      region: { type: DataTypes.STRING(120), allowNull: false },
      ...timestamps,
    },
    innodb,
  );
  await q.createTable(
    'accounts',
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      name: { type: DataTypes.STRING(160), allowNull: false },
      status: { type: DataTypes.ENUM('active', 'prospect', 'inactive'), allowNull: false, defaultValue: 'active' },
      territory_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'territories', key: 'id' } },
      specialist_id: { type: DataTypes.INTEGER, allowNull: true },
      address: { type: DataTypes.STRING(255), allowNull: true },
      town: { type: DataTypes.STRING(120), allowNull: true },
      state: { type: DataTypes.STRING(2), allowNull: true },
      lat: { type: DataTypes.DECIMAL(9, 6), allowNull: true },
      lng: { type: DataTypes.DECIMAL(9, 6), allowNull: true },
      acres_by_crop: { type: DataTypes.JSON, allowNull: false },
      notes: { type: DataTypes.TEXT, allowNull: true },
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      ...timestamps,
    },
    innodb,
  );
  await q.addIndex('accounts', ['territory_id', 'name']);
  await q.addIndex('accounts', ['name']);
  await q.createTable(
    'users',
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      email: { type: DataTypes.STRING(191), allowNull: false, unique: true },
      name: { type: DataTypes.STRING(120), allowNull: false },
      role: { type: DataTypes.ENUM('admin', 'manager', 'specialist', 'grower'), allowNull: false },
      password_hash: { type: DataTypes.STRING(100), allowNull: false },
      disabled: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      account_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'accounts', key: 'id' }, onDelete: 'SET NULL' },
      last_sign_in_at: { type: DataTypes.DATE, allowNull: true },
      ...timestamps,
    },
    innodb,
  );
  await q.addConstraint('accounts', {
    type: 'foreign key',
    fields: ['specialist_id'],
    name: 'accounts_specialist_fk',
    references: { table: 'users', field: 'id' },
    onDelete: 'SET NULL',
    onUpdate: 'CASCADE',
  });
  await q.createTable(
    'user_territories',
    {
      user_id: { type: DataTypes.INTEGER, primaryKey: true, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
      territory_id: { type: DataTypes.INTEGER, primaryKey: true, references: { model: 'territories', key: 'id' }, onDelete: 'CASCADE' },
    },
    innodb,
  );
  await q.createTable(
    'sessions',
    {
      sid: { type: DataTypes.STRING(64), primaryKey: true },
      expires: { type: DataTypes.DATE, allowNull: true },
      data: { type: DataTypes.TEXT, allowNull: true },
      user_id: { type: DataTypes.INTEGER, allowNull: true },
      ...timestamps,
    },
    innodb,
  );
  await q.addIndex('sessions', ['user_id']);
  await q.addIndex('sessions', ['expires']);
  // Failed sign-ins counted per account and per IP in the database, so that several app
  // instances slow an attacker together.
  await q.createTable(
    'login_failures',
    {
      key: { type: DataTypes.STRING(191), primaryKey: true },
      count: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      window_started_at: { type: DataTypes.DATE, allowNull: false },
    },
    innodb,
  );
  await q.createTable(
    'security_events',
    {
      id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
      at: { type: DataTypes.DATE, allowNull: false },
      event: { type: DataTypes.STRING(40), allowNull: false },
      user_id: { type: DataTypes.INTEGER, allowNull: true },
      email: { type: DataTypes.STRING(191), allowNull: true },
      ip: { type: DataTypes.STRING(64), allowNull: true },
      detail: { type: DataTypes.STRING(255), allowNull: true },
    },
    innodb,
  );
  await q.addIndex('security_events', ['at']);
}

export async function down({ queryInterface: q }: MigrationContext) {
  for (const t of ['security_events', 'login_failures', 'sessions', 'user_territories']) await q.dropTable(t);
  await q.removeConstraint('accounts', 'accounts_specialist_fk');
  for (const t of ['users', 'accounts', 'territories']) await q.dropTable(t);
}
