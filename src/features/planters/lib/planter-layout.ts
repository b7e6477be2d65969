import type { ComponentCategory, InstallScope } from '@shared/schemas/fleet';
import { workingWidthFt } from '@shared/calc/sizing';
import { categoryOrder } from '@/features/fleet/lib/labels';

/*
 * Pure helpers behind the planter drawing and its side panel: which parts sit on which row unit,
 * toolbar or planter; how rows run in groups of the same set-up; the accessible names of the
 * drawing's buttons; the install timeline; and where each toolbar and row unit is drawn.
 * Numbers in, numbers out: no React, no DOM, tested in tests/client/planter-layout.test.ts.
 */

export interface LayoutToolbar {
  id: number;
  name: string;
  sizeFt: number;
  firstRow: number;
  lastRow: number;
  position: number;
}

export interface LayoutInstall {
  id: number;
  scope: InstallScope;
  toolbarId: number | null;
  rowFrom: number | null;
  rowTo: number | null;
  status: 'installed' | 'removed';
  installDate: string | null;
  removedDate: string | null;
  component: { id: number; name: string; category: ComponentCategory } | null;
}

const rank = (c: ComponentCategory | undefined) => {
  const i = categoryOrder.indexOf(c ?? 'other');
  return i === -1 ? categoryOrder.length : i;
};

/** Front-to-back on the row unit, then by name: the order the drawing and the lists use. */
export function byRowUnitOrder<T extends LayoutInstall>(a: T, b: T): number {
  return rank(a.component?.category) - rank(b.component?.category) || (a.component?.name ?? '').localeCompare(b.component?.name ?? '') || a.id - b.id;
}

/** Whether a per-row install covers this row (every row, or a range that includes it). */
export function coversRow(install: Pick<LayoutInstall, 'scope' | 'rowFrom' | 'rowTo'>, row: number): boolean {
  if (install.scope === 'all-rows') return true;
  return install.scope === 'rows' && install.rowFrom !== null && install.rowTo !== null && row >= install.rowFrom && row <= install.rowTo;
}

const installed = <T extends LayoutInstall>(installs: readonly T[]) => installs.filter((i) => i.status === 'installed');

/** The parts on one row unit now (removed ones left out), front to back. */
export function installsOnRow<T extends LayoutInstall>(installs: readonly T[], row: number): T[] {
  return installed(installs).filter((i) => coversRow(i, row)).sort(byRowUnitOrder);
}

export function installsOnToolbar<T extends LayoutInstall>(installs: readonly T[], toolbarId: number): T[] {
  return installed(installs).filter((i) => i.scope === 'toolbar' && i.toolbarId === toolbarId).sort(byRowUnitOrder);
}

export function installsOnPlanter<T extends LayoutInstall>(installs: readonly T[]): T[] {
  return installed(installs).filter((i) => i.scope === 'planter').sort(byRowUnitOrder);
}

export function formatRowRange(from: number, to: number): string {
  return from === to ? `row ${from}` : `rows ${from}–${to}`;
}

/** Where an install sits, in words: "every row", "rows 1–8", "Main bar", "the whole planter". */
export function placementText(install: Pick<LayoutInstall, 'scope' | 'toolbarId' | 'rowFrom' | 'rowTo'>, toolbars: readonly Pick<LayoutToolbar, 'id' | 'name'>[]): string {
  switch (install.scope) {
    case 'all-rows':
      return 'every row';
    case 'rows':
      return formatRowRange(install.rowFrom ?? 0, install.rowTo ?? 0);
    case 'toolbar':
      return toolbars.find((t) => t.id === install.toolbarId)?.name ?? 'a toolbar no longer on the planter';
    case 'planter':
    default:
      return 'the whole planter';
  }
}

const partNames = (installs: readonly LayoutInstall[]) => installs.map((i) => i.component?.name ?? 'Unknown part');

/** The row unit's accessible name: "Row 5: Vacuum seed meter; Floating row cleaner". */
export function rowAccessibleName(row: number, installs: readonly LayoutInstall[]): string {
  const names = partNames(installsOnRow(installs, row));
  return `Row ${row}: ${names.length ? names.join('; ') : 'nothing installed'}`;
}

