import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrate.js';

const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
};
const innodb = { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci', engine: 'InnoDB' };
const accountFk = { type: DataTypes.INTEGER, allowNull: false, references: { model: 'accounts', key: 'id' }, onDelete: 'CASCADE' };

export async function up({ queryInterface: q }: MigrationContext) {
  await q.createTable(
    'contacts',
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      account_id: accountFk,
      name: { type: DataTypes.STRING(120), allowNull: false },
      role_on_farm: { type: DataTypes.STRING(80), allowNull: true },
      email: { type: DataTypes.STRING(191), allowNull: true },
      phone: { type: DataTypes.STRING(40), allowNull: true },
      reminder_opt_in: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
      unsubscribed_at: { type: DataTypes.DATE, allowNull: true },
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      ...timestamps,
    },
    innodb,
  );
  await q.addIndex('contacts', ['account_id']);
  await q.createTable(
    'farm_sites',
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      account_id: accountFk,
      name: { type: DataTypes.STRING(120), allowNull: false },
      lat: { type: DataTypes.DECIMAL(9, 6), allowNull: false },
      lng: { type: DataTypes.DECIMAL(9, 6), allowNull: false },
      notes: { type: DataTypes.TEXT, allowNull: true },
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      ...timestamps,
    },
    innodb,
  );
  await q.addIndex('farm_sites', ['account_id']);
  await q.createTable(
    'tractors',
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      account_id: accountFk,
      name: { type: DataTypes.STRING(120), allowNull: false },
      model_year: { type: DataTypes.SMALLINT, allowNull: true },
      hydraulic_flow_gpm: { type: DataTypes.DECIMAL(6, 1), allowNull: false },
      hydraulic_pressure_psi: { type: DataTypes.INTEGER, allowNull: false },
      remote_valves: { type: DataTypes.TINYINT, allowNull: false },
      pto_hp: { type: DataTypes.DECIMAL(6, 1), allowNull: true },
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      ...timestamps,
    },
    innodb,
  );
  await q.addIndex('tractors', ['account_id']);
  await q.createTable(
    'planters',
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      account_id: accountFk,
      tractor_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'tractors', key: 'id' }, onDelete: 'SET NULL' },
      farm_site_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'farm_sites', key: 'id' }, onDelete: 'SET NULL' },
      name: { type: DataTypes.STRING(120), allowNull: false },
      maker: { type: DataTypes.STRING(80), allowNull: true },
      model_year: { type: DataTypes.SMALLINT, allowNull: true },
      rows: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false },
      row_spacing_in: { type: DataTypes.DECIMAL(5, 2), allowNull: false },
      frame_type: { type: DataTypes.STRING(30), allowNull: false },
      fold_type: { type: DataTypes.STRING(30), allowNull: false },
      seed_supply_type: { type: DataTypes.STRING(30), allowNull: false },
      seed_capacity_units: { type: DataTypes.DECIMAL(7, 1), allowNull: true },
      liquid_tank_count: { type: DataTypes.TINYINT, allowNull: false, defaultValue: 0 },
      liquid_tank_gallons: { type: DataTypes.DECIMAL(7, 1), allowNull: false, defaultValue: 0 },
      dry_capacity_lb: { type: DataTypes.DECIMAL(8, 1), allowNull: false, defaultValue: 0 },
      markers: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      acres_per_year: { type: DataTypes.INTEGER, allowNull: true },
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      ...timestamps,
    },
    innodb,
  );
  await q.addIndex('planters', ['account_id']);
  await q.addIndex('planters', ['name']);
  await q.createTable(
    'toolbars',
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      planter_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'planters', key: 'id' }, onDelete: 'CASCADE' },
      position: { type: DataTypes.TINYINT, allowNull: false },
      name: { type: DataTypes.STRING(80), allowNull: false },
      size_ft: { type: DataTypes.DECIMAL(5, 1), allowNull: false },
      first_row: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false },
      last_row: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false },
      ...timestamps,
    },
    innodb,
  );
  await q.addIndex('toolbars', ['planter_id', 'position']);
  await q.createTable(
    'components',
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      category: { type: DataTypes.STRING(40), allowNull: false },
      name: { type: DataTypes.STRING(160), allowNull: false },
      maker: { type: DataTypes.STRING(80), allowNull: true },
      part_number: { type: DataTypes.STRING(40), allowNull: false, unique: true },
      price_usd: { type: DataTypes.DECIMAL(10, 2), allowNull: false },
      labour_hours: { type: DataTypes.DECIMAL(6, 2), allowNull: false },
      expected_life_years: { type: DataTypes.DECIMAL(4, 1), allowNull: false },
      unit: { type: DataTypes.STRING(10), allowNull: false },
      hydraulic_gpm: { type: DataTypes.DECIMAL(6, 2), allowNull: true },
      rated_max_speed_mph: { type: DataTypes.DECIMAL(4, 1), allowNull: true },
      max_seeds_per_second: { type: DataTypes.DECIMAL(6, 1), allowNull: true },
      crops: { type: DataTypes.JSON, allowNull: false },
      moves_to_new_toolbar: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
      active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      ...timestamps,
    },
    innodb,
  );
  await q.addIndex('components', ['category', 'name']);
  await q.createTable(
    'installs',
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      planter_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'planters', key: 'id' }, onDelete: 'CASCADE' },
      component_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'components', key: 'id' } },
      scope: { type: DataTypes.STRING(10), allowNull: false },
      toolbar_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'toolbars', key: 'id' }, onDelete: 'SET NULL' },
      row_from: { type: DataTypes.TINYINT.UNSIGNED, allowNull: true },
      row_to: { type: DataTypes.TINYINT.UNSIGNED, allowNull: true },
      quantity: { type: DataTypes.SMALLINT, allowNull: false },
      install_date: { type: DataTypes.DATEONLY, allowNull: true },
      price_paid_usd: { type: DataTypes.DECIMAL(10, 2), allowNull: true },
      serial_numbers: { type: DataTypes.JSON, allowNull: false },
      work_order: { type: DataTypes.STRING(40), allowNull: true },
      status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'installed' },
      removed_date: { type: DataTypes.DATEONLY, allowNull: true },
      removed_reason: { type: DataTypes.STRING(255), allowNull: true },
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      ...timestamps,
    },
    innodb,
  );
  await q.addIndex('installs', ['planter_id', 'status']);
  await q.addIndex('installs', ['component_id']);
  await q.createTable(
    'attachments',
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      account_id: accountFk,
      owner_type: { type: DataTypes.STRING(10), allowNull: false },
      owner_id: { type: DataTypes.INTEGER, allowNull: false },
      original_name: { type: DataTypes.STRING(255), allowNull: false },
      stored_name: { type: DataTypes.STRING(80), allowNull: false, unique: true },
      thumb_name: { type: DataTypes.STRING(80), allowNull: true },
      mime: { type: DataTypes.STRING(60), allowNull: false },
      size_bytes: { type: DataTypes.INTEGER, allowNull: false },
      uploaded_by: { type: DataTypes.INTEGER, allowNull: true },
      ...timestamps,
    },
    innodb,
  );
  await q.addIndex('attachments', ['owner_type', 'owner_id']);
  await q.addIndex('attachments', ['account_id']);
  await q.createTable(
    'audit_events',
    {
      id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
      at: { type: DataTypes.DATE(3), allowNull: false },
      account_id: { type: DataTypes.INTEGER, allowNull: true },
      user_id: { type: DataTypes.INTEGER, allowNull: true },
      entity: { type: DataTypes.STRING(30), allowNull: false },
      entity_id: { type: DataTypes.INTEGER, allowNull: true },
      action: { type: DataTypes.STRING(20), allowNull: false },
      summary: { type: DataTypes.STRING(255), allowNull: true },
      changes: { type: DataTypes.JSON, allowNull: true },
    },
    innodb,
  );
  await q.addIndex('audit_events', ['account_id', 'at']);
}

export async function down({ queryInterface: q }: MigrationContext) {
  for (const t of ['audit_events', 'attachments', 'installs', 'components', 'toolbars', 'planters', 'tractors', 'farm_sites', 'contacts']) await q.dropTable(t);
}
