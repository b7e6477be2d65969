// Tables shared by the roadmap, visits, reminders and forecast features.
import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrate.js';

const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
};
const innodb = { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci', engine: 'InnoDB' };
const ref = (table: string, allowNull = false, onDelete = 'CASCADE') => ({ type: DataTypes.INTEGER, allowNull, references: { model: table, key: 'id' }, onDelete });

export async function up({ queryInterface: q }: MigrationContext) {
  await q.createTable(
    'settings',
    { key: { type: DataTypes.STRING(60), primaryKey: true }, value: { type: DataTypes.JSON, allowNull: false }, ...timestamps },
    innodb,
  );
  await q.createTable(
    'component_rules',
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      component_id: ref('components'),
      kind: { type: DataTypes.STRING(20), allowNull: false }, // requires | conflicts-with | supersedes | provides | prepares-for
      target_component_id: ref('components', true),
      capability: { type: DataTypes.STRING(40), allowNull: true },
      labour_hours_saved_per_unit: { type: DataTypes.DECIMAL(6, 2), allowNull: true },
      parts_usd_saved_per_unit: { type: DataTypes.DECIMAL(10, 2), allowNull: true },
      ...timestamps,
    },
    innodb,
  );
  await q.addIndex('component_rules', ['component_id']);
  await q.createTable(
    'goals',
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      account_id: ref('accounts'),
      planter_id: ref('planters', true),
      kind: { type: DataTypes.STRING(30), allowNull: false },
      label: { type: DataTypes.STRING(160), allowNull: false },
      capabilities: { type: DataTypes.JSON, allowNull: false },
      target_season: { type: DataTypes.SMALLINT, allowNull: false },
      priority: { type: DataTypes.TINYINT, allowNull: false, defaultValue: 2 },
      target_value: { type: DataTypes.DECIMAL(10, 2), allowNull: true },
      notes: { type: DataTypes.TEXT, allowNull: true },
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      ...timestamps,
    },
    innodb,
  );
  await q.addIndex('goals', ['account_id']);
  await q.createTable(
    'season_budgets',
    {
      account_id: { ...ref('accounts'), primaryKey: true },
      season: { type: DataTypes.SMALLINT, primaryKey: true },
      budget_usd: { type: DataTypes.DECIMAL(12, 2), allowNull: false },
      ...timestamps,
    },
    innodb,
  );
  await q.createTable(
    'planned_replacements',
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      account_id: ref('accounts'),
      planter_id: ref('planters'),
      season: { type: DataTypes.SMALLINT, allowNull: false },
      kind: { type: DataTypes.STRING(10), allowNull: false }, // toolbar | planter
      notes: { type: DataTypes.STRING(255), allowNull: true },
      ...timestamps,
    },
    innodb,
  );
  await q.createTable(
    'roadmap_items',
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      account_id: ref('accounts'),
      planter_id: ref('planters'),
      component_id: ref('components', false, 'RESTRICT'),
      season: { type: DataTypes.SMALLINT, allowNull: false },
      quantity: { type: DataTypes.SMALLINT, allowNull: false },
      parts_usd: { type: DataTypes.DECIMAL(12, 2), allowNull: false },
      labour_hours: { type: DataTypes.DECIMAL(8, 2), allowNull: false },
      labour_usd: { type: DataTypes.DECIMAL(12, 2), allowNull: false },
      stage: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'idea' }, // idea proposed quoted accepted ordered installed declined
      probability_override: { type: DataTypes.DECIMAL(4, 3), allowNull: true },
      locked: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      goal_ids: { type: DataTypes.JSON, allowNull: false },
      explanation: { type: DataTypes.TEXT, allowNull: true },
      specialist_id: ref('users', true, 'SET NULL'),
      install_week: { type: DataTypes.DATEONLY, allowNull: true },
      stage_changed_at: { type: DataTypes.DATE, allowNull: true },
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      ...timestamps,
    },
    innodb,
  );
  await q.addIndex('roadmap_items', ['account_id', 'season']);
  await q.addIndex('roadmap_items', ['season', 'stage']);
  await q.addIndex('roadmap_items', ['specialist_id', 'season']);
  await q.addIndex('roadmap_items', ['install_week']);
  await q.createTable(
    'roadmap_versions',
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      account_id: ref('accounts'),
      name: { type: DataTypes.STRING(120), allowNull: false },
      snapshot: { type: DataTypes.JSON, allowNull: false },
      created_by: ref('users', true, 'SET NULL'),
      ...timestamps,
    },
    innodb,
  );
  await q.createTable(
    'quotes',
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      account_id: ref('accounts'),
      season: { type: DataTypes.SMALLINT, allowNull: false },
      item_ids: { type: DataTypes.JSON, allowNull: false },
      parts_usd: { type: DataTypes.DECIMAL(12, 2), allowNull: false },
      labour_usd: { type: DataTypes.DECIMAL(12, 2), allowNull: false },
      total_usd: { type: DataTypes.DECIMAL(12, 2), allowNull: false },
      valid_until: { type: DataTypes.DATEONLY, allowNull: false },
      status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'open' }, // open accepted declined expired
      created_by: ref('users', true, 'SET NULL'),
      decided_by: ref('users', true, 'SET NULL'),
      decided_at: { type: DataTypes.DATE, allowNull: true },
      ...timestamps,
    },
    innodb,
  );
  await q.addIndex('quotes', ['account_id', 'season']);
  await q.createTable(
    'visits',
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      account_id: ref('accounts'),
      specialist_id: ref('users', true, 'SET NULL'),
      planter_id: ref('planters', true, 'SET NULL'),
      purpose: { type: DataTypes.STRING(20), allowNull: false }, // pre-season-checkup install troubleshooting roadmap-review post-season-review
      status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'requested' }, // requested planned done cancelled
      starts_at: { type: DataTypes.DATE, allowNull: true },
      duration_min: { type: DataTypes.SMALLINT, allowNull: false, defaultValue: 60 },
      window_start_min: { type: DataTypes.SMALLINT, allowNull: true },
      window_end_min: { type: DataTypes.SMALLINT, allowNull: true },
      fixed: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      notes: { type: DataTypes.TEXT, allowNull: true },
      checklist: { type: DataTypes.JSON, allowNull: false },
      roadmap_item_ids: { type: DataTypes.JSON, allowNull: false },
      requested_by_contact_id: ref('contacts', true, 'SET NULL'),
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      ...timestamps,
    },
    innodb,
  );
  await q.addIndex('visits', ['specialist_id', 'starts_at']);
  await q.addIndex('visits', ['account_id', 'starts_at']);
  await q.addIndex('visits', ['status']);
}

export async function down({ queryInterface: q }: MigrationContext) {
  for (const t of ['visits', 'quotes', 'roadmap_versions', 'roadmap_items', 'planned_replacements', 'season_budgets', 'goals', 'component_rules', 'settings']) await q.dropTable(t);
}
