// The planters list shows how many parts are installed on each planter. Counting them per row of
// the page (25 index lookups into installs) was about half of the database's work for the list, so
// the count is kept on the planter: `installed_count`, maintained by triggers on installs. Triggers
// rather than application code, so that every writer (the API, seeders, imports, raw SQL) keeps it
// right. Cascaded deletes do not fire triggers in MariaDB; installs only cascade away with their
// planter, whose count then goes with it.
//
// With binary logging on (replicas, Galera), creating triggers needs the TRIGGER privilege and
// either SUPER or log_bin_trust_function_creators=1 for the migrating user: see the README.
import type { MigrationContext } from '../migrate.js';

const TRIGGERS = {
  installs_count_insert: `CREATE TRIGGER installs_count_insert AFTER INSERT ON installs FOR EACH ROW
    UPDATE planters SET installed_count = installed_count + 1 WHERE id = NEW.planter_id AND NEW.status = 'installed'`,
  installs_count_update: `CREATE TRIGGER installs_count_update AFTER UPDATE ON installs FOR EACH ROW
    BEGIN
      IF OLD.status = 'installed' AND NOT (NEW.status = 'installed' AND NEW.planter_id = OLD.planter_id) THEN
        UPDATE planters SET installed_count = installed_count - 1 WHERE id = OLD.planter_id;
      END IF;
      IF NEW.status = 'installed' AND NOT (OLD.status = 'installed' AND NEW.planter_id = OLD.planter_id) THEN
        UPDATE planters SET installed_count = installed_count + 1 WHERE id = NEW.planter_id;
      END IF;
    END`,
  installs_count_delete: `CREATE TRIGGER installs_count_delete AFTER DELETE ON installs FOR EACH ROW
    UPDATE planters SET installed_count = installed_count - 1 WHERE id = OLD.planter_id AND OLD.status = 'installed'`,
};

export async function up({ sequelize }: MigrationContext) {
  await sequelize.query('ALTER TABLE planters ADD COLUMN installed_count INT UNSIGNED NOT NULL DEFAULT 0');
  for (const sql of Object.values(TRIGGERS)) await sequelize.query(sql);
  // After the triggers exist, so that an install written meanwhile is not missed; recounting is
  // idempotent, so one written between the two is counted once either way.
  await sequelize.query(
    "UPDATE planters p SET p.installed_count = (SELECT COUNT(*) FROM installs i WHERE i.planter_id = p.id AND i.status = 'installed')",
  );
}

export async function down({ sequelize }: MigrationContext) {
  for (const name of Object.keys(TRIGGERS)) await sequelize.query(`DROP TRIGGER IF EXISTS ${name}`);
  await sequelize.query('ALTER TABLE planters DROP COLUMN installed_count');
}
