import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeAccount, makeTerritory, makeUser, signedIn, testApp, type TestApp } from '../helpers/app.js';
import { makeComponent, planterBody } from '../helpers/fleet.js';

let t: TestApp;
beforeAll(async () => {
  t = await testApp();
});
afterAll(async () => t.close());

describe('sizing API', () => {
  it('when explicit inputs are posted, then the published figures come back (AEN-73 and Purdue examples)', async () => {
    const c = await signedIn(t.app, await makeUser('admin'));
    // 12 rows × 30 in = 30 ft; at 5 mph → 18.2 ac/h theoretical (Hancock, Swetnam & Benson, AEN-73,
    // Univ. of Kentucky 1991); × 60 % → 10.9 ac/h (trade-press example). 30-in rows at 32,000 → 6.5 in
    // (Purdue Corn & Soybean Field Guide). 20 gpm at 1,500 psi → 17.5 hp (standard fluid-power relation).
    const res = await c.post('/api/sizing', { rows: 12, rowSpacingIn: 30, speedMph: 5, fieldEfficiency: 0.6, populationPerAcre: 32000, hydraulicLoads: [{ name: 'fan', flowGpm: 20, pressurePsi: 1500 }] });
    expect(res.status).toBe(200);
    expect(res.body.workingWidthFt).toBe(30);
    expect(res.body.theoreticalCapacityAcPerHr).toBeCloseTo(18.2, 1);
    expect(res.body.effectiveCapacityAcPerHr).toBeCloseTo(10.9, 1);
    expect(res.body.seedSpacingIn).toBeCloseTo(6.5, 1);
    expect(res.body.hydraulicHp).toBeCloseTo(17.5, 1);
    expect(res.body).not.toHaveProperty('gpmPerRow');
  });

  it('when inputs are zero, negative, non-numeric or out of range, then 400 names each field', async () => {
    const c = await signedIn(t.app, await makeUser('specialist'));
    const res = await c.post('/api/sizing', { rows: 97, rowSpacingIn: 0, speedMph: -3, fieldEfficiency: 1.2, populationPerAcre: 'lots' });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.details.fields).sort()).toEqual(['fieldEfficiency', 'populationPerAcre', 'rowSpacingIn', 'rows', 'speedMph']);
  });

  it('when a stored planter is sized, then its tractor and installed hydraulic loads are used, within the account scope', async () => {
    const territory = await makeTerritory();
    const account = await makeAccount(territory.id);
    const s = await signedIn(t.app, await makeUser('specialist', { territoryIds: [territory.id] }));
    const tractor = (await s.post(`/api/accounts/${account.id}/tractors`, { name: 'Small', hydraulicFlowGpm: 12, hydraulicPressurePsi: 2750, remoteValves: 3 })).body.tractor;
    const planter = (await s.post(`/api/accounts/${account.id}/planters`, planterBody({ tractorId: tractor.id }))).body.planter;
    const fan = await makeComponent({ category: 'hydraulic-supply', unit: 'planter', hydraulicGpm: 8, name: 'Test vacuum fan' });
    const df = await makeComponent({ category: 'downforce', unit: 'row', hydraulicGpm: 0.5, name: 'Test downforce' });
    await s.post(`/api/planters/${planter.id}/installs`, { componentId: fan.id, scope: 'planter' });
    await s.post(`/api/planters/${planter.id}/installs`, { componentId: df.id, scope: 'all-rows' });
    const res = await s.get(`/api/planters/${planter.id}/sizing?speedMph=6`);
    expect(res.status).toBe(200);
    expect(res.body.input.hydraulicLoads).toEqual([{ name: 'Test vacuum fan', flowGpm: 8 }, { name: 'Test downforce', flowGpm: 8 }]);
    expect(res.body.hydraulic.demandGpm).toBe(16);
    expect(res.body.hydraulic.verdict).toBe('over');
    expect(res.body.hydraulic.recommendAuxPump).toBe(true);
    expect(res.body.workingWidthFt).toBe(40);
    expect(res.body.acresPerFill.liquid).toBeCloseTo(400 / 5, 5); // 2 × 200 gal ÷ 5 GPA (common practice)
    expect(res.body.cautions.length).toBeGreaterThan(0);
    const outsider = await signedIn(t.app, await makeUser('specialist', { territoryIds: [(await makeTerritory()).id] }));
    expect((await outsider.get(`/api/planters/${planter.id}/sizing`)).status).toBe(404);
    expect((await s.get(`/api/planters/${planter.id}/sizing?fieldEfficiency=1.5`)).status).toBe(400);
  });
});
