// Pre-season reminders: the dealership's season calendar, campaigns, the outbox the sender works
// through, and the mailbox of the local SMTP stand-in (what the Sent mail page shows).
import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrate.js';

const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
};
const innodb = { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci', engine: 'InnoDB' };
const ref = (table: string, allowNull = false, onDelete = 'CASCADE') => ({ type: DataTypes.INTEGER, allowNull, references: { model: table, key: 'id' }, onDelete });

export async function up({ queryInterface: q }: MigrationContext) {
  // Only the dealership's own dates are stored; published defaults live in shared/calc/season-calendar.ts.
  await q.createTable(
    'season_windows',
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      region_key: { type: DataTypes.STRING(40), allowNull: false },
      region_label: { type: DataTypes.STRING(120), allowNull: false },
      crop: { type: DataTypes.STRING(20), allowNull: false },
      window_start: { type: DataTypes.CHAR(5), allowNull: false }, // MM-DD
      window_end: { type: DataTypes.CHAR(5), allowNull: false },
      source: { type: DataTypes.STRING(255), allowNull: true },
      source_text: { type: DataTypes.TEXT, allowNull: true },
      updated_by: ref('users', true, 'SET NULL'),
      ...timestamps,
    },
    innodb,
  );
  await q.addIndex('season_windows', ['region_key', 'crop'], { unique: true, name: 'season_windows_region_crop' });

  await q.createTable(
    'reminder_campaigns',
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      name: { type: DataTypes.STRING(160), allowNull: false },
      season: { type: DataTypes.SMALLINT, allowNull: false },
      region_key: { type: DataTypes.STRING(40), allowNull: false },
      crop: { type: DataTypes.STRING(20), allowNull: false },
      offsets_days: { type: DataTypes.JSON, allowNull: false },
      audience: { type: DataTypes.JSON, allowNull: false }, // growsCrop, hasRoadmapItems, noCheckupSince
      subject: { type: DataTypes.STRING(200), allowNull: false },
      body: { type: DataTypes.TEXT, allowNull: false },
      status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'draft' }, // draft active paused
      created_by: ref('users', true, 'SET NULL'),
      updated_by: ref('users', true, 'SET NULL'),
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      ...timestamps,
    },
    innodb,
  );
  await q.addIndex('reminder_campaigns', ['status', 'season']);
  // Territories of a campaign's audience, in a table so that scope checks are plain joins.
  await q.createTable(
    'reminder_campaign_territories',
    {
      campaign_id: { ...ref('reminder_campaigns'), primaryKey: true },
      territory_id: { ...ref('territories'), primaryKey: true },
    },
    innodb,
  );
  await q.addIndex('reminder_campaign_territories', ['territory_id']);

  await q.createTable(
    'reminder_outbox',
    {
      id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
      campaign_id: ref('reminder_campaigns'),
      contact_id: ref('contacts'),
      account_id: ref('accounts'),
      offset_days: { type: DataTypes.SMALLINT, allowNull: false },
      send_on: { type: DataTypes.DATEONLY, allowNull: false },
      to_email: { type: DataTypes.STRING(191), allowNull: false },
      subject: { type: DataTypes.STRING(255), allowNull: false },
      text: { type: DataTypes.TEXT('medium'), allowNull: false },
      html: { type: DataTypes.TEXT('medium'), allowNull: false },
      message_id: { type: DataTypes.STRING(191), allowNull: false },
      unsubscribe_url: { type: DataTypes.STRING(1000), allowNull: false },
      status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'pending' }, // pending sending sent failed cancelled held
      attempts: { type: DataTypes.SMALLINT, allowNull: false, defaultValue: 0 },
      // When the row may next be claimed: the retry time when pending, the lease end when sending.
      next_attempt_at: { type: DataTypes.DATE(3), allowNull: false },
      claimed_by: { type: DataTypes.STRING(80), allowNull: true },
      last_error: { type: DataTypes.STRING(1000), allowNull: true },
      smtp_response: { type: DataTypes.STRING(255), allowNull: true },
      sent_at: { type: DataTypes.DATE(3), allowNull: true },
      ...timestamps,
    },
    innodb,
  );
  // A message can be enqueued only once per contact, campaign and offset, however many enqueuers run.
  await q.addIndex('reminder_outbox', ['contact_id', 'campaign_id', 'offset_days'], { unique: true, name: 'reminder_outbox_once' });
  await q.addIndex('reminder_outbox', ['status', 'next_attempt_at'], { name: 'reminder_outbox_claim' });
  await q.addIndex('reminder_outbox', ['campaign_id', 'status']);
  await q.addIndex('reminder_outbox', ['account_id', 'status']);

  await q.createTable(
    'received_mail',
    {
      id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
      message_id: { type: DataTypes.STRING(191), allowNull: false },
      envelope_from: { type: DataTypes.STRING(191), allowNull: true },
      envelope_to: { type: DataTypes.JSON, allowNull: false },
      from_header: { type: DataTypes.STRING(255), allowNull: true },
      to_header: { type: DataTypes.STRING(1000), allowNull: true },
      subject: { type: DataTypes.STRING(255), allowNull: true },
      text: { type: DataTypes.TEXT('medium'), allowNull: true },
      html: { type: DataTypes.TEXT('medium'), allowNull: true },
      headers: { type: DataTypes.JSON, allowNull: false },
      size_bytes: { type: DataTypes.INTEGER, allowNull: false },
      // The same Message-ID handed over again (a sender that died between hand-over and its
      // "sent" mark): kept once, counted here.
      repeat_count: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      received_at: { type: DataTypes.DATE(3), allowNull: false },
    },
    innodb,
  );
  await q.addIndex('received_mail', ['message_id'], { unique: true, name: 'received_mail_message_id' });
  await q.addIndex('received_mail', ['received_at']);
}

export async function down({ queryInterface: q }: MigrationContext) {
  for (const t of ['received_mail', 'reminder_outbox', 'reminder_campaign_territories', 'reminder_campaigns', 'season_windows']) await q.dropTable(t);
}
