import { describe, expect, it } from 'vitest';
import {
  drawingLayout,
  installTimeline,
  installsOnPlanter,
  installsOnRow,
  installsOnToolbar,
  placementText,
  rowAccessibleName,
  rowSetups,
  toolbarAccessibleName,
  type LayoutInstall,
  type LayoutToolbar,
} from '@/features/planters/lib/planter-layout';

const mainBar: LayoutToolbar = { id: 10, name: 'Main bar', sizeFt: 40, firstRow: 1, lastRow: 16, position: 1 };

let nextId = 1;
function install(over: Partial<LayoutInstall> & { name: string; category: NonNullable<LayoutInstall['component']>['category'] }): LayoutInstall {
  const { name, category, ...rest } = over;
  const id = nextId++;
  return {
    id,
    scope: 'all-rows',
    toolbarId: null,
    rowFrom: null,
    rowTo: null,
    status: 'installed',
    installDate: null,
    removedDate: null,
    component: { id: 100 + id, name, category },
    ...rest,
  };
}

describe('what sits on each row, toolbar and planter', () => {
  const meter = install({ name: 'Vacuum seed meter', category: 'seed-meter' });
  const cleaner = install({ name: 'Floating row cleaner', category: 'row-cleaner', scope: 'rows', rowFrom: 1, rowTo: 8 });
  const controller = install({ name: 'Row-drive controller module', category: 'harness-controller', scope: 'toolbar', toolbarId: 10 });
  const display = install({ name: 'Planter monitor display', category: 'display', scope: 'planter' });
  const oldChain = install({ name: 'Drag chain', category: 'closing-system', status: 'removed', removedDate: '2025-04-01' });
  const all = [meter, cleaner, controller, display, oldChain];

  it('when a part is on every row and another on rows 1–8, then row 5 has both (cleaner first, as it rides ahead of the meter) and row 12 only the meter', () => {
    expect(installsOnRow(all, 5).map((i) => i.component!.name)).toEqual(['Floating row cleaner', 'Vacuum seed meter']);
    expect(installsOnRow(all, 12).map((i) => i.component!.name)).toEqual(['Vacuum seed meter']);
  });

  it('when a part was removed, then no row counts it any more', () => {
    expect(installsOnRow(all, 3).some((i) => i.component!.name === 'Drag chain')).toBe(false);
  });

  it('when parts sit on a toolbar or the whole planter, then they are on neither a row nor the other level', () => {
    expect(installsOnToolbar(all, 10).map((i) => i.id)).toEqual([controller.id]);
    expect(installsOnToolbar(all, 11)).toEqual([]);
    expect(installsOnPlanter(all).map((i) => i.id)).toEqual([display.id]);
    expect(installsOnRow(all, 1).some((i) => i.scope === 'toolbar' || i.scope === 'planter')).toBe(false);
  });

  it('when the rows are read aloud, then each names its row and its parts, or says nothing is installed', () => {
    expect(rowAccessibleName(5, all)).toBe('Row 5: Floating row cleaner; Vacuum seed meter');
    expect(rowAccessibleName(9, all)).toBe('Row 9: Vacuum seed meter');
    expect(rowAccessibleName(4, [])).toBe('Row 4: nothing installed');
    expect(toolbarAccessibleName(mainBar, all)).toBe('Main bar, 40 ft, rows 1–16: Row-drive controller module');
  });

  it('when rows 1–8 differ from rows 9–16, then the set-ups come out as two runs', () => {
    const runs = rowSetups(16, all);
    expect(runs.map((r) => [r.fromRow, r.toRow])).toEqual([
      [1, 8],
      [9, 16],
    ]);
    expect(runs[0].names).toEqual(['Floating row cleaner', 'Vacuum seed meter']);
    expect(runs[1].names).toEqual(['Vacuum seed meter']);
  });

  it('when a range of rows sits in the middle, then three runs come out and each row is in exactly one', () => {
    const mid = install({ name: 'Air-bag downforce kit', category: 'downforce', scope: 'rows', rowFrom: 7, rowTo: 10 });
    const runs = rowSetups(16, [meter, mid]);
    expect(runs.map((r) => [r.fromRow, r.toRow])).toEqual([
      [1, 6],
      [7, 10],
      [11, 16],
    ]);
  });

  it('when placements are put in words, then each scope reads as the specialist would say it', () => {
    expect(placementText(meter, [mainBar])).toBe('every row');
    expect(placementText(cleaner, [mainBar])).toBe('rows 1–8');
    expect(placementText({ scope: 'rows', rowFrom: 3, rowTo: 3, toolbarId: null }, [mainBar])).toBe('row 3');
    expect(placementText(controller, [mainBar])).toBe('Main bar');
    expect(placementText(display, [mainBar])).toBe('the whole planter');
  });
});

