import { describe, expect, it } from 'vitest';
import { ruleSchema } from '@shared/schemas/roadmap';
import { describeRule, draftChanges, fromServer, groupByPart, toInput, type DraftRule, type PartRef } from '@/features/catalog-rules/model/rules';

const parts = new Map<number, PartRef>([
  [4, { id: 4, partNumber: 'KR-ED-300', name: 'Electric row drive' }],
  [24, { id: 24, partNumber: 'KR-HC-100', name: 'Row-drive controller module' }],
  [5, { id: 5, partNumber: 'KR-HD-200', name: 'Hydraulic drive' }],
]);

const rule = (over: Partial<DraftRule>): DraftRule => ({
  key: over.key ?? 'k',
  componentId: 4,
  kind: 'requires',
  targetComponentId: 24,
  capability: null,
  labourHoursSavedPerUnit: null,
  partsUsdSavedPerUnit: null,
  ...over,
});

describe('part rules on screen', () => {
  it('when a rule names another part, then it reads with that part’s number and name', () => {
    expect(describeRule(rule({}), parts)).toBe('Requires KR-HC-100 Row-drive controller module');
    expect(describeRule(rule({ kind: 'supersedes', targetComponentId: 5 }), parts)).toBe('Supersedes KR-HD-200 Hydraulic drive');
    expect(describeRule(rule({ kind: 'requires', targetComponentId: null, capability: 'electric-drive' }), parts)).toBe('Requires a part that provides “electric-drive”');
    expect(describeRule(rule({ kind: 'prepares-for', targetComponentId: 5, labourHoursSavedPerUnit: 0.5, partsUsdSavedPerUnit: 20 }), parts)).toBe(
      'Prepares for KR-HD-200 Hydraulic drive (saves 0.5 h and $20 per unit)',
    );
  });

  it('when rules are grouped, then each part lists its own, parts in part-number order and capabilities first', () => {
    const groups = groupByPart(
      [rule({ key: 'a', componentId: 5, kind: 'provides', targetComponentId: null, capability: 'rate-control' }), rule({ key: 'b' }), rule({ key: 'c', kind: 'provides', targetComponentId: null, capability: 'electric-drive' })],
      parts,
    );
    expect(groups.map((g) => g.part.partNumber)).toEqual(['KR-ED-300', 'KR-HD-200']);
    expect(groups[0].rules.map((r) => r.key)).toEqual(['c', 'b']);
  });

  it('when a rule goes to the server, then only the fields of its kind are sent and the shared schema accepts it', () => {
    const provides = toInput(rule({ kind: 'provides', targetComponentId: 24, capability: 'electric-drive' }));
    expect(provides).toEqual({ componentId: 4, kind: 'provides', targetComponentId: null, capability: 'electric-drive', labourHoursSavedPerUnit: null, partsUsdSavedPerUnit: null });
    expect(ruleSchema.safeParse(provides).success).toBe(true);
    const requires = toInput(rule({ capability: 'left-over' }));
    expect(requires.capability).toBeNull();
    expect(ruleSchema.safeParse(requires).success).toBe(true);
  });

  it('when the draft differs from the saved set, then the changes are counted both ways, duplicates included', () => {
    const saved = [rule({ key: 'r1' }), rule({ key: 'r2', kind: 'provides', targetComponentId: null, capability: 'x' })];
    expect(draftChanges(saved, saved)).toEqual({ added: 0, removed: 0 });
    expect(draftChanges(saved, [saved[0]])).toEqual({ added: 0, removed: 1 });
    expect(draftChanges(saved, [...saved, rule({ key: 'new-1' })])).toEqual({ added: 1, removed: 0 });
  });

  it('when the server lists a rule, then the draft keeps its values under a stable key', () => {
    const d = fromServer({ id: 7, componentId: 4, kind: 'conflicts-with', targetComponentId: 5, capability: null, labourHoursSavedPerUnit: null, partsUsdSavedPerUnit: null });
    expect(d.key).toBe('r7');
    expect(describeRule(d, parts)).toBe('Conflicts with KR-HD-200 Hydraulic drive');
  });
});
