// A season's roadmap items as a quote the grower can accept or decline in their portal.
import path from 'node:path';
import PDFDocument from 'pdfkit';
import { Op, type Sequelize } from 'sequelize';
import type { SessionUser } from '../../../shared/schemas/auth.js';
import { Account, Component, Planter, Quote, RoadmapItem } from '../../db/models/index.js';
import { AppError, notFound } from '../../http/errors.js';
import { accountFor, audit } from '../fleet/fleet-access.js';
import { getSettings } from '../settings/settings.service.js';

// Items already on an open quote are not quoted twice.
const QUOTABLE = ['idea', 'proposed'];
const round2 = (n: number) => Math.round(n * 100) / 100;
const today = () => new Date().toISOString().slice(0, 10);

async function quoteView(q: Quote) {
  const items = await RoadmapItem.findAll({ where: { id: q.itemIds }, include: [{ model: Component, as: 'component' }, { model: Planter, as: 'planter', attributes: ['id', 'name'] }] });
  const expired = q.status === 'open' && q.validUntil < today();
  return {
    id: q.id,
    accountId: q.accountId,
    season: q.season,
    status: expired ? 'expired' : q.status,
    validUntil: q.validUntil,
    partsUsd: Number(q.partsUsd),
    labourUsd: Number(q.labourUsd),
    totalUsd: Number(q.totalUsd),
    createdAt: q.createdAt,
    decidedAt: q.decidedAt,
    items: items.map((i) => {
      const c = (i as RoadmapItem & { component: Component }).component;
      const p = (i as RoadmapItem & { planter: Planter }).planter;
      return { id: i.id, partNumber: c.partNumber, partName: c.name, planterName: p?.name ?? null, quantity: i.quantity, partsUsd: Number(i.partsUsd), labourHours: Number(i.labourHours), labourUsd: Number(i.labourUsd), stage: i.stage };
    }),
  };
}
export type QuoteView = Awaited<ReturnType<typeof quoteView>>;

/** Staff. Quotes every open item of the season; those items move to the stage 'quoted'. */
export async function createQuote(sequelize: Sequelize, user: SessionUser, accountId: number, season: number) {
  const settings = await getSettings();
  const id = await sequelize.transaction(async (transaction) => {
    const account = await accountFor(user, accountId, 'edit', transaction);
    const items = await RoadmapItem.findAll({ where: { accountId, season, stage: { [Op.in]: QUOTABLE } }, transaction });
    if (!items.length) throw new AppError('validation', 400, 'Nothing to quote in that season.', { fields: { season: `No open roadmap items in ${season}` } });
    const partsUsd = round2(items.reduce((s, i) => s + Number(i.partsUsd), 0));
    const labourUsd = round2(items.reduce((s, i) => s + Number(i.labourUsd), 0));
    const validUntil = new Date(Date.now() + settings.quoteValidityDays * 86_400_000).toISOString().slice(0, 10);
    const quote = await Quote.create({ accountId, season, itemIds: items.map((i) => i.id), partsUsd, labourUsd, totalUsd: round2(partsUsd + labourUsd), validUntil, createdBy: user.id, decidedBy: null, decidedAt: null }, { transaction });
    await RoadmapItem.update({ stage: 'quoted', stageChangedAt: new Date() }, { where: { id: items.map((i) => i.id) }, transaction });
    await audit(transaction, { accountId, userId: user.id, entity: 'quote', entityId: quote.id, action: 'create', summary: `Quoted ${season} to ${account.name}: ${items.length} items, $${(partsUsd + labourUsd).toLocaleString('en-US')}, valid until ${validUntil}` });
    return quote.id;
  });
  return getQuote(user, id);
}

export async function getQuote(user: SessionUser, id: number) {
  const q = await Quote.findByPk(id);
  if (!q) throw notFound('That quote');
  await accountFor(user, q.accountId, 'read');
  return quoteView(q);
}

export async function listQuotes(user: SessionUser, accountId: number) {
  await accountFor(user, accountId, 'read');
  const quotes = await Quote.findAll({ where: { accountId }, order: [['createdAt', 'DESC']] });
  return Promise.all(quotes.map(quoteView));
}

