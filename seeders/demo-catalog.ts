// The demo component catalog: invented makers and invented dealer part numbers. Prices, labour
// hours and lives are round figures for the demo only, not quotations of any real product.
import type { ComponentInput } from '../shared/schemas/fleet.js';

export const CATALOG: ComponentInput[] = [
  // seed meters
  { category: 'seed-meter', name: 'Vacuum seed meter, standard disc', maker: 'Tallrow Works', partNumber: 'KR-SM-110', priceUsd: 385, labourHours: 0.5, expectedLifeYears: 10, unit: 'row', hydraulicGpm: null, ratedMaxSpeedMph: null, maxSeedsPerSecond: 15, crops: ['corn', 'soybean', 'sorghum'], movesToNewToolbar: true, active: true },
  { category: 'seed-meter', name: 'High-speed singulating meter', maker: 'Tallrow Works', partNumber: 'KR-SM-220', priceUsd: 520, labourHours: 0.6, expectedLifeYears: 10, unit: 'row', hydraulicGpm: null, ratedMaxSpeedMph: null, maxSeedsPerSecond: 28, crops: ['corn', 'soybean'], movesToNewToolbar: true, active: true },
  { category: 'seed-meter', name: 'Finger-pickup mechanical meter', maker: 'Loessfield Equipment', partNumber: 'KR-SM-040', priceUsd: 240, labourHours: 0.5, expectedLifeYears: 8, unit: 'row', hydraulicGpm: null, ratedMaxSpeedMph: 5.5, maxSeedsPerSecond: null, crops: ['corn'], movesToNewToolbar: true, active: true },
  // meter drives
  { category: 'meter-drive', name: 'Electric row drive', maker: 'Ninebark Ag Systems', partNumber: 'KR-ED-300', priceUsd: 640, labourHours: 1.0, expectedLifeYears: 10, unit: 'row', hydraulicGpm: null, ratedMaxSpeedMph: null, maxSeedsPerSecond: null, crops: ['corn', 'soybean', 'sorghum'], movesToNewToolbar: true, active: true },
  { category: 'meter-drive', name: 'Hydraulic variable-rate drive, per section', maker: 'Quarry Creek Mfg.', partNumber: 'KR-HD-150', priceUsd: 2900, labourHours: 6, expectedLifeYears: 12, unit: 'toolbar', hydraulicGpm: 6, ratedMaxSpeedMph: null, maxSeedsPerSecond: null, crops: ['corn', 'soybean', 'sorghum'], movesToNewToolbar: false, active: true },
  { category: 'meter-drive', name: 'Hydraulic alternator for electric drives', maker: 'Ninebark Ag Systems', partNumber: 'KR-ED-390', priceUsd: 2350, labourHours: 4, expectedLifeYears: 12, unit: 'planter', hydraulicGpm: 9, ratedMaxSpeedMph: null, maxSeedsPerSecond: null, crops: [], movesToNewToolbar: true, active: true },
  // downforce
  { category: 'downforce', name: 'Air-bag downforce kit', maker: 'Loessfield Equipment', partNumber: 'KR-DF-200', priceUsd: 210, labourHours: 0.75, expectedLifeYears: 8, unit: 'row', hydraulicGpm: null, ratedMaxSpeedMph: null, maxSeedsPerSecond: null, crops: [], movesToNewToolbar: true, active: true },
  { category: 'downforce', name: 'Hydraulic downforce cylinder, active control', maker: 'Quarry Creek Mfg.', partNumber: 'KR-DF-410', priceUsd: 780, labourHours: 1.25, expectedLifeYears: 12, unit: 'row', hydraulicGpm: 0.2, ratedMaxSpeedMph: null, maxSeedsPerSecond: null, crops: [], movesToNewToolbar: true, active: true },
  // seed delivery and sensing
  { category: 'seed-delivery', name: 'Belt seed delivery, high-speed', maker: 'Tallrow Works', partNumber: 'KR-SD-500', priceUsd: 890, labourHours: 1.0, expectedLifeYears: 10, unit: 'row', hydraulicGpm: null, ratedMaxSpeedMph: 10, maxSeedsPerSecond: null, crops: ['corn', 'soybean'], movesToNewToolbar: true, active: true },
  { category: 'seed-delivery', name: 'Optical seed tube sensor', maker: 'Ninebark Ag Systems', partNumber: 'KR-SS-050', priceUsd: 95, labourHours: 0.25, expectedLifeYears: 8, unit: 'row', hydraulicGpm: null, ratedMaxSpeedMph: null, maxSeedsPerSecond: null, crops: [], movesToNewToolbar: true, active: true },
  // row cleaners and closing
  { category: 'row-cleaner', name: 'Floating row cleaner', maker: 'Loessfield Equipment', partNumber: 'KR-RC-120', priceUsd: 310, labourHours: 0.75, expectedLifeYears: 10, unit: 'row', hydraulicGpm: null, ratedMaxSpeedMph: null, maxSeedsPerSecond: null, crops: [], movesToNewToolbar: true, active: true },
  { category: 'closing-system', name: 'Spiked closing wheel pair', maker: 'Loessfield Equipment', partNumber: 'KR-CW-030', priceUsd: 145, labourHours: 0.3, expectedLifeYears: 5, unit: 'row', hydraulicGpm: null, ratedMaxSpeedMph: null, maxSeedsPerSecond: null, crops: [], movesToNewToolbar: true, active: true },
  { category: 'closing-system', name: 'Drag chain', maker: 'Loessfield Equipment', partNumber: 'KR-CW-010', priceUsd: 35, labourHours: 0.1, expectedLifeYears: 4, unit: 'row', hydraulicGpm: null, ratedMaxSpeedMph: null, maxSeedsPerSecond: null, crops: [], movesToNewToolbar: true, active: true },
  // liquid
  { category: 'in-furrow-liquid', name: 'In-furrow liquid kit, per row', maker: 'Quarry Creek Mfg.', partNumber: 'KR-IF-600', priceUsd: 165, labourHours: 0.5, expectedLifeYears: 10, unit: 'row', hydraulicGpm: null, ratedMaxSpeedMph: null, maxSeedsPerSecond: null, crops: [], movesToNewToolbar: true, active: true },
  { category: 'in-furrow-liquid', name: 'Liquid pump and rate controller', maker: 'Quarry Creek Mfg.', partNumber: 'KR-IF-610', priceUsd: 3400, labourHours: 5, expectedLifeYears: 12, unit: 'planter', hydraulicGpm: 3, ratedMaxSpeedMph: null, maxSeedsPerSecond: null, crops: [], movesToNewToolbar: true, active: true },
  { category: 'in-furrow-liquid', name: 'Toolbar-mount liquid tank, 300 gal', maker: 'Quarry Creek Mfg.', partNumber: 'KR-LT-300', priceUsd: 2600, labourHours: 6, expectedLifeYears: 15, unit: 'toolbar', hydraulicGpm: null, ratedMaxSpeedMph: null, maxSeedsPerSecond: null, crops: [], movesToNewToolbar: false, active: true },
  { category: 'in-furrow-liquid', name: 'Tractor front-mount liquid tank, 500 gal', maker: 'Quarry Creek Mfg.', partNumber: 'KR-LT-500', priceUsd: 4100, labourHours: 5, expectedLifeYears: 15, unit: 'planter', hydraulicGpm: null, ratedMaxSpeedMph: null, maxSeedsPerSecond: null, crops: [], movesToNewToolbar: true, active: true },
  { category: 'liquid-monitoring', name: 'Liquid flow monitor, per row', maker: 'Ninebark Ag Systems', partNumber: 'KR-LM-220', priceUsd: 120, labourHours: 0.3, expectedLifeYears: 8, unit: 'row', hydraulicGpm: null, ratedMaxSpeedMph: null, maxSeedsPerSecond: null, crops: [], movesToNewToolbar: true, active: true },
  // section control, dry fertilizer, hydraulics, display, wiring
  { category: 'section-control', name: 'Row clutch, air-operated', maker: 'Loessfield Equipment', partNumber: 'KR-SC-070', priceUsd: 260, labourHours: 0.75, expectedLifeYears: 8, unit: 'row', hydraulicGpm: null, ratedMaxSpeedMph: null, maxSeedsPerSecond: null, crops: [], movesToNewToolbar: true, active: true },
  { category: 'dry-fertilizer', name: 'Dry fertilizer hopper, toolbar-mount, 3,000 lb', maker: 'Quarry Creek Mfg.', partNumber: 'KR-DRY-900', priceUsd: 5400, labourHours: 10, expectedLifeYears: 15, unit: 'toolbar', hydraulicGpm: 4, ratedMaxSpeedMph: null, maxSeedsPerSecond: null, crops: [], movesToNewToolbar: false, active: true },
  { category: 'hydraulic-supply', name: 'PTO-driven auxiliary hydraulic pump', maker: 'Quarry Creek Mfg.', partNumber: 'KR-HP-800', priceUsd: 4800, labourHours: 6, expectedLifeYears: 15, unit: 'planter', hydraulicGpm: null, ratedMaxSpeedMph: null, maxSeedsPerSecond: null, crops: [], movesToNewToolbar: true, active: true },
  { category: 'hydraulic-supply', name: 'Hydraulic vacuum fan', maker: 'Tallrow Works', partNumber: 'KR-VF-040', priceUsd: 1450, labourHours: 3, expectedLifeYears: 12, unit: 'planter', hydraulicGpm: 8, ratedMaxSpeedMph: null, maxSeedsPerSecond: null, crops: [], movesToNewToolbar: true, active: true },
  { category: 'display', name: 'Planter monitor display', maker: 'Ninebark Ag Systems', partNumber: 'KR-DS-010', priceUsd: 2800, labourHours: 2, expectedLifeYears: 8, unit: 'planter', hydraulicGpm: null, ratedMaxSpeedMph: null, maxSeedsPerSecond: null, crops: [], movesToNewToolbar: true, active: true },
  { category: 'harness-controller', name: 'Row-drive controller module', maker: 'Ninebark Ag Systems', partNumber: 'KR-HC-100', priceUsd: 1200, labourHours: 3, expectedLifeYears: 10, unit: 'toolbar', hydraulicGpm: null, ratedMaxSpeedMph: null, maxSeedsPerSecond: null, crops: [], movesToNewToolbar: true, active: true },
  { category: 'harness-controller', name: 'Toolbar harness, drive-ready', maker: 'Ninebark Ag Systems', partNumber: 'KR-HC-160', priceUsd: 950, labourHours: 4, expectedLifeYears: 15, unit: 'toolbar', hydraulicGpm: null, ratedMaxSpeedMph: null, maxSeedsPerSecond: null, crops: [], movesToNewToolbar: false, active: true },
];

