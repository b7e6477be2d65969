// The accounts list searches name and town with "contains" and sorts by name (bench/fleet-lists.ts).
// A "contains" search cannot seek an index, but it can scan a narrow one instead of whole rows:
// (name, town) carries both searched columns and, with the primary key InnoDB appends, the list's
// order (name, town, id), so the page's ids come from the index alone and only 25 rows are read.
import type { MigrationContext } from '../migrate.js';

export async function up({ queryInterface: q }: MigrationContext) {
  await q.addIndex('accounts', ['name', 'town'], { name: 'accounts_name_town' });
}

export async function down({ queryInterface: q }: MigrationContext) {
  await q.removeIndex('accounts', 'accounts_name_town');
}
