import { Component } from '../../server/db/models/index.js';
import type { ComponentInput, PlanterInput } from '../../shared/schemas/fleet.js';
import { uid } from './app.js';

export async function makeComponent(fields: Partial<ComponentInput> = {}) {
  return Component.create({
    category: 'row-cleaner',
    name: `Test part ${uid()}`,
    maker: 'Test Works',
    partNumber: `T-${uid()}`,
    priceUsd: 100,
    labourHours: 0.5,
    expectedLifeYears: 10,
    unit: 'row',
    hydraulicGpm: null,
    ratedMaxSpeedMph: null,
    maxSeedsPerSecond: null,
    crops: [],
    movesToNewToolbar: true,
    ...fields,
  });
}

export const planterBody = (over: Partial<PlanterInput> = {}): PlanterInput => ({
  name: '16-row test planter',
  maker: 'Test Implement',
  modelYear: 2018,
  rows: 16,
  rowSpacingIn: 30,
  frameType: 'three-section-flex',
  foldType: 'stack',
  seedSupplyType: 'central-fill',
  seedCapacityUnits: 60,
  liquidTankCount: 2,
  liquidTankGallons: 200,
  dryCapacityLb: 0,
  markers: false,
  acresPerYear: 2400,
  tractorId: null,
  farmSiteId: null,
  toolbars: [{ name: 'Main bar', sizeFt: 40, firstRow: 1, lastRow: 16 }],
  ...over,
});