export function toolbarAccessibleName(toolbar: LayoutToolbar, installs: readonly LayoutInstall[]): string {
  const names = partNames(installsOnToolbar(installs, toolbar.id));
  return `${toolbar.name}, ${toolbar.sizeFt} ft, ${formatRowRange(toolbar.firstRow, toolbar.lastRow)}: ${names.length ? names.join('; ') : 'no toolbar parts'}`;
}

export interface RowSetup {
  fromRow: number;
  toRow: number;
  componentIds: number[];
  names: string[];
}

/**
 * Consecutive rows with the same parts, as runs: a planter with a meter on every row and row
 * cleaners on rows 1–8 gives "rows 1–8: meter, cleaner" and "rows 9–16: meter".
 */
export function rowSetups(rows: number, installs: readonly LayoutInstall[]): RowSetup[] {
  const runs: RowSetup[] = [];
  for (let row = 1; row <= rows; row++) {
    const on = installsOnRow(installs, row);
    const ids = [...new Set(on.map((i) => i.component?.id ?? -i.id))];
    const last = runs[runs.length - 1];
    if (last && last.toRow === row - 1 && last.componentIds.length === ids.length && last.componentIds.every((id, k) => id === ids[k])) {
      last.toRow = row;
    } else {
      runs.push({ fromRow: row, toRow: row, componentIds: ids, names: [...new Set(partNames(on))] });
    }
  }
  return runs;
}

export interface TimelineEvent<T extends LayoutInstall = LayoutInstall> {
  key: string;
  kind: 'installed' | 'removed';
  /** YYYY-MM-DD, or null when the record has no date. */
  date: string | null;
  install: T;
}

/**
 * Every install and every removal as dated events, newest first; records without a date come
 * last (they happened, but the record does not say when).
 */
export function installTimeline<T extends LayoutInstall>(installs: readonly T[]): TimelineEvent<T>[] {
  const events: TimelineEvent<T>[] = [];
  for (const install of installs) {
    events.push({ key: `i-${install.id}`, kind: 'installed', date: install.installDate, install });
    if (install.status === 'removed') events.push({ key: `r-${install.id}`, kind: 'removed', date: install.removedDate, install });
  }
  return events.sort((a, b) => {
    if (a.date === b.date) return a.kind === b.kind ? b.install.id - a.install.id : a.kind === 'removed' ? -1 : 1;
    if (a.date === null) return 1;
    if (b.date === null) return -1;
    return a.date < b.date ? 1 : -1;
  });
}

// ---------------------------------------------------------------- drawing geometry

export interface DrawingRow {
  row: number;
  /** Centre of the row unit, px from the drawing's left edge. */
  cxPx: number;
}

export interface DrawingBar {
  key: string;
  /** null: rows that no toolbar claims (drawn on a bar of their own so none goes missing). */
  toolbar: LayoutToolbar | null;
  xPx: number;
  widthPx: number;
  rows: DrawingRow[];
  /** The bar goes on from the line above (cutLeft) or on the line below (cutRight). */
  cutLeft?: boolean;
  cutRight?: boolean;
}

export interface DrawingLane {
  index: number;
  bars: DrawingBar[];
  /** 1 of 2, 2 of 2… when a wide planter is folded onto several lines; absent when it fits on one. */
  part?: number;
  parts?: number;
}

export interface DrawingLayout {
  widthPx: number;
  pxPerFt: number;
  /** The closest two row units on any bar, px centre to centre. */
  pitchPx: number;
  /** Width of one drawn row unit. */
  unitWidthPx: number;
  /** True when the toolbars are sections of one frame (wings and centre) drawn in one line. */
  sideBySide: boolean;
  /** How many lines each lane was folded onto to fit the width (1: not folded). */
  folds: number;
  lanes: DrawingLane[];
}

export interface DrawingInput {
  rows: number;
  rowSpacingIn: number;
  toolbars: readonly LayoutToolbar[];
  /** Width the drawing may use; it grows past this (and scrolls) rather than cramp the rows. */
  availableWidthPx: number;
  minPitchPx?: number;
  maxPitchPx?: number;
  /** Fold a lane too wide for the space onto up to this many lines instead of scrolling (1: never fold). */
  maxFolds?: number;
}

