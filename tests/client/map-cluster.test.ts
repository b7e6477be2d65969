// Grid clustering is plain geometry (common practice for map marker clustering; no published
// worked example): the checks below are exact pixel cases worked by hand, plus properties that
// must hold for any input.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { clusterByGrid, type ScreenPoint } from '@/features/map/model/cluster';

const pt = (id: number, x: number, y: number): ScreenPoint<number> => ({ item: id, x, y });
const groups = (clusters: { items: number[] }[]) => clusters.map((c) => [...c.items].sort((a, b) => a - b)).sort((a, b) => a[0] - b[0]);

describe('grid clustering of map markers', () => {
  it('when markers sit far apart, then each stays on its own', () => {
    const clusters = clusterByGrid([pt(1, 10, 10), pt(2, 300, 10), pt(3, 10, 300)], 48);
    expect(groups(clusters)).toEqual([[1], [2], [3]]);
  });

  it('when three markers share a grid cell, then they become one cluster at their centroid', () => {
    const clusters = clusterByGrid([pt(1, 5, 5), pt(2, 20, 8), pt(3, 11, 32)], 48);
    expect(groups(clusters)).toEqual([[1, 2, 3]]);
    expect(clusters[0].x).toBeCloseTo(12, 10);
    expect(clusters[0].y).toBeCloseTo(15, 10);
  });

  it('when two markers straddle a cell edge a few pixels apart, then the neighbouring cell is taken in', () => {
    // 46 px and 50 px fall in cells 0 and 1 (48 px wide), 4 px apart.
    expect(groups(clusterByGrid([pt(1, 46, 10), pt(2, 50, 10)], 48))).toEqual([[1, 2]]);
  });

  it('when neighbouring cells hold markers more than a cell apart, then they stay separate', () => {
    // Cells 0 and 1, centres 2 px and 94 px: 92 px apart, more than the 48 px cell.
    expect(groups(clusterByGrid([pt(1, 2, 10), pt(2, 94, 10)], 48))).toEqual([[1], [2]]);
  });

  it('when the map zooms in one step (pixels double), then a cluster of two splits', () => {
    const at = (scale: number) => [pt(1, 100 * scale, 100 * scale), pt(2, 130 * scale, 100 * scale)];
    expect(groups(clusterByGrid(at(1), 48))).toEqual([[1, 2]]);
    expect(groups(clusterByGrid(at(2), 48))).toEqual([[1], [2]]);
  });

  it('when the fullest cell grows first, then a crowded cell takes in a lone neighbour rather than the reverse', () => {
    const clusters = clusterByGrid([pt(1, 50, 10), pt(2, 52, 12), pt(3, 54, 14), pt(4, 40, 10)], 48);
    expect(clusters).toHaveLength(1);
    expect(clusters[0].key).toBe('1:0');
  });

  it('when a position is not a number, then that marker is left out instead of breaking the view', () => {
    expect(groups(clusterByGrid([pt(1, Number.NaN, 4), pt(2, 4, 4)], 48))).toEqual([[2]]);
  });

  it('when the cell size is not positive, then it refuses', () => {
    expect(() => clusterByGrid([pt(1, 0, 0)], 0)).toThrow(RangeError);
  });

  it('when any set of markers is clustered, then every marker is in exactly one cluster and no cluster spans more than 3 × 3 cells', () => {
    const cell = 40;
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.integer({ min: 0, max: 800 }), fc.integer({ min: 0, max: 600 })), { maxLength: 120 }), (xy) => {
        const points = xy.map(([x, y], i) => pt(i, x, y));
        const clusters = clusterByGrid(points, cell);
        const seen = clusters.flatMap((c) => c.items).sort((a, b) => a - b);
        expect(seen).toEqual(points.map((p) => p.item));
        for (const c of clusters) {
          const members = c.items.map((i) => points[i]);
          for (const a of members) for (const b of members) expect(Math.hypot(a.x - b.x, a.y - b.y)).toBeLessThan(3 * Math.SQRT2 * cell);
        }
      }),
      { numRuns: 200 },
    );
  });

  it('when the same markers come in another order, then the same clusters come out', () => {
    const points = [pt(1, 5, 5), pt(2, 60, 8), pt(3, 200, 200), pt(4, 210, 190), pt(5, 47, 47)];
    expect(groups(clusterByGrid(points, 48))).toEqual(groups(clusterByGrid([...points].reverse(), 48)));
  });
});
