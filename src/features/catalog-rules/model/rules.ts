import type { RuleInput } from '@shared/schemas/roadmap';
import type { ComponentRule, RuleKind } from '../api/rules';

/** A rule being edited: the API's fields plus a key that survives reordering. */
export interface DraftRule extends RuleInput {
  key: string;
}

export interface PartRef {
  id: number;
  partNumber: string;
  name: string;
}

export const RULE_KIND_LABELS: Record<RuleKind, string> = {
  requires: 'Requires',
  'conflicts-with': 'Conflicts with',
  supersedes: 'Supersedes (removes)',
  provides: 'Provides',
  'prepares-for': 'Prepares for',
};

export const RULE_KIND_HINTS: Record<RuleKind, string> = {
  requires: 'Works only while another part, or some part giving a capability, is on the planter.',
  'conflicts-with': 'The two parts cannot be on one planter at once.',
  supersedes: 'Installing this part takes the other off; its remaining value is thrown away.',
  provides: 'Gives the planter a capability that goals ask for.',
  'prepares-for': 'Bought first, it makes the later part cheaper or quicker to fit.',
};

export function fromServer(rule: ComponentRule): DraftRule {
  return {
    key: `r${rule.id}`,
    componentId: rule.componentId,
    kind: rule.kind,
    targetComponentId: rule.targetComponentId,
    capability: rule.capability,
    labourHoursSavedPerUnit: rule.labourHoursSavedPerUnit,
    partsUsdSavedPerUnit: rule.partsUsdSavedPerUnit,
  };
}

/** The body the server takes: only the fields the rule's kind uses. */
export function toInput(rule: DraftRule): RuleInput {
  const base = { componentId: rule.componentId, kind: rule.kind, targetComponentId: null, capability: null, labourHoursSavedPerUnit: null, partsUsdSavedPerUnit: null };
  switch (rule.kind) {
    case 'provides':
      return { ...base, capability: rule.capability };
    case 'requires':
      return rule.targetComponentId ? { ...base, targetComponentId: rule.targetComponentId } : { ...base, capability: rule.capability };
    case 'prepares-for':
      return { ...base, targetComponentId: rule.targetComponentId, labourHoursSavedPerUnit: rule.labourHoursSavedPerUnit ?? 0, partsUsdSavedPerUnit: rule.partsUsdSavedPerUnit ?? 0 };
    default:
      return { ...base, targetComponentId: rule.targetComponentId };
  }
}

export const partLabel = (part: PartRef | undefined, id: number | null) => (part ? `${part.partNumber} ${part.name}` : id === null ? '—' : `Part #${id}`);

/** "Requires KR-HC-100 Row-drive controller module", "Provides electric-drive", … */
export function describeRule(rule: RuleInput, parts: Map<number, PartRef>): string {
  const target = partLabel(parts.get(rule.targetComponentId ?? -1), rule.targetComponentId);
  switch (rule.kind) {
    case 'provides':
      return `Provides “${rule.capability}”`;
    case 'requires':
      return rule.targetComponentId ? `Requires ${target}` : `Requires a part that provides “${rule.capability}”`;
    case 'conflicts-with':
      return `Conflicts with ${target}`;
    case 'supersedes':
      return `Supersedes ${target}`;
    case 'prepares-for': {
      const saves = [rule.labourHoursSavedPerUnit ? `${rule.labourHoursSavedPerUnit} h` : null, rule.partsUsdSavedPerUnit ? `$${rule.partsUsdSavedPerUnit}` : null].filter(Boolean);
      return `Prepares for ${target}${saves.length ? ` (saves ${saves.join(' and ')} per unit)` : ''}`;
    }
  }
}

/** Rules grouped under their part, parts in part-number order, kinds in a fixed order within. */
export function groupByPart(rules: DraftRule[], parts: Map<number, PartRef>): { part: PartRef; componentId: number; rules: DraftRule[] }[] {
  const order: RuleKind[] = ['provides', 'requires', 'supersedes', 'conflicts-with', 'prepares-for'];
  const groups = new Map<number, DraftRule[]>();
  for (const r of rules) groups.set(r.componentId, [...(groups.get(r.componentId) ?? []), r]);
  return [...groups.entries()]
    .map(([componentId, list]) => ({
      componentId,
      part: parts.get(componentId) ?? { id: componentId, partNumber: `#${componentId}`, name: 'Unknown part' },
      rules: [...list].sort((a, b) => order.indexOf(a.kind) - order.indexOf(b.kind)),
    }))
    .sort((a, b) => a.part.partNumber.localeCompare(b.part.partNumber));
}

/** What changed against the saved set, for the save button: "2 added, 1 removed". */
export function draftChanges(saved: DraftRule[], draft: DraftRule[]): { added: number; removed: number } {
  const sig = (r: DraftRule) => JSON.stringify(toInput(r));
  const left = saved.map(sig);
  const right = draft.map(sig);
  const count = (xs: string[]) => xs.reduce((m, x) => m.set(x, (m.get(x) ?? 0) + 1), new Map<string, number>());
  const l = count(left);
  const r = count(right);
  let added = 0;
  let removed = 0;
  for (const [k, n] of r) added += Math.max(0, n - (l.get(k) ?? 0));
  for (const [k, n] of l) removed += Math.max(0, n - (r.get(k) ?? 0));
  return { added, removed };
}
