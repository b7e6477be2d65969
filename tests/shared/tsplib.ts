// Reads TSPLIB instances with EUC_2D weights (G. Reinelt, TSPLIB, ORSA J. Computing 3(4), 1991;
// TSPLIB95 documentation) for the route-optimizer tests and the route benchmark.

import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

export interface TsplibInstance {
  name: string;
  dimension: number;
  edgeWeightType: string;
  coords: { x: number; y: number }[];
}

/** Copies of the TSPLIB reference files (Reinelt 1991), kept in the repository so tests never
 * depend on anything outside it. */
export const TSPLIB_DIR = fileURLToPath(new URL('../fixtures/tsplib/', import.meta.url));

/** Published optimal tour lengths (TSPLIB, Reinelt 1991; also in ../shared/data/tsplib/README.md). */
export const TSPLIB_OPTIMA = { eil51: 426, berlin52: 7542, st70: 675 } as const;
export type TsplibName = keyof typeof TSPLIB_OPTIMA;

export function parseTsplib(text: string): TsplibInstance {
  const header = new Map<string, string>();
  const coords: { x: number; y: number }[] = [];
  let inCoords = false;
  for (const rawLine of text.split(/\r?\n/)) {
    const line = rawLine.trim();
    if (line === '' || line === 'EOF') continue;
    if (line === 'NODE_COORD_SECTION') {
      inCoords = true;
      continue;
    }
    if (inCoords) {
      const [id, x, y] = line.split(/\s+/).map(Number);
      if (![id, x, y].every(Number.isFinite)) throw new Error(`bad coordinate line: ${line}`);
      coords[id - 1] = { x, y };
    } else {
      const colon = line.indexOf(':');
      if (colon > 0) header.set(line.slice(0, colon).trim(), line.slice(colon + 1).trim());
    }
  }
  const dimension = Number(header.get('DIMENSION'));
  const edgeWeightType = header.get('EDGE_WEIGHT_TYPE') ?? '';
  if (edgeWeightType !== 'EUC_2D') throw new Error(`only EUC_2D is supported, got ${edgeWeightType || 'none'}`);
  if (coords.length !== dimension || coords.some((c) => c === undefined)) {
    throw new Error(`expected ${dimension} coordinates, found ${coords.filter(Boolean).length}`);
  }
  return { name: header.get('NAME') ?? '', dimension, edgeWeightType, coords };
}

/** TSPLIB's EUC_2D weight: the Euclidean distance rounded to the nearest integer, nint(√(dx²+dy²)). */
export function euc2d(a: { x: number; y: number }, b: { x: number; y: number }): number {
  return Math.floor(Math.hypot(a.x - b.x, a.y - b.y) + 0.5);
}

export function euc2dMatrix(coords: readonly { x: number; y: number }[]): number[][] {
  return coords.map((a) => coords.map((b) => euc2d(a, b)));
}

export function loadTsplib(name: TsplibName): TsplibInstance {
  return parseTsplib(readFileSync(`${TSPLIB_DIR}${name}.tsp`, 'utf8'));
}