/** Planter makers for the demo, all invented. */
export const PLANTER_MAKERS = ['Harrowgate Implement', 'Ironvale Mfg.', 'Kessel Plains Machine'];

/** Rules between demo parts, by part number. Capabilities are Rowpath's own words. */
export type DemoRule =
  | { part: string; kind: 'provides'; capability: string }
  | { part: string; kind: 'requires'; target?: string; capability?: string }
  | { part: string; kind: 'supersedes' | 'conflicts-with'; target: string }
  | { part: string; kind: 'prepares-for'; target: string; labourHoursSaved: number; partsUsdSaved: number };

export const RULES: DemoRule[] = [
  { part: 'KR-ED-300', kind: 'provides', capability: 'electric-drive' },
  { part: 'KR-ED-300', kind: 'provides', capability: 'rate-control' },
  { part: 'KR-ED-300', kind: 'provides', capability: 'row-shutoff' },
  { part: 'KR-ED-300', kind: 'requires', target: 'KR-HC-100' },
  { part: 'KR-ED-300', kind: 'requires', target: 'KR-ED-390' },
  { part: 'KR-ED-300', kind: 'supersedes', target: 'KR-HD-150' },
  { part: 'KR-ED-300', kind: 'supersedes', target: 'KR-SC-070' },
  { part: 'KR-HD-150', kind: 'provides', capability: 'rate-control' },
  { part: 'KR-SC-070', kind: 'provides', capability: 'row-shutoff' },
  { part: 'KR-HC-160', kind: 'prepares-for', target: 'KR-ED-300', labourHoursSaved: 0.5, partsUsdSaved: 0 },
  { part: 'KR-SD-500', kind: 'provides', capability: 'high-speed-delivery' },
  { part: 'KR-SD-500', kind: 'requires', capability: 'electric-drive' },
  { part: 'KR-SD-500', kind: 'requires', target: 'KR-SM-220' },
  { part: 'KR-SM-220', kind: 'provides', capability: 'high-speed-metering' },
  { part: 'KR-SM-220', kind: 'supersedes', target: 'KR-SM-110' },
  { part: 'KR-SM-220', kind: 'supersedes', target: 'KR-SM-040' },
  { part: 'KR-DF-410', kind: 'provides', capability: 'active-downforce' },
  { part: 'KR-DF-410', kind: 'supersedes', target: 'KR-DF-200' },
  { part: 'KR-IF-600', kind: 'provides', capability: 'in-furrow-liquid' },
  { part: 'KR-IF-600', kind: 'requires', target: 'KR-IF-610' },
  { part: 'KR-LM-220', kind: 'requires', target: 'KR-IF-600' },
  { part: 'KR-LM-220', kind: 'provides', capability: 'liquid-monitoring' },
  { part: 'KR-LT-300', kind: 'provides', capability: 'fertilizer-capacity' },
  { part: 'KR-LT-500', kind: 'provides', capability: 'fertilizer-capacity' },
  { part: 'KR-DRY-900', kind: 'provides', capability: 'fertilizer-capacity' },
  { part: 'KR-HP-800', kind: 'provides', capability: 'extra-hydraulic-flow' },
  { part: 'KR-SS-050', kind: 'provides', capability: 'seed-sensing' },
];
