// The catalog's rules between parts. A rule set with a cycle or a contradiction is refused whole,
// with the parts named, so the planner never works from an impossible catalog.
import type { Sequelize } from 'sequelize';
import { validateRuleSet } from '../../../shared/calc/catalog-rules.js';
import type { RuleInput } from '../../../shared/schemas/roadmap.js';
import { Component, ComponentRule } from '../../db/models/index.js';
import { AppError, validationError } from '../../http/errors.js';
import { audit } from '../fleet/fleet-access.js';
import { catalogPart, partRule } from './planner-input.js';

export async function listRules() {
  const rules = await ComponentRule.findAll({ order: [['componentId', 'ASC'], ['kind', 'ASC'], ['id', 'ASC']] });
  return rules.map((r) => ({
    id: r.id,
    componentId: r.componentId,
    kind: r.kind,
    targetComponentId: r.targetComponentId,
    capability: r.capability,
    labourHoursSavedPerUnit: r.labourHoursSavedPerUnit === null ? null : Number(r.labourHoursSavedPerUnit),
    partsUsdSavedPerUnit: r.partsUsdSavedPerUnit === null ? null : Number(r.partsUsdSavedPerUnit),
  }));
}

/** Admin and manager. Replaces the whole rule set in one transaction, or refuses it with reasons. */
export async function replaceRules(sequelize: Sequelize, userId: number, rules: RuleInput[]) {
  const components = await Component.findAll();
  const known = new Set(components.map((c) => c.id));
  const fields: Record<string, string> = {};
  rules.forEach((r, i) => {
    if (!known.has(r.componentId)) fields[`rules.${i}.componentId`] = 'No component in the catalog has that id';
    if (r.targetComponentId && !known.has(r.targetComponentId)) fields[`rules.${i}.targetComponentId`] = 'No component in the catalog has that id';
  });
  if (Object.keys(fields).length) throw validationError(fields);
  const asRows = rules.map((r) => ComponentRule.build({ ...r, labourHoursSavedPerUnit: r.labourHoursSavedPerUnit, partsUsdSavedPerUnit: r.partsUsdSavedPerUnit }));
  const problems = validateRuleSet(components.map(catalogPart), asRows.map(partRule).filter((x) => x !== null));
  const errors = problems.filter((p) => p.severity === 'error');
  if (errors.length) {
    const names = new Map(components.map((c) => [String(c.id), `${c.partNumber} ${c.name}`]));
    throw new AppError('rule_conflict', 400, `The rules contradict each other: ${errors.map((e) => e.message).join(' ')}`, {
      fields: { rules: errors.map((e) => e.message).join(' ') },
      problems: errors.map((e) => ({ code: e.code, message: e.message, parts: e.partIds.map((id) => names.get(id) ?? id) })),
    });
  }
  await sequelize.transaction(async (transaction) => {
    await ComponentRule.destroy({ where: {}, transaction });
    if (rules.length) await ComponentRule.bulkCreate(rules, { transaction });
    await audit(transaction, { accountId: null, userId, entity: 'catalogRules', entityId: null, action: 'update', summary: `Replaced the catalog rules (${rules.length} rules)` });
  });
  return { rules: await listRules(), warnings: problems.filter((p) => p.severity === 'warning').map((p) => p.message) };
}