export const DRAWING_SIDE_PAD_PX = 16;
const BAR_GAP_PX = 10;

/**
 * Places toolbars and row units. Toolbars whose sizes add up to about the planter's working width
 * (rows × spacing; a tenth of slack for hinges) are sections of one frame and sit side by side;
 * otherwise each is its own bar (front and rear bars of a split-row planter), one under the other
 * in position order. Rows are spread evenly along their bar. The scale fills the available width,
 * but never lets row units come closer than minPitchPx (the drawing then scrolls) nor further
 * apart than maxPitchPx (a 4-row planter stays a sensible size).
 */
export function drawingLayout({ rows, rowSpacingIn, toolbars, availableWidthPx, minPitchPx = 26, maxPitchPx = 76, maxFolds = 3 }: DrawingInput): DrawingLayout {
  const spacingFt = rowSpacingIn / 12;
  const ordered = [...toolbars].sort((a, b) => a.position - b.position || a.id - b.id);

  // Each row belongs to the first toolbar (by position) whose range holds it.
  const taken = new Set<number>();
  const barRows = ordered.map((t) => {
    const list: number[] = [];
    for (let r = Math.max(1, t.firstRow); r <= Math.min(rows, t.lastRow); r++) {
      if (!taken.has(r)) {
        taken.add(r);
        list.push(r);
      }
    }
    return list;
  });
  const loose: number[] = [];
  for (let r = 1; r <= rows; r++) if (!taken.has(r)) loose.push(r);

  type Plan = { key: string; toolbar: LayoutToolbar | null; lengthFt: number; rows: number[] };
  const bars: Plan[] = ordered.map((t, i) => ({
    key: `toolbar-${t.id}`,
    toolbar: t,
    // A bar drawn shorter than its rows need would stack them: give each row at least half its spacing.
    lengthFt: Math.max(t.sizeFt, barRows[i].length * spacingFt * 0.5, spacingFt),
    rows: barRows[i],
  }));

  const totalFt = bars.reduce((sum, b) => sum + b.lengthFt, 0);
  const sideBySide = bars.length <= 1 || totalFt <= workingWidthFt(rows, rowSpacingIn) * 1.1;
  const lanePlans: Plan[][] = sideBySide ? [bars] : bars.map((b) => [b]);
  if (loose.length) lanePlans.push([{ key: 'loose', toolbar: null, lengthFt: Math.max(loose.length * spacingFt, spacingFt), rows: loose }]);
  const nonEmptyLanes = lanePlans.filter((lane) => lane.length > 0);

  const pitchesFt = nonEmptyLanes.flat().filter((b) => b.rows.length > 0).map((b) => b.lengthFt / b.rows.length);
  const minRowPitchFt = pitchesFt.length ? Math.min(...pitchesFt) : spacingFt;
  const maxRowPitchFt = pitchesFt.length ? Math.max(...pitchesFt) : spacingFt;

  const laneGapsPx = (lane: Plan[]) => (lane.length - 1) * BAR_GAP_PX;
  const widestFt = Math.max(...nonEmptyLanes.map((lane) => lane.reduce((s, b) => s + b.lengthFt, 0)));
  const widestGaps = Math.max(...nonEmptyLanes.map(laneGapsPx));
  const room = Math.max(availableWidthPx - 2 * DRAWING_SIDE_PAD_PX - widestGaps, 1);
  const floor = minPitchPx / minRowPitchFt;
  const ceiling = maxPitchPx / maxRowPitchFt;

  const place = (pxPerFt: number) => {
    const laneWidths = nonEmptyLanes.map((lane) => lane.reduce((s, b) => s + b.lengthFt * pxPerFt, 0) + laneGapsPx(lane));
    const widthPx = Math.max(...laneWidths) + 2 * DRAWING_SIDE_PAD_PX;
    const lanes: DrawingLane[] = nonEmptyLanes.map((lane, index) => {
      // Each lane is centred under the widest one, the way bars hang centred behind the hitch.
      let x = (widthPx - laneWidths[index]) / 2;
      const placed = lane.map((b) => {
        const widthBar = b.lengthFt * pxPerFt;
        const slot = b.rows.length ? widthBar / b.rows.length : widthBar;
        const bar: DrawingBar = { key: b.key, toolbar: b.toolbar, xPx: x, widthPx: widthBar, rows: b.rows.map((row, k) => ({ row, cxPx: x + (k + 0.5) * slot })) };
        x += widthBar + BAR_GAP_PX;
        return bar;
      });
      return { index, bars: placed };
    });
    return { widthPx, lanes };
  };
  const result = (pxPerFt: number, folds: number, placed: { widthPx: number; lanes: DrawingLane[] }): DrawingLayout => {
    const pitchPx = minRowPitchFt * pxPerFt;
    return { pxPerFt, pitchPx, unitWidthPx: Math.max(16, Math.min(40, pitchPx - 6)), sideBySide, folds, ...placed };
  };

  const onOneLine = Math.max(floor, Math.min(room / widestFt, ceiling));
  const single = place(onOneLine);
  const folds = Math.min(Math.max(1, maxFolds), Math.ceil((single.widthPx - 2 * DRAWING_SIDE_PAD_PX - widestGaps) / room - 1e-9));
  if (folds <= 1) return result(onOneLine, 1, single);

  // Folded: each line carries about 1/folds of the widest lane's row units, so scale to fill the
  // room with that many (never below the minimum pitch: a 96-row bar may still scroll).
  const unitsOnWidest = Math.max(...nonEmptyLanes.map((lane) => lane.reduce((s, b) => s + b.rows.length, 0)));
  const perLine = Math.ceil(unitsOnWidest / folds);
  const folded = Math.max(floor, Math.min((room * unitsOnWidest) / (perLine * widestFt) * 0.98, ceiling));
  return result(folded, folds, foldLanes(place(folded).lanes, folds));
}

