import { describe, expect, it } from 'vitest';
import { validateRuleSet } from '@shared/calc/catalog-rules';
import type { CatalogPart, PartRule } from '@shared/calc/planner-types';

// Invented catalog: names are generic trade terms, ids are Rowpath's own.
const part = (id: string, name: string): CatalogPart => ({
  id,
  category: 'test',
  name,
  unit: 'row',
  priceUsd: 500,
  labourHours: 1,
  expectedLifeYears: 10,
  movesToNewToolbar: true,
});
const parts = [
  part('RP-CTL', 'Row controller'),
  part('RP-EDR', 'Electric row drive'),
  part('RP-BLT', 'Belt seed delivery'),
  part('RP-MDR', 'Mechanical rate drive'),
  part('RP-HRN', 'Drive harness'),
];

describe('validateRuleSet', () => {
  it('when the rules are consistent, then there are no problems', () => {
    // common practice: a drive needs a controller; a faster delivery needs an electric drive (Rowpath design notes).
    const rules: PartRule[] = [
      { kind: 'requires', partId: 'RP-EDR', requiredPartId: 'RP-CTL' },
      { kind: 'provides', partId: 'RP-EDR', capability: 'electric-drive' },
      { kind: 'requires', partId: 'RP-BLT', requiredCapability: 'electric-drive' },
      { kind: 'supersedes', partId: 'RP-EDR', supersededPartId: 'RP-MDR' },
      { kind: 'preparesFor', partId: 'RP-HRN', laterPartId: 'RP-EDR', labourHoursSavedPerUnit: 0.5, partsUsdSavedPerUnit: 0 },
    ];
    expect(validateRuleSet(parts, rules)).toEqual([]);
  });

  it('when requirements go round in a circle through a part and a sole-provider capability, then the cycle is refused with each part named', () => {
    // common practice: prerequisites must be installable in some order.
    const rules: PartRule[] = [
      { kind: 'requires', partId: 'RP-CTL', requiredPartId: 'RP-EDR' },
      { kind: 'provides', partId: 'RP-BLT', capability: 'high-speed-delivery' },
      { kind: 'requires', partId: 'RP-EDR', requiredCapability: 'high-speed-delivery' },
      { kind: 'requires', partId: 'RP-BLT', requiredPartId: 'RP-CTL' },
    ];
    const problems = validateRuleSet(parts, rules);
    const cycle = problems.find((p) => p.code === 'requires-cycle');
    expect(cycle?.severity).toBe('error');
    expect([...(cycle?.partIds ?? [])].sort()).toEqual(['RP-BLT', 'RP-CTL', 'RP-EDR']);
    expect(cycle?.message).toContain('Row controller');
  });

  it('when a capability has a second provider outside the loop, then the requirement is not a cycle', () => {
    // common practice: a requirement met by either of two parts can be met by the one outside the loop.
    const rules: PartRule[] = [
      { kind: 'requires', partId: 'RP-CTL', requiredPartId: 'RP-EDR' },
      { kind: 'provides', partId: 'RP-CTL', capability: 'rate-control' },
      { kind: 'provides', partId: 'RP-MDR', capability: 'rate-control' },
      { kind: 'requires', partId: 'RP-EDR', requiredCapability: 'rate-control' },
    ];
    expect(validateRuleSet(parts, rules).filter((p) => p.code === 'requires-cycle')).toEqual([]);
  });

  it('when a part both requires and conflicts with the same part, then it is refused naming both', () => {
    // common practice: a prerequisite cannot also be forbidden.
    const rules: PartRule[] = [
      { kind: 'requires', partId: 'RP-BLT', requiredPartId: 'RP-EDR' },
      { kind: 'conflictsWith', partId: 'RP-EDR', otherPartId: 'RP-BLT' },
    ];
    const problems = validateRuleSet(parts, rules);
    expect(problems).toContainEqual(
      expect.objectContaining({ code: 'requires-and-conflicts', severity: 'error', partIds: ['RP-BLT', 'RP-EDR'] }),
    );
  });

  it('when a part requires a capability but conflicts with every provider, then it is refused naming them', () => {
    // common practice: a requirement that no allowed part can meet is a contradiction.
    const rules: PartRule[] = [
      { kind: 'provides', partId: 'RP-EDR', capability: 'electric-drive' },
      { kind: 'requires', partId: 'RP-BLT', requiredCapability: 'electric-drive' },
      { kind: 'conflictsWith', partId: 'RP-BLT', otherPartId: 'RP-EDR' },
    ];
    expect(validateRuleSet(parts, rules)).toContainEqual(
      expect.objectContaining({ code: 'requires-and-conflicts', partIds: ['RP-BLT', 'RP-EDR'] }),
    );
  });

  it('when supersessions go round in a circle, then the cycle is refused with its parts', () => {
    // common practice: "A replaces B" and "B replaces A" cannot both hold.
    const rules: PartRule[] = [
      { kind: 'supersedes', partId: 'RP-EDR', supersededPartId: 'RP-MDR' },
      { kind: 'supersedes', partId: 'RP-MDR', supersededPartId: 'RP-HRN' },
      { kind: 'supersedes', partId: 'RP-HRN', supersededPartId: 'RP-EDR' },
    ];
    const cycle = validateRuleSet(parts, rules).find((p) => p.code === 'supersedes-cycle');
    expect([...(cycle?.partIds ?? [])].sort()).toEqual(['RP-EDR', 'RP-HRN', 'RP-MDR']);
    expect(cycle?.message).toMatch(/supersedes/);
  });

  it('when a part removes the part it requires, then it is refused', () => {
    // common practice: a part cannot depend on what its install takes away.
    const rules: PartRule[] = [
      { kind: 'requires', partId: 'RP-EDR', requiredPartId: 'RP-MDR' },
      { kind: 'supersedes', partId: 'RP-EDR', supersededPartId: 'RP-MDR' },
    ];
    expect(validateRuleSet(parts, rules)).toContainEqual(
      expect.objectContaining({ code: 'supersedes-required-part', partIds: ['RP-EDR', 'RP-MDR'] }),
    );
  });

  it('when two requirements of one part conflict with each other, then the part is named with both', () => {
    // common practice: a part whose prerequisites exclude each other can never work.
    const rules: PartRule[] = [
      { kind: 'requires', partId: 'RP-BLT', requiredPartId: 'RP-EDR' },
      { kind: 'requires', partId: 'RP-BLT', requiredPartId: 'RP-MDR' },
      { kind: 'conflictsWith', partId: 'RP-EDR', otherPartId: 'RP-MDR' },
    ];
    expect(validateRuleSet(parts, rules)).toContainEqual(
      expect.objectContaining({ code: 'requirements-conflict', partIds: ['RP-BLT', 'RP-EDR', 'RP-MDR'] }),
    );
  });

  it('when rules name unknown parts, themselves, or missing capabilities, then each is refused; duplicates only warn', () => {
    // common practice: rules must refer to catalog parts and satisfiable capabilities.
    const rules: PartRule[] = [
      { kind: 'requires', partId: 'RP-EDR', requiredPartId: 'RP-NOPE' },
      { kind: 'conflictsWith', partId: 'RP-CTL', otherPartId: 'RP-CTL' },
      { kind: 'requires', partId: 'RP-BLT', requiredCapability: 'section-control' },
      { kind: 'provides', partId: 'RP-EDR', capability: 'electric-drive' },
      { kind: 'provides', partId: 'RP-EDR', capability: 'electric-drive' },
    ];
    const problems = validateRuleSet(parts, rules);
    expect(problems.map((p) => [p.code, p.partIds])).toEqual([
      ['unknown-part', ['RP-NOPE']],
      ['self-reference', ['RP-CTL']],
      ['capability-without-provider', ['RP-BLT']],
      ['duplicate-rule', ['RP-EDR']],
    ]);
    expect(problems[3].severity).toBe('warning');
  });

  it('when a preparation conflicts with its later part, or saves more than the part, then it is reported', () => {
    // common practice: a harness that cannot stay on with the drive it prepares for saves nothing.
    const rules: PartRule[] = [
      { kind: 'preparesFor', partId: 'RP-HRN', laterPartId: 'RP-EDR', labourHoursSavedPerUnit: 3, partsUsdSavedPerUnit: 0 },
      { kind: 'conflictsWith', partId: 'RP-HRN', otherPartId: 'RP-EDR' },
    ];
    const codes = validateRuleSet(parts, rules).map((p) => p.code);
    expect(codes).toEqual(['prepares-for-conflicting-part', 'saving-exceeds-part']);
  });
});
