import { Op, QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { SessionUser } from '../../../shared/schemas/auth.js';
import type { InstallInput, PlanterInput, PlanterListQuery } from '../../../shared/schemas/fleet.js';
import { accountScopeSql } from '../../auth/access.js';
import { Account, Component, FarmSite, Install, Planter, Toolbar, Tractor } from '../../db/models/index.js';
import { notFound, validationError } from '../../http/errors.js';
import { accountFor, assertVersion, audit, diff, mapLockError } from './fleet-access.js';
import { plainSelect } from '../../db/plain-select.js';
import { countRows } from './list-totals.js';
import { plain } from './plain.js';
import { likeContains } from '../../db/like.js';

export const PLANTER_NUMBERS = ['rowSpacingIn', 'seedCapacityUnits', 'liquidTankGallons', 'dryCapacityLb'];
export const TOOLBAR_NUMBERS = ['sizeFt'];
export const INSTALL_NUMBERS = ['pricePaidUsd'];
export const COMPONENT_NUMBERS = ['priceUsd', 'labourHours', 'expectedLifeYears', 'hydraulicGpm', 'ratedMaxSpeedMph', 'maxSeedsPerSecond'];
export const TRACTOR_NUMBERS = ['hydraulicFlowGpm', 'ptoHp'];

const label = (p: { name: string; rows: number; rowSpacingIn: number }) => `${p.name} (${p.rows} × ${Number(p.rowSpacingIn)} in)`;

async function checkOwnedRefs(accountId: number, input: { tractorId: number | null; farmSiteId: number | null }, transaction: Transaction) {
  const fields: Record<string, string> = {};
  if (input.tractorId && !(await Tractor.findOne({ where: { id: input.tractorId, accountId }, attributes: ['id'], transaction })))
    fields.tractorId = 'That tractor is not in this operation';
  if (input.farmSiteId && !(await FarmSite.findOne({ where: { id: input.farmSiteId, accountId }, attributes: ['id'], transaction })))
    fields.farmSiteId = 'That farm site is not in this operation';
  if (Object.keys(fields).length) throw validationError(fields);
}

/**
 * Staff of the account's territory. Creates the planter and its toolbars in one transaction, and
 * reads the answer inside it: once the commit succeeds nothing is left to fail, so a client never
 * gets an error for a planter that was in fact saved (and never duplicates it by retrying).
 */
export async function createPlanter(sequelize: Sequelize, user: SessionUser, accountId: number, input: PlanterInput) {
  return sequelize.transaction(async (transaction) => {
    await accountFor(user, accountId, 'edit', transaction);
    await checkOwnedRefs(accountId, input, transaction);
    const { toolbars, ...fields } = input;
    const planter = await Planter.create({ ...fields, accountId }, { transaction });
    await Toolbar.bulkCreate(
      toolbars.map((t, i) => ({ planterId: planter.id, position: i + 1, name: t.name, sizeFt: t.sizeFt, firstRow: t.firstRow, lastRow: t.lastRow })),
      { transaction },
    );
    await audit(transaction, { accountId, userId: user.id, entity: 'planter', entityId: planter.id, action: 'create', summary: `Added planter ${label(input)}` });
    return getPlanter(user, planter.id, transaction);
  });
}

/** Anyone who may see the account: the planter with its toolbars, tractor and every install. */
export async function getPlanter(user: SessionUser, id: number, transaction?: Transaction) {
  const planter = await Planter.findByPk(id, { transaction });
  if (!planter) throw notFound('That planter');
  const account = await accountFor(user, planter.accountId, 'read', transaction);
  // One after another inside a transaction (it holds one connection); side by side otherwise.
  const reads = [
    () => Toolbar.findAll({ where: { planterId: id }, order: [['position', 'ASC']], transaction }),
    () => Install.findAll({ where: { planterId: id }, include: [{ model: Component, as: 'component' }], order: [['installDate', 'ASC'], ['id', 'ASC']], transaction }),
    () => (planter.tractorId ? Tractor.findByPk(planter.tractorId, { transaction }) : Promise.resolve(null)),
  ] as const;
  const [toolbars, installs, tractor] = transaction
    ? [await reads[0](), await reads[1](), await reads[2]()]
    : await Promise.all([reads[0](), reads[1](), reads[2]()]);
  return {
    ...plain(planter, PLANTER_NUMBERS),
    accountName: account.name,
    toolbars: toolbars.map((t) => plain(t, TOOLBAR_NUMBERS)),
    tractor: tractor ? plain(tractor, TRACTOR_NUMBERS) : null,
    installs: installs.map((i) => {
      const row = plain(i, INSTALL_NUMBERS);
      const component = (i as Install & { component?: Component }).component;
      return { ...row, component: component ? plain(component, COMPONENT_NUMBERS) : null };
    }),
  };
}
export type PlanterDetail = Awaited<ReturnType<typeof getPlanter>>;

/** Staff only. Replaces the planter's fields and toolbars; refuses changes that would strand installs. */
export async function updatePlanter(sequelize: Sequelize, user: SessionUser, id: number, input: PlanterInput & { version: number }) {
  await sequelize
    .transaction(async (transaction) => {
      const planter = await Planter.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
      if (!planter) throw notFound('That planter');
      await accountFor(user, planter.accountId, 'edit', transaction);
      assertVersion(planter.version, input.version);
      await checkOwnedRefs(planter.accountId, input, transaction);
      const { toolbars, version: _v, ...fields } = input;
      const installs = await Install.findAll({ where: { planterId: id, status: 'installed' }, transaction });
      const highest = Math.max(0, ...installs.map((i) => (i.scope === 'rows' ? i.rowTo ?? 0 : 0)));
      if (highest > fields.rows) throw validationError({ rows: `Components are installed up to row ${highest}: remove or move them first` });
      const existing = await Toolbar.findAll({ where: { planterId: id }, transaction });
      const keep = new Set(toolbars.filter((t) => t.id).map((t) => t.id!));
      const fieldsErr: Record<string, string> = {};
      toolbars.forEach((t, i) => {
        if (t.id && !existing.some((e) => e.id === t.id)) fieldsErr[`toolbars.${i}.id`] = 'That toolbar is not on this planter';
      });
      const dropped = existing.filter((e) => !keep.has(e.id));
      const droppedInUse = dropped.filter((d) => installs.some((i) => i.toolbarId === d.id));
      if (droppedInUse.length) fieldsErr.toolbars = `Components are installed on ${droppedInUse.map((d) => d.name).join(', ')}: remove them first`;
      if (Object.keys(fieldsErr).length) throw validationError(fieldsErr);

      const changes = diff(plain(planter, PLANTER_NUMBERS), fields);
      planter.set(fields);
      await planter.save({ transaction });
      if (dropped.length) await Toolbar.destroy({ where: { id: dropped.map((d) => d.id) }, transaction });
      for (const [i, t] of toolbars.entries()) {
        const values = { position: i + 1, name: t.name, sizeFt: t.sizeFt, firstRow: t.firstRow, lastRow: t.lastRow };
        if (t.id) await Toolbar.update(values, { where: { id: t.id }, transaction });
        else await Toolbar.create({ planterId: id, ...values }, { transaction });
      }
      await audit(transaction, { accountId: planter.accountId, userId: user.id, entity: 'planter', entityId: id, action: 'update', summary: `Changed planter ${label(planter)}`, changes });
    })
    .catch(mapLockError);
  return getPlanter(user, id);
}

export async function deletePlanter(sequelize: Sequelize, user: SessionUser, id: number) {
  await sequelize.transaction(async (transaction) => {
    const planter = await Planter.findByPk(id, { transaction });
    if (!planter) throw notFound('That planter');
    await accountFor(user, planter.accountId, 'edit', transaction);
    await planter.destroy({ transaction });
    await audit(transaction, { accountId: planter.accountId, userId: user.id, entity: 'planter', entityId: id, action: 'delete', summary: `Removed planter ${label(planter)}` });
  });
}

const planterSort: Record<string, string> = { name: 'p.name', rows: 'p.rows', modelYear: 'p.model_year', account: 'a.name' };

type PlanterRow = { id: number; name: string; maker: string | null; modelYear: number | null; rows: number; rowSpacingIn: string | number; frameType: string; accountId: number; accountName: string; installCount: number | bigint };

/**
 * Planters across the accounts the user may see, paged on the server. Plain SQL, like the accounts
 * list: the page's ids are found first (in index order where the sort allows: see the fleet-list
 * indexes), then only those rows are read with their account name and install count.
 */
export async function listPlanters(user: SessionUser, query: PlanterListQuery) {
  const sequelize = Planter.sequelize!;
  const scope = accountScopeSql(user, 'a');
  const conditions = [scope.sql];
  const replacements: unknown[] = [...scope.replacements];
  if (query.accountId) {
    conditions.push('p.account_id = ?');
    replacements.push(query.accountId);
  }
  if (query.minRows) {
    conditions.push('p.rows >= ?');
    replacements.push(query.minRows);
  }
  if (query.q) {
    const like = likeContains(query.q);
    conditions.push('(p.name LIKE ? OR p.maker LIKE ? OR a.name LIKE ?)');
    replacements.push(like, like, like);
  }
  const where = conditions.join(' AND ');
  const desc = query.sort.startsWith('-');
  const key = query.sort.replace(/^-/, '');
  // Ties by id ascending in both directions: the order the planters_rows_desc_id index holds.
  const orderBy = `${planterSort[key] ?? 'p.name'} ${desc ? 'DESC' : 'ASC'}, p.id ASC`;
  // An admin's list needs the account only to search or sort by its name.
  const from = user.role !== 'admin' || query.q || key === 'account' ? 'planters p JOIN accounts a ON a.id = p.account_id' : 'planters p';
  const [total, rows] = await Promise.all([
    countRows(sequelize, `SELECT COUNT(*) AS total FROM ${from} WHERE ${where}`, replacements),
    plainSelect<PlanterRow>(
      sequelize,
      'SELECT p.id, p.name, p.maker, p.model_year AS modelYear, p.rows, p.row_spacing_in AS rowSpacingIn, p.frame_type AS frameType, a.id AS accountId, a.name AS accountName, ' +
        // Kept by triggers on installs (migration 2026.12.02T01): no per-row count here.
        'p.installed_count AS installCount ' +
        `FROM (SELECT p.id FROM ${from} WHERE ${where} ORDER BY ${orderBy} LIMIT ? OFFSET ?) page ` +
        `JOIN planters p ON p.id = page.id JOIN accounts a ON a.id = p.account_id ORDER BY ${orderBy}`,
      [...replacements, query.pageSize, (query.page - 1) * query.pageSize],
    ),
  ]);
  return {
    items: rows.map((r) => ({ ...r, rowSpacingIn: Number(r.rowSpacingIn), installCount: Number(r.installCount) })),
    total,
  };
}

// ---------------- installs ----------------

async function checkInstall(planter: Planter, input: InstallInput, transaction: Transaction) {
  const component = await Component.findByPk(input.componentId, { transaction });
  const fields: Record<string, string> = {};
  if (!component) throw validationError({ componentId: 'No component in the catalog has that id' });
  if (input.scope === 'rows') {
    if (input.rowTo! > planter.rows) fields.rowTo = `The planter has only ${planter.rows} rows`;
    if (input.rowFrom! > planter.rows) fields.rowFrom = `The planter has only ${planter.rows} rows`;
  }
  if (input.scope === 'toolbar' && !(await Toolbar.findOne({ where: { id: input.toolbarId!, planterId: planter.id }, attributes: ['id'], transaction })))
    fields.toolbarId = 'That toolbar is not on this planter';
  const perRow = input.scope === 'rows' || input.scope === 'all-rows';
  if (component.unit === 'row' && !perRow) fields.scope = 'This part goes on row units: place it on a range of rows or on every row';
  if (component.unit !== 'row' && perRow) fields.scope = `This part is fitted per ${component.unit}: place it on the ${component.unit}`;
  if (Object.keys(fields).length) throw validationError(fields);
  const quantity =
    input.quantity ?? (input.scope === 'all-rows' ? planter.rows : input.scope === 'rows' ? input.rowTo! - input.rowFrom! + 1 : 1);
  return {
    component,
    values: {
      ...input,
      toolbarId: input.scope === 'toolbar' ? input.toolbarId : null,
      rowFrom: input.scope === 'rows' ? input.rowFrom : null,
      rowTo: input.scope === 'rows' ? input.rowTo : null,
      quantity,
    },
  };
}

const where = (i: { scope: string; rowFrom: number | null; rowTo: number | null }) =>
  i.scope === 'rows' ? `rows ${i.rowFrom}–${i.rowTo}` : i.scope === 'all-rows' ? 'every row' : `the ${i.scope}`;

export async function createInstall(sequelize: Sequelize, user: SessionUser, planterId: number, input: InstallInput) {
  return sequelize.transaction(async (transaction) => {
    // Locked first: the install-count trigger updates this row, and two installs on one planter
    // would otherwise both hold the foreign key's shared lock and deadlock upgrading it.
    const planter = await Planter.findByPk(planterId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!planter) throw notFound('That planter');
    await accountFor(user, planter.accountId, 'edit', transaction);
    const { component, values } = await checkInstall(planter, input, transaction);
    const install = await Install.create({ ...values, planterId }, { transaction });
    await audit(transaction, {
      accountId: planter.accountId,
      userId: user.id,
      entity: 'install',
      entityId: install.id,
      action: 'create',
      summary: `Installed ${component.name} (${component.partNumber}) on ${where(install)} of ${planter.name}`,
    });
    return { ...plain(install, INSTALL_NUMBERS), component: plain(component, COMPONENT_NUMBERS) };
  });
}

export async function updateInstall(sequelize: Sequelize, user: SessionUser, id: number, input: InstallInput & { version: number }) {
  return sequelize
    .transaction(async (transaction) => {
      const install = await Install.findByPk(id, { transaction });
      if (!install) throw notFound('That install');
      const planter = (await Planter.findByPk(install.planterId, { transaction, lock: transaction.LOCK.UPDATE }))!;
      await accountFor(user, planter.accountId, 'edit', transaction);
      assertVersion(install.version, input.version);
      const { version: _v, ...rest } = input;
      const { component, values } = await checkInstall(planter, rest, transaction);
      const changes = diff(plain(install, INSTALL_NUMBERS), values);
      install.set(values);
      await install.save({ transaction });
      const removed = values.status === 'removed' && changes.status;
      await audit(transaction, {
        accountId: planter.accountId,
        userId: user.id,
        entity: 'install',
        entityId: id,
        action: 'update',
        summary: removed ? `Removed ${component.name} from ${planter.name}: ${values.removedReason ?? 'no reason given'}` : `Changed ${component.name} on ${planter.name}`,
        changes,
      });
      return { ...plain(install, INSTALL_NUMBERS), component: plain(component, COMPONENT_NUMBERS) };
    })
    .catch(mapLockError);
}

export async function deleteInstall(sequelize: Sequelize, user: SessionUser, id: number) {
  await sequelize.transaction(async (transaction) => {
    const install = await Install.findByPk(id, { transaction, include: [{ model: Component, as: 'component' }] });
    if (!install) throw notFound('That install');
    const planter = (await Planter.findByPk(install.planterId, { transaction, lock: transaction.LOCK.UPDATE }))!;
    await accountFor(user, planter.accountId, 'edit', transaction);
    await install.destroy({ transaction });
    const component = (install as Install & { component: Component }).component;
    await audit(transaction, { accountId: planter.accountId, userId: user.id, entity: 'install', entityId: id, action: 'delete', summary: `Deleted the record of ${component.name} on ${planter.name}` });
  });
}