describe('the install timeline', () => {
  it('when parts were installed and one later removed, then events run newest first and undated ones come last', () => {
    const a = install({ name: 'A', category: 'seed-meter', installDate: '2019-03-10', status: 'removed', removedDate: '2024-02-01' });
    const b = install({ name: 'B', category: 'row-cleaner', installDate: '2022-04-15' });
    const c = install({ name: 'C', category: 'downforce', installDate: null });
    const events = installTimeline([a, b, c]);
    expect(events.map((e) => `${e.install.component!.name}:${e.kind}:${e.date}`)).toEqual([
      'A:removed:2024-02-01',
      'B:installed:2022-04-15',
      'A:installed:2019-03-10',
      'C:installed:null',
    ]);
  });
});

describe('where the drawing puts toolbars and row units', () => {
  it('when a 16-row 30-in planter has one 40 ft bar, then the bar spans 40 ft and row units sit 30 in (2.5 ft) apart', () => {
    // Working width = rows × spacing: 16 rows × 30 in = 40 ft (common practice; REFERENCES "Facts of the trade").
    const layout = drawingLayout({ rows: 16, rowSpacingIn: 30, toolbars: [mainBar], availableWidthPx: 900 });
    expect(layout.lanes).toHaveLength(1);
    const bar = layout.lanes[0].bars[0];
    expect(bar.widthPx / layout.pxPerFt).toBeCloseTo(40, 6);
    expect(bar.rows.map((r) => r.row)).toEqual(Array.from({ length: 16 }, (_, i) => i + 1));
    expect((bar.rows[1].cxPx - bar.rows[0].cxPx) / layout.pxPerFt).toBeCloseTo(2.5, 6);
    // It fills the room it is given: 900 px less the side padding.
    expect(layout.widthPx).toBeCloseTo(900, 6);
    expect(layout.folds).toBe(1);
  });

  it('when 48 rows would be cramped in 900 px, then the bar folds onto two lines of 24 row units that fit the width and keep at least the minimum pitch', () => {
    const bar48: LayoutToolbar = { id: 1, name: 'Main bar', sizeFt: 120, firstRow: 1, lastRow: 48, position: 1 };
    const layout = drawingLayout({ rows: 48, rowSpacingIn: 30, toolbars: [bar48], availableWidthPx: 900, minPitchPx: 26 });
    expect(layout.folds).toBe(2);
    expect(layout.lanes.map((l) => [l.part, l.parts, l.bars[0].rows.length])).toEqual([
      [1, 2, 24],
      [2, 2, 24],
    ]);
    expect(layout.widthPx).toBeLessThanOrEqual(900);
    expect(layout.lanes[1].bars[0].rows[0].row).toBe(25);
    // The first line's bar is cut on its right, the second's on its left: the bar goes on.
    expect([layout.lanes[0].bars[0].cutRight, layout.lanes[1].bars[0].cutLeft]).toEqual([true, true]);
    for (const lane of layout.lanes) {
      const cx = lane.bars[0].rows.map((r) => r.cxPx);
      expect(Math.min(...cx.slice(1).map((x, i) => x - cx[i]))).toBeGreaterThanOrEqual(26 - 1e-9);
      expect(Math.min(...cx)).toBeGreaterThan(0);
      expect(Math.max(...cx)).toBeLessThan(layout.widthPx);
    }
  });

  it('when folding is turned off, then 48 rows keep the minimum pitch on one line and the drawing grows wider (it scrolls)', () => {
    const bar48: LayoutToolbar = { id: 1, name: 'Main bar', sizeFt: 120, firstRow: 1, lastRow: 48, position: 1 };
    const layout = drawingLayout({ rows: 48, rowSpacingIn: 30, toolbars: [bar48], availableWidthPx: 900, minPitchPx: 26, maxFolds: 1 });
    expect(layout.folds).toBe(1);
    expect(layout.pitchPx).toBeCloseTo(26, 6);
    expect(layout.widthPx).toBeGreaterThan(900);
  });

  it('when a 4-row planter gets a wide screen, then its row units stay at most the maximum pitch apart', () => {
    const bar4: LayoutToolbar = { id: 1, name: 'Bar', sizeFt: 10, firstRow: 1, lastRow: 4, position: 1 };
    const layout = drawingLayout({ rows: 4, rowSpacingIn: 30, toolbars: [bar4], availableWidthPx: 1200, maxPitchPx: 76 });
    expect(layout.pitchPx).toBeCloseTo(76, 6);
    expect(layout.widthPx).toBeLessThan(1200);
  });

  it('when three sections add up to the working width, then they sit side by side in one line, rows left to right', () => {
    const wings: LayoutToolbar[] = [
      { id: 1, name: 'Left wing', sizeFt: 15, firstRow: 1, lastRow: 6, position: 1 },
      { id: 2, name: 'Centre', sizeFt: 10, firstRow: 7, lastRow: 10, position: 2 },
      { id: 3, name: 'Right wing', sizeFt: 15, firstRow: 11, lastRow: 16, position: 3 },
    ];
    const layout = drawingLayout({ rows: 16, rowSpacingIn: 30, toolbars: wings, availableWidthPx: 1000 });
    expect(layout.sideBySide).toBe(true);
    expect(layout.lanes).toHaveLength(1);
    const xs = layout.lanes[0].bars.flatMap((b) => b.rows.map((r) => r.cxPx));
    expect(xs).toEqual([...xs].sort((a, b) => a - b));
    expect(layout.lanes[0].bars.map((b) => b.rows.length)).toEqual([6, 4, 6]);
  });

  it('when a split-row planter has a front and a rear bar each as wide as the planter, then they are drawn one under the other', () => {
    // 31 rows × 15 in = 38.75 ft working width; each bar is about that wide, so together they are twice it.
    const split: LayoutToolbar[] = [
      { id: 1, name: 'Front bar', sizeFt: 39, firstRow: 1, lastRow: 16, position: 1 },
      { id: 2, name: 'Rear bar', sizeFt: 39, firstRow: 17, lastRow: 31, position: 2 },
    ];
    const layout = drawingLayout({ rows: 31, rowSpacingIn: 15, toolbars: split, availableWidthPx: 1000 });
    expect(layout.sideBySide).toBe(false);
    expect(layout.lanes.map((l) => l.bars.map((b) => b.toolbar?.name))).toEqual([['Front bar'], ['Rear bar']]);
    expect(layout.lanes[1].bars[0].rows[0].row).toBe(17);
  });

  it('when no toolbar claims some rows, then they are drawn on a bar of their own and no row goes missing', () => {
    const short: LayoutToolbar = { id: 1, name: 'Main bar', sizeFt: 30, firstRow: 1, lastRow: 12, position: 1 };
    const layout = drawingLayout({ rows: 16, rowSpacingIn: 30, toolbars: [short], availableWidthPx: 900 });
    const all = layout.lanes.flatMap((l) => l.bars.flatMap((b) => b.rows.map((r) => r.row)));
    expect(all.sort((a, b) => a - b)).toEqual(Array.from({ length: 16 }, (_, i) => i + 1));
    expect(layout.lanes.flatMap((l) => l.bars).find((b) => b.toolbar === null)?.rows.map((r) => r.row)).toEqual([13, 14, 15, 16]);
  });

  it('when a split-row planter is shown on a narrow tablet, then each bar folds on its own and every row unit still appears exactly once', () => {
    const split: LayoutToolbar[] = [
      { id: 1, name: 'Front bar', sizeFt: 39, firstRow: 1, lastRow: 16, position: 1 },
      { id: 2, name: 'Rear bar', sizeFt: 39, firstRow: 17, lastRow: 31, position: 2 },
    ];
    const layout = drawingLayout({ rows: 31, rowSpacingIn: 15, toolbars: split, availableWidthPx: 380 });
    expect(layout.folds).toBeGreaterThan(1);
    const all = layout.lanes.flatMap((l) => l.bars.flatMap((b) => b.rows.map((r) => r.row)));
    expect(all.sort((a, b) => a - b)).toEqual(Array.from({ length: 31 }, (_, i) => i + 1));
    // Lines of the front bar come before any line of the rear bar.
    const names = layout.lanes.map((l) => l.bars[0].toolbar?.name);
    expect(names.lastIndexOf('Front bar')).toBeLessThan(names.indexOf('Rear bar'));
  });
});
