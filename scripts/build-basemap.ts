// Builds the offline base layer for the territory map: county shapes and state outlines of Kansas
// (FIPS 20) and Nebraska (31) only, cut from the U.S. counties TopoJSON in `us-atlas` so that the
// map route does not carry the whole country (~840 kB). Output: public/basemap/territory.json
// (GeoJSON FeatureCollection, WGS84 lon/lat).
//
//   npx tsx scripts/build-basemap.ts
import fs from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { feature, mesh } from 'topojson-client';
import type { GeometryCollection, GeometryObject, Topology } from 'topojson-specification';

export const TERRITORY_STATES: Record<string, { name: string; code: string }> = {
  '20': { name: 'Kansas', code: 'KS' },
  '31': { name: 'Nebraska', code: 'NE' },
};
/** 4 decimals ≈ 11 m: far finer than the 1:10,000,000 source, and a third shorter than full floats. */
const DECIMALS = 4;

type Position = number[];
type Geometry = { type: string; coordinates: unknown };

const round = (v: number) => Number(v.toFixed(DECIMALS));

/** Rounds every position and drops points that rounding made equal to the one before. */
function roundCoordinates(value: unknown): unknown {
  if (Array.isArray(value) && typeof value[0] === 'number') return (value as Position).map(round);
  if (Array.isArray(value) && Array.isArray(value[0]) && typeof value[0][0] === 'number') {
    const line = (value as Position[]).map((p) => p.map(round));
    const deduped = line.filter((p, k) => k === 0 || p[0] !== line[k - 1][0] || p[1] !== line[k - 1][1]);
    // A ring needs four positions (first = last); keep the unrounded-count shape if rounding would break it.
    return deduped.length >= 4 || deduped.length === line.length ? deduped : line;
  }
  return Array.isArray(value) ? value.map(roundCoordinates) : value;
}

function bboxOf(features: { geometry: Geometry }[]): [number, number, number, number] {
  const box: [number, number, number, number] = [Infinity, Infinity, -Infinity, -Infinity];
  const walk = (v: unknown) => {
    if (Array.isArray(v) && typeof v[0] === 'number') {
      box[0] = Math.min(box[0], v[0]);
      box[1] = Math.min(box[1], v[1]);
      box[2] = Math.max(box[2], v[0]);
      box[3] = Math.max(box[3], v[1]);
    } else if (Array.isArray(v)) v.forEach(walk);
  };
  for (const f of features) walk(f.geometry.coordinates);
  return box;
}

export function buildBasemap(topology: Topology) {
  const counties = topology.objects.counties as GeometryCollection<{ name: string }>;
  const states = topology.objects.states as GeometryCollection<{ name: string }>;
  const inTerritory = (id: string | number | undefined) => String(id ?? '').slice(0, 2) in TERRITORY_STATES;

  const countyFeatures = counties.geometries
    .filter((g) => inTerritory(g.id) && String(g.id).length === 5)
    .map((g) => {
      const f = feature(topology, g as GeometryObject<{ name: string }>) as unknown as { geometry: Geometry };
      const fips = String(g.id);
      return {
        type: 'Feature' as const,
        id: fips,
        properties: { kind: 'county', fips, name: (g.properties as { name?: string } | undefined)?.name ?? '', state: TERRITORY_STATES[fips.slice(0, 2)].code },
        geometry: { type: f.geometry.type, coordinates: roundCoordinates(f.geometry.coordinates) },
      };
    });
  // A state's outline is every arc of its shape once, as lines (no fill needed under the markers).
  const stateFeatures = states.geometries
    .filter((g) => String(g.id) in TERRITORY_STATES)
    .map((g) => {
      const outline = mesh(topology, g as GeometryObject) as unknown as Geometry;
      const fips = String(g.id);
      return {
        type: 'Feature' as const,
        id: fips,
        properties: { kind: 'state', fips, name: TERRITORY_STATES[fips].name, state: TERRITORY_STATES[fips].code },
        geometry: { type: outline.type, coordinates: roundCoordinates(outline.coordinates) },
      };
    });
  const features = [...stateFeatures, ...countyFeatures];
  return {
    type: 'FeatureCollection' as const,
    bbox: bboxOf(features),
    attribution: 'County and state boundaries: U.S. Census Bureau cartographic boundary files (2017), via the us-atlas package',
    features,
  };
}

const isMain = process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url);
if (isMain) {
  const require = createRequire(import.meta.url);
  const source = require.resolve('us-atlas/counties-10m.json');
  const topology = JSON.parse(fs.readFileSync(source, 'utf8')) as Topology;
  const basemap = buildBasemap(topology);
  const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
  const out = path.join(root, 'public', 'basemap', 'territory.json');
  fs.mkdirSync(path.dirname(out), { recursive: true });
  const text = JSON.stringify(basemap);
  fs.writeFileSync(out, `${text}\n`);
  const counties = basemap.features.filter((f) => f.properties.kind === 'county').length;
  console.log(`Wrote ${path.relative(root, out)}: ${counties} counties, ${basemap.features.length - counties} state outlines, ${(Buffer.byteLength(text) / 1024).toFixed(1)} kB (source ${(fs.statSync(source).size / 1024).toFixed(0)} kB)`);
}
