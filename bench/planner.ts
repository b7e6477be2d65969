// Roadmap planner benchmark: an invented account with 4 planters, 15 catalog parts offered on each
// (60 candidates) and 8 seasons, planned N times. Run: npx tsx bench/planner.ts [N]
import { compareWithNaive, planRoadmap } from '../shared/calc/planner';
import type { CatalogPart, PartRule, PlannerGoal, PlannerInput } from '../shared/calc/planner-types';

const FIRST = 2026;
const SEASONS = 8;

function part(id: string, name: string, category: string, unit: CatalogPart['unit'], priceUsd: number, labourHours: number, movesToNewToolbar = true, expectedLifeYears = 10): CatalogPart {
  return { id, category, name, unit, priceUsd, labourHours, expectedLifeYears, movesToNewToolbar };
}

// Invented part numbers and prices for the benchmark only.
const catalog: CatalogPart[] = [
  part('RP-CTL-100', 'Row controller', 'control', 'planter', 3_200, 4),
  part('RP-MRD-110', 'Mechanical rate drive', 'drive', 'planter', 2_400, 6, false),
  part('RP-HRN-120', 'Drive harness', 'drive', 'row', 45, 0.5),
  part('RP-EDR-130', 'Electric row drive', 'drive', 'row', 620, 1.5),
  part('RP-CLU-140', 'Row clutch', 'section', 'row', 180, 0.5),
  part('RP-BLT-150', 'Belt seed delivery', 'delivery', 'row', 690, 1),
  part('RP-SNS-160', 'Seed sensor', 'monitoring', 'row', 95, 0.3),
  part('RP-PDF-170', 'Pneumatic downforce', 'downforce', 'row', 210, 0.8),
  part('RP-HDF-180', 'Hydraulic downforce', 'downforce', 'row', 520, 1.2),
  part('RP-PTO-190', 'Auxiliary PTO hydraulic pump', 'hydraulics', 'planter', 4_800, 6),
  part('RP-LPM-200', 'Liquid pump and tank kit', 'liquid', 'planter', 2_600, 5),
  part('RP-MAN-210', 'Bar-mounted in-furrow manifold', 'liquid', 'toolbar', 3_900, 8, false, 8),
  part('RP-NOZ-220', 'In-furrow nozzle set', 'liquid', 'row', 60, 0.3),
  part('RP-DRY-230', 'Dry fertilizer hopper, standard', 'dry', 'planter', 5_200, 10, false),
  part('RP-DRY-240', 'Dry fertilizer hopper, large', 'dry', 'planter', 8_900, 12, false),
];

const rules: PartRule[] = [
  { kind: 'provides', partId: 'RP-MRD-110', capability: 'rate-control' },
  { kind: 'requires', partId: 'RP-EDR-130', requiredPartId: 'RP-CTL-100' },
  { kind: 'provides', partId: 'RP-EDR-130', capability: 'electric-drive' },
  { kind: 'provides', partId: 'RP-EDR-130', capability: 'rate-control' },
  { kind: 'provides', partId: 'RP-EDR-130', capability: 'section-control' },
  { kind: 'supersedes', partId: 'RP-EDR-130', supersededPartId: 'RP-MRD-110' },
  { kind: 'supersedes', partId: 'RP-EDR-130', supersededPartId: 'RP-CLU-140' },
  { kind: 'preparesFor', partId: 'RP-HRN-120', laterPartId: 'RP-EDR-130', labourHoursSavedPerUnit: 1, partsUsdSavedPerUnit: 0 },
  { kind: 'provides', partId: 'RP-CLU-140', capability: 'section-control' },
  { kind: 'requires', partId: 'RP-CLU-140', requiredPartId: 'RP-CTL-100' },
  { kind: 'provides', partId: 'RP-BLT-150', capability: 'high-speed-delivery' },
  { kind: 'requires', partId: 'RP-BLT-150', requiredCapability: 'electric-drive' },
  { kind: 'requires', partId: 'RP-BLT-150', requiredPartId: 'RP-SNS-160' },
  { kind: 'provides', partId: 'RP-SNS-160', capability: 'seed-sensing' },
  { kind: 'provides', partId: 'RP-PDF-170', capability: 'active-downforce' },
  { kind: 'provides', partId: 'RP-HDF-180', capability: 'active-downforce' },
  { kind: 'provides', partId: 'RP-HDF-180', capability: 'high-speed-downforce' },
  { kind: 'requires', partId: 'RP-HDF-180', requiredCapability: 'aux-hydraulics' },
  { kind: 'supersedes', partId: 'RP-HDF-180', supersededPartId: 'RP-PDF-170' },
  { kind: 'provides', partId: 'RP-PTO-190', capability: 'aux-hydraulics' },
  { kind: 'provides', partId: 'RP-MAN-210', capability: 'in-furrow-liquid' },
  { kind: 'requires', partId: 'RP-MAN-210', requiredPartId: 'RP-LPM-200' },
  { kind: 'requires', partId: 'RP-MAN-210', requiredPartId: 'RP-NOZ-220' },
  { kind: 'provides', partId: 'RP-DRY-230', capability: 'dry-fertilizer' },
  { kind: 'provides', partId: 'RP-DRY-240', capability: 'dry-fertilizer' },
  { kind: 'provides', partId: 'RP-DRY-240', capability: 'large-dry-fertilizer' },
  { kind: 'supersedes', partId: 'RP-DRY-240', supersededPartId: 'RP-DRY-230' },
];