/**
 * Folds each lane onto `folds` lines, like a wide bar folded for the road: the lane's row units
 * are split into equal runs, the cut falls half-way between two row units, and each line is moved
 * back to the left edge. Row units keep their pitch, so they stay as readable as on one line.
 */
function foldLanes(lanes: DrawingLane[], folds: number): { widthPx: number; lanes: DrawingLane[] } {
  const out: DrawingLane[] = [];
  for (const lane of lanes) {
    const units = lane.bars.flatMap((b) => b.rows).sort((a, b) => a.cxPx - b.cxPx);
    const per = Math.ceil(units.length / folds);
    const parts = Math.max(1, Math.ceil(units.length / Math.max(per, 1)));
    const laneLeft = Math.min(...lane.bars.map((b) => b.xPx));
    const laneRight = Math.max(...lane.bars.map((b) => b.xPx + b.widthPx));
    for (let j = 0; j < parts; j++) {
      const first = units[j * per];
      const last = units[Math.min(units.length, (j + 1) * per) - 1];
      const next = units[(j + 1) * per];
      const prev = units[j * per - 1];
      const from = prev ? (prev.cxPx + first.cxPx) / 2 : laneLeft;
      const to = next ? (last.cxPx + next.cxPx) / 2 : laneRight;
      const pieces: DrawingBar[] = [];
      for (const bar of lane.bars) {
        const left = Math.max(bar.xPx, from);
        const right = Math.min(bar.xPx + bar.widthPx, to);
        if (right - left < 1) continue;
        pieces.push({
          ...bar,
          key: `${bar.key}-part${j + 1}`,
          xPx: left,
          widthPx: right - left,
          rows: bar.rows.filter((r) => r.cxPx >= from && r.cxPx < to),
          cutLeft: left > bar.xPx,
          cutRight: right < bar.xPx + bar.widthPx,
        });
      }
      const shift = DRAWING_SIDE_PAD_PX - Math.min(...pieces.map((p) => p.xPx));
      out.push({
        index: out.length,
        part: j + 1,
        parts,
        bars: pieces.map((p) => ({ ...p, xPx: p.xPx + shift, rows: p.rows.map((r) => ({ ...r, cxPx: r.cxPx + shift })) })),
      });
    }
  }
  const widthPx = Math.max(...out.map((l) => Math.max(...l.bars.map((b) => b.xPx + b.widthPx)))) + DRAWING_SIDE_PAD_PX;
  return { widthPx, lanes: out };
}
