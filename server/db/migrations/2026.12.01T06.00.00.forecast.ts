// Forecast: a revenue quota per territory and season, and the shop's technician hours for a week
// when they differ from the settings default (`technicianHoursPerWeek`).
import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrate.js';

const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
};
const innodb = { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci', engine: 'InnoDB' };

export async function up({ queryInterface: q }: MigrationContext) {
  await q.createTable(
    'quotas',
    {
      territory_id: { type: DataTypes.INTEGER, primaryKey: true, references: { model: 'territories', key: 'id' }, onDelete: 'CASCADE' },
      season: { type: DataTypes.SMALLINT, primaryKey: true },
      quota_usd: { type: DataTypes.DECIMAL(12, 2), allowNull: false },
      updated_by: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
      ...timestamps,
    },
    innodb,
  );
  await q.createTable(
    'shop_weeks',
    {
      week_start: { type: DataTypes.DATEONLY, primaryKey: true }, // always a Monday
      technician_hours: { type: DataTypes.DECIMAL(7, 2), allowNull: false },
      updated_by: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
      ...timestamps,
    },
    innodb,
  );
  // Covering indexes for the forecast: its aggregates read only these, never the rows (which carry
  // the TEXT explanation and JSON goal ids), and group in index order without a temporary table.
  // Season first: a season's figures by category (component), stage or specialist.
  await q.addIndex('roadmap_items', ['season', 'component_id', 'stage', 'probability_override', 'parts_usd', 'labour_usd', 'account_id', 'specialist_id', 'install_week'], {
    name: 'roadmap_items_forecast_season',
  });
  // Install week first: figures by month or quarter, and month ranges.
  await q.addIndex('roadmap_items', ['install_week', 'season', 'stage', 'probability_override', 'parts_usd', 'labour_usd', 'account_id', 'specialist_id', 'component_id'], {
    name: 'roadmap_items_forecast_week',
  });
  // The forecast cache's freshness stamp reads MAX(updated_at) from here instead of every row.
  await q.addIndex('roadmap_items', ['updated_at'], { name: 'roadmap_items_updated_at' });
}

export async function down({ queryInterface: q }: MigrationContext) {
  await q.removeIndex('roadmap_items', 'roadmap_items_updated_at');
  await q.removeIndex('roadmap_items', 'roadmap_items_forecast_week');
  await q.removeIndex('roadmap_items', 'roadmap_items_forecast_season');
  await q.dropTable('shop_weeks');
  await q.dropTable('quotas');
}