const planters = [
  { id: 'PL-1', name: 'Home 16-row', rows: 16, toolbars: 1 },
  { id: 'PL-2', name: 'River 24-row', rows: 24, toolbars: 1 },
  { id: 'PL-3', name: 'Hill 12-row', rows: 12, toolbars: 1 },
  { id: 'PL-4', name: 'East 16-row', rows: 16, toolbars: 2 },
];

const goal = (id: string, planterId: string, kind: PlannerGoal['kind'], label: string, capabilities: string[], bySeason: number, priority: number): PlannerGoal => ({
  id, planterId, kind, label, capabilities, bySeason, priority,
});

const goals: PlannerGoal[] = [
  goal('G-1A', 'PL-1', 'rates-by-zone', 'Rates by zone', ['rate-control'], 2027, 2),
  goal('G-1B', 'PL-1', 'planting-speed', 'Plant at 6.5 mph', ['high-speed-delivery', 'high-speed-downforce'], 2030, 3),
  goal('G-1C', 'PL-1', 'in-furrow-starter', 'In-furrow starter', ['in-furrow-liquid'], 2029, 2),
  goal('G-2A', 'PL-2', 'rates-by-zone', 'Section control', ['section-control'], 2026, 2),
  goal('G-2B', 'PL-2', 'fertilizer-capacity', 'More dry fertilizer', ['large-dry-fertilizer'], 2031, 1),
  goal('G-2C', 'PL-2', 'acres-per-day', 'Acres per day', ['high-speed-delivery'], 2032, 2),
  goal('G-3A', 'PL-3', 'add-crop', 'Soybeans with downforce', ['active-downforce', 'seed-sensing'], 2027, 1),
  goal('G-3B', 'PL-3', 'in-furrow-starter', 'In-furrow starter', ['in-furrow-liquid'], 2028, 2),
  goal('G-4A', 'PL-4', 'less-labour', 'Electric drives', ['electric-drive'], 2028, 2),
  goal('G-4B', 'PL-4', 'fertilizer-capacity', 'Dry fertilizer', ['dry-fertilizer'], 2027, 1),
  goal('G-4C', 'PL-4', 'planting-speed', 'Plant at 6.5 mph', ['high-speed-delivery', 'high-speed-downforce'], 2033, 3),
];

const input: PlannerInput = {
  fleet: {
    planters,
    installed: [
      { partId: 'RP-MRD-110', planterId: 'PL-2', installedSeason: 2021, pricePaidUsd: 2_300 },
      { partId: 'RP-PDF-170', planterId: 'PL-1', installedSeason: 2023, pricePaidUsd: 3_200 },
      { partId: 'RP-DRY-230', planterId: 'PL-2', installedSeason: 2022, pricePaidUsd: 5_000 },
      { partId: 'RP-SNS-160', planterId: 'PL-4', installedSeason: 2024, pricePaidUsd: 1_500 },
    ],
  },
  goals,
  catalog,
  rules,
  budgetsUsdBySeason: { 2026: 30_000, 2027: 45_000, 2028: 40_000, 2029: 35_000, 2030: 50_000, 2031: 30_000, 2032: 40_000, 2033: 45_000 },
  firstSeason: FIRST,
  horizonSeasons: SEASONS,
  replacements: [
    { season: 2029, planterId: 'PL-1', kind: 'toolbar' },
    { season: 2031, planterId: 'PL-2', kind: 'toolbar' },
  ],
  shopRateUsdPerHour: 115,
  valuation: 'straight-line',
  candidates: planters.flatMap((pl) => catalog.map((p) => ({ partId: p.id, planterId: pl.id }))),
};

const runs = Math.max(1, Number(process.argv[2] ?? 20));
const timesMs: number[] = [];
// CPU time as well as wall time: on a shared machine the wall clock also counts other people's work.
const cpuMs: number[] = [];
// Three untimed warm-up runs: the first calls pay for just-in-time compilation.
let last = planRoadmap(input);
for (let i = 0; i < 2; i += 1) last = planRoadmap(input);
for (let i = 0; i < runs; i += 1) {
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  last = planRoadmap(input);
  timesMs.push(performance.now() - t0);
  const c = process.cpuUsage(c0);
  cpuMs.push((c.user + c.system) / 1000);
}
const medianOf = (values: number[]): number => {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
};
const median = medianOf(timesMs);
const max = Math.max(...timesMs);

console.log(`planner: ${planters.length} planters, ${input.candidates!.length} candidates, ${SEASONS} seasons, ${goals.length} goals, ${runs} timed runs after 3 warm-ups`);
console.log(`median ${median.toFixed(1)} ms, max ${max.toFixed(1)} ms (target ≤ 200 ms) — ${max <= 200 ? 'within target' : 'OVER target'}`);
console.log(`cpu time: median ${medianOf(cpuMs).toFixed(1)} ms, max ${Math.max(...cpuMs).toFixed(1)} ms`);
console.log(`search: ${last.search.method}, ${last.search.nodesExplored} nodes; items ${last.seasons.reduce((n, s) => n + s.items.length, 0)}`);
console.log(
  `objective: priority met ${last.objective.goalPriorityMetByDeadline} by deadline + ${last.objective.goalPriorityMetLate} late, waste $${last.wasteUsd}, cost $${last.totalCostUsd}`,
);
for (const row of compareWithNaive(input)) {
  console.log(`  ${row.strategy.padEnd(14)} waste $${row.wasteUsd.toFixed(0).padStart(6)}  cost $${row.totalCostUsd.toFixed(0).padStart(7)}  priority met ${row.goalPriorityMetByDeadline}`);
}