/** The grower of the account decides; the items take the stage and the audit trail records who. */
export async function decideQuote(sequelize: Sequelize, user: SessionUser, id: number, decision: 'accepted' | 'declined') {
  await sequelize.transaction(async (transaction) => {
    const q = await Quote.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
    if (!q) throw notFound('That quote');
    await accountFor(user, q.accountId, 'read', transaction);
    if (user.role !== 'grower') throw new AppError('forbidden', 403, 'Only the grower accepts or declines their quote.');
    if (q.status !== 'open') throw new AppError('conflict', 409, `This quote was already ${q.status}.`);
    if (q.validUntil < today()) throw new AppError('expired', 409, `This quote expired on ${q.validUntil}. Ask your specialist for a new one.`);
    await q.update({ status: decision, decidedBy: user.id, decidedAt: new Date() }, { transaction });
    await RoadmapItem.update(
      { stage: decision, stageChangedAt: new Date(), ...(decision === 'accepted' ? { locked: true } : {}) },
      { where: { id: q.itemIds, stage: 'quoted' }, transaction },
    );
    await audit(transaction, { accountId: q.accountId, userId: user.id, entity: 'quote', entityId: id, action: 'stage', summary: `${user.name} ${decision} the ${q.season} quote ($${Number(q.totalUsd).toLocaleString('en-US')})` });
  });
  return getQuote(user, id);
}

const FONT_DIR = path.resolve('node_modules/@fontsource/open-sans/files');
const money = (n: number) => `$${n.toLocaleString('en-US', { minimumFractionDigits: 2, maximumFractionDigits: 2 })}`;

/** A printable quote: parts, labour, totals and the validity date. */
export async function quotePdf(user: SessionUser, id: number): Promise<Buffer> {
  const q = await getQuote(user, id);
  const account = await Account.findByPk(q.accountId, { attributes: ['name', 'town', 'state'] });
  const settings = await getSettings();
  const doc = new PDFDocument({ size: 'LETTER', margin: 54, info: { Title: `Rowpath quote ${q.id}`, Author: 'Rowpath' } });
  doc.registerFont('body', path.join(FONT_DIR, 'open-sans-latin-400-normal.woff'));
  doc.registerFont('bold', path.join(FONT_DIR, 'open-sans-latin-700-normal.woff'));
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve) => doc.on('end', () => resolve(Buffer.concat(chunks))));

  doc.font('bold').fontSize(20).fillColor('#27305a').text('Rowpath — upgrade quote');
  doc.moveDown(0.3).font('body').fontSize(10).fillColor('#3d3a35');
  doc.text(`Quote ${q.id} for ${account?.name ?? ''}${account?.town ? `, ${account.town}, ${account.state}` : ''}`);
  doc.text(`Season ${q.season} · issued ${q.createdAt.toISOString().slice(0, 10)} · valid until ${q.validUntil}`);
  doc.moveDown();
  const cols = [54, 130, 330, 390, 470];
  const header = ['Part no.', 'Item', 'Qty', 'Labour h', 'Amount'];
  doc.font('bold');
  header.forEach((h, i) => doc.text(h, cols[i], doc.y, { continued: false, lineBreak: false }));
  doc.moveDown();
  doc.font('body');
  for (const it of q.items) {
    const y = doc.y;
    doc.text(it.partNumber, cols[0], y, { width: 70 });
    doc.text(`${it.partName}${it.planterName ? ` — ${it.planterName}` : ''}`, cols[1], y, { width: 190 });
    const rowBottom = doc.y;
    doc.text(String(it.quantity), cols[2], y);
    doc.text(it.labourHours.toFixed(1), cols[3], y);
    doc.text(money(it.partsUsd + it.labourUsd), cols[4], y, { width: 90, align: 'right' });
    doc.y = Math.max(rowBottom, doc.y) + 4;
  }
  doc.moveDown();
  doc.font('body').text(`Parts: ${money(q.partsUsd)}`, { align: 'right' });
  doc.text(`Labour at ${money(settings.shopRateUsdPerHour)}/h: ${money(q.labourUsd)}`, { align: 'right' });
  doc.font('bold').fontSize(12).text(`Total: ${money(q.totalUsd)}`, { align: 'right' });
  doc.moveDown(2).font('body').fontSize(9).fillColor('#5c574f');
  doc.text(
    'Prices are valid until the date above. Installation follows the component maker\'s instructions. Before work under a raised ' +
      'toolbar the planter is lowered or blocked and hydraulic pressure relieved; starter fertilizer is handled as its label directs.',
  );
  doc.end();
  return done;
}
