// Indexes for the planters list, found with the fleet-lists benchmark (bench/fleet-lists.ts) on the
// large data set (2,000 accounts, 6,000 planters, 60,000 installs). Handler reads for one page of
// `?sort=-rows&minRows=16` went from about 57,000 (a temporary table of every matching planter,
// with its install count, sorted) to about 400 (the page read in index order).
import type { MigrationContext } from '../migrate.js';

export async function up({ queryInterface: q }: MigrationContext) {
  // The list sorts by rows and breaks ties by id ascending in both directions, so each direction
  // gets the index whose order it is: (rows, id) for ascending, (rows DESC, id) for descending.
  // Both also serve the minimum-rows filter as a range.
  await q.addIndex('planters', ['rows'], { name: 'planters_rows' });
  await q.addIndex('planters', { name: 'planters_rows_desc_id', fields: [{ name: 'rows', order: 'DESC' }, 'id'] });
  // The list's total counts each in-scope account's planters above the row filter without reading rows.
  await q.addIndex('planters', ['account_id', 'rows'], { name: 'planters_account_id_rows' });
}

export async function down({ queryInterface: q }: MigrationContext) {
  await q.removeIndex('planters', 'planters_account_id_rows');
  await q.removeIndex('planters', 'planters_rows_desc_id');
  await q.removeIndex('planters', 'planters_rows');
}
