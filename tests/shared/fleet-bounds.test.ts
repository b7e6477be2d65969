// Absurd sizes get a message on their own field instead of reaching the database (where a value
// past the column's precision would be refused without saying which field). The limits are far
// above any row-crop tractor, planter or part (common practice).
import { describe, expect, it } from 'vitest';
import { componentSchema, planterSchema, tractorSchema } from '../../shared/schemas/fleet.js';
import { planterBody } from '../helpers/fleet.js';

const fieldsOf = (result: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) =>
  Object.fromEntries((result.error?.issues ?? []).map((i) => [i.path.join('.'), i.message]));

describe('fleet field limits', () => {
  it('when a tractor claims 10,000 gpm, 90,000 psi and 50,000 hp, then each field says its limit; a large real tractor passes', () => {
    const tractor = { name: 'Test', modelYear: 2020, hydraulicFlowGpm: 10_000, hydraulicPressurePsi: 90_000, remoteValves: 6, ptoHp: 50_000 };
    expect(fieldsOf(tractorSchema.safeParse(tractor))).toEqual({
      hydraulicFlowGpm: 'Hydraulic flow must be at most 250 gpm',
      hydraulicPressurePsi: 'Hydraulic pressure must be at most 6,000 psi',
      ptoHp: 'PTO horsepower must be at most 1,000 hp',
    });
    expect(tractorSchema.safeParse({ ...tractor, hydraulicFlowGpm: 113, hydraulicPressurePsi: 3300, ptoHp: 540 }).success).toBe(true);
  });

  it('when a part costs more than a million dollars or takes 10,000 hours to fit, then price and labour say their limits', () => {
    const part = { category: 'seed-meter', name: 'Test meter', maker: 'Test Works', partNumber: 'T-1', priceUsd: 5_000_000, labourHours: 10_000, expectedLifeYears: 10, unit: 'row', hydraulicGpm: 1_000, crops: [], movesToNewToolbar: true };
    expect(fieldsOf(componentSchema.safeParse(part))).toMatchObject({
      priceUsd: 'Price must be at most $1,000,000',
      labourHours: 'Install labour must be at most 500 h',
      hydraulicGpm: 'Hydraulic demand must be at most 100 gpm',
    });
  });

  it('when a planter has a 20,000-gallon tank and a 500-ft toolbar, then those fields say their limits', () => {
    const body = planterBody();
    const result = planterSchema.safeParse({ ...body, liquidTankGallons: 20_000, toolbars: body.toolbars.map((t) => ({ ...t, sizeFt: 500 })) });
    expect(fieldsOf(result)).toMatchObject({ liquidTankGallons: 'Tank size must be at most 10,000 gal', 'toolbars.0.sizeFt': 'Toolbar size must be at most 200 ft' });
    expect(planterSchema.safeParse(body).success).toBe(true);
  });
});
