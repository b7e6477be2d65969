// Calendar feed tokens (one per user, random, unguessable; rotating replaces it) and an index for
// the "is a check-up or review due" questions the visit candidates ask per account.
import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrate.js';

const innodb = { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci', engine: 'InnoDB' };

export async function up({ queryInterface: q }: MigrationContext) {
  await q.createTable(
    'calendar_tokens',
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      user_id: { type: DataTypes.INTEGER, allowNull: false, unique: true, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
      // 32 random bytes, base64url (43 characters). The feed URL is the only credential a
      // calendar program can carry, so the token is kept to show the URL again.
      token: { type: DataTypes.STRING(64, true), allowNull: false, unique: true },
      last_used_at: { type: DataTypes.DATE, allowNull: true },
      created_at: { type: DataTypes.DATE, allowNull: false },
      updated_at: { type: DataTypes.DATE, allowNull: false },
    },
    innodb,
  );
  await q.addIndex('visits', ['account_id', 'purpose', 'status'], { name: 'visits_account_purpose_status' });
}

export async function down({ queryInterface: q }: MigrationContext) {
  await q.removeIndex('visits', 'visits_account_purpose_status');
  await q.dropTable('calendar_tokens');
}
