import { useEffect, useMemo, useRef, useState, type KeyboardEvent, type ReactNode } from 'react';
import type { ComponentCategory } from '@shared/schemas/fleet';
import type { Install, PlanterDetail, Toolbar } from '@/features/fleet/api/types';
import { GlyphShape } from '@/features/fleet/components/component-glyph';
import { categoryShortLabels } from '@/features/fleet/lib/labels';
import { cn } from '@/lib/cn';
import {
  drawingLayout,
  formatRowRange,
  installsOnPlanter,
  installsOnRow,
  installsOnToolbar,
  rowAccessibleName,
  toolbarAccessibleName,
  type DrawingBar,
} from '../lib/planter-layout';

export type PanelTarget = { kind: 'row'; row: number } | { kind: 'toolbar'; toolbarId: number } | { kind: 'planter' } | { kind: 'add' };

interface PlanterDrawingProps {
  planter: PlanterDetail;
  selected: PanelTarget | null;
  onSelect: (target: PanelTarget) => void;
}

// Vertical rhythm of the drawing, px.
const HITCH_H = 54;
const LABEL_H = 20;
const BAR_H = 28;
const SHANK_H = 9;
const NUMBER_H = 20;
const GLYPH_GAP = 3;
const LANE_GAP = 30;
const CHAR_W = 7.2; // average width of a 12-13 px character, for fitting labels

const INK_900 = '#1c2240';
const INK_800 = '#283052';
const INK_600 = '#454f7c';
const LOAM_100 = '#efebe4';
const LOAM_400 = '#a99b89';
const LOAM_700 = '#564c41';

/** Distinct categories on a row, front to back: one glyph each even if two parts share a category. */
function rowGlyphs(installs: Install[]): ComponentCategory[] {
  const seen: ComponentCategory[] = [];
  for (const i of installs) {
    const c = i.component?.category ?? 'other';
    if (!seen.includes(c)) seen.push(c);
  }
  return seen;
}

/** A zig-zag across the bar where a folded bar is cut (it goes on, on the next line). */
function cutMark(x: number, barY: number): string {
  const h = BAR_H / 4;
  return `M${x} ${barY} l-4 ${h} l8 ${h} l-8 ${h} l4 ${h}`;
}

function fit(text: string, widthPx: number): string | null {
  if (text.length * CHAR_W <= widthPx) return text;
  const room = Math.floor(widthPx / CHAR_W) - 1;
  return room >= 4 ? `${text.slice(0, room)}…` : null;
}

/**
 * Marks drawn over a button (part glyphs and their short words): outside the button's element, so
 * the button's visible text is only what its spoken name says too (its row number, "Whole planter"),
 * and not hit-testable, so a click on them still lands on the button beneath. The button's name
 * lists the parts in full.
 */
function Overlay({ children }: { children: ReactNode }) {
  return (
    <g aria-hidden="true" pointerEvents="none">
      {children}
    </g>
  );
}

/**
 * The planter drawn from its record, seen from above with the hitch at the top: each toolbar a
 * bar with its name and size, every row unit hanging from it, numbered, with a glyph per kind of
 * part on it (front of the unit at the top). Toolbars and row units are buttons: click, Enter or
 * Space opens the side panel; the arrow keys step from row to row.
 */
export function PlanterDrawing({ planter, selected, onSelect }: PlanterDrawingProps) {
  const containerRef = useRef<HTMLDivElement>(null);
  const [availableWidth, setAvailableWidth] = useState(900);
  const rowRefs = useRef(new Map<number, SVGGElement>());

  useEffect(() => {
    const el = containerRef.current;
    if (!el) return;
    const measure = () => setAvailableWidth(Math.max(320, el.clientWidth));
    measure();
    const observer = new ResizeObserver(measure);
    observer.observe(el);
    return () => observer.disconnect();
  }, []);

  const layout = useMemo(
    () => drawingLayout({ rows: planter.rows, rowSpacingIn: planter.rowSpacingIn, toolbars: planter.toolbars, availableWidthPx: availableWidth }),
    [planter.rows, planter.rowSpacingIn, planter.toolbars, availableWidth],
  );

  const rowInstalls = useMemo(() => {
    const map = new Map<number, Install[]>();
    for (let r = 1; r <= planter.rows; r++) map.set(r, installsOnRow(planter.installs, r));
    return map;
  }, [planter.installs, planter.rows]);

  const unitW = layout.unitWidthPx;
  const glyph = Math.min(20, unitW - 4);
  const maxGlyphs = Math.max(2, ...[...rowInstalls.values()].map((list) => rowGlyphs(list).length));
  const unitH = NUMBER_H + maxGlyphs * (glyph + GLYPH_GAP) + 6;
  const laneH = LABEL_H + BAR_H + SHANK_H + unitH;
  const height = HITCH_H + layout.lanes.length * laneH + (layout.lanes.length - 1) * LANE_GAP + 8;
  const firstLane = layout.lanes[0];
  const frontLeft = firstLane ? firstLane.bars[0].xPx : 0;
  const frontRight = firstLane ? firstLane.bars[firstLane.bars.length - 1].xPx + firstLane.bars[firstLane.bars.length - 1].widthPx : layout.widthPx;
  const hitchX = (frontLeft + frontRight) / 2;

  const step = (event: KeyboardEvent<SVGGElement>, row: number) => {
    const go = (to: number) => {
      event.preventDefault();
      rowRefs.current.get(Math.min(planter.rows, Math.max(1, to)))?.focus();
    };
    if (event.key === 'ArrowRight') go(row + 1);
    else if (event.key === 'ArrowLeft') go(row - 1);
    else if (event.key === 'Home') go(1);
    else if (event.key === 'End') go(planter.rows);
  };

  const activate = (event: KeyboardEvent<SVGGElement>, target: PanelTarget) => {
    if (event.key === 'Enter' || event.key === ' ') {
      event.preventDefault();
      onSelect(target);
    }
  };

  // Planter-level parts sit beside the hitch, as one button for the whole planter.
  const planterParts = installsOnPlanter(planter.installs);
  const planterRoom = Math.max(0, hitchX - 30 - 8);
  const planterChips: { key: string; x: number; category: ComponentCategory; text: string | null }[] = [];
  let planterX = 8 + 6;
  let planterHidden = 0;
  const planterTitle = 'Whole planter';
  planterX += planterTitle.length * 6.6 + 8;
  for (const part of planterParts) {
    const category = part.component?.category ?? 'other';
    const text = categoryShortLabels[category];
    const w = 16 + 4 + text.length * 6.4 + 6;
    if (planterX + w <= 8 + planterRoom - 24) {
      planterChips.push({ key: `p-${part.id}`, x: planterX, category, text });
      planterX += w + 4;
    } else if (planterX + 20 <= 8 + planterRoom - 24) {
      planterChips.push({ key: `p-${part.id}`, x: planterX, category, text: null });
      planterX += 20;
    } else planterHidden++;
  }
  const planterBoxW = Math.min(planterRoom, Math.max(planterX + (planterHidden ? 24 : 4) - 8, planterParts.length ? 120 : 150));
  const planterLabel = `Whole planter: ${planterParts.length ? planterParts.map((i) => i.component?.name ?? 'Unknown part').join('; ') : 'no planter parts'}`;
  const planterSelected = selected?.kind === 'planter';

  const isSelectedRow = (row: number) => selected?.kind === 'row' && selected.row === row;
  const isSelectedBar = (id: number) => selected?.kind === 'toolbar' && selected.toolbarId === id;

  const renderBar = (bar: DrawingBar, y: number) => {
    const barY = y + LABEL_H;
    const t = bar.toolbar;
    const shown = bar.rows.length ? formatRowRange(bar.rows[0].row, bar.rows[bar.rows.length - 1].row) : '';
    const label = !t
      ? fit('Rows on no toolbar', bar.widthPx)
      : bar.cutLeft
        ? fit(`${t.name}, continued · ${shown}`, bar.widthPx) ?? fit(`${t.name}, continued`, bar.widthPx)
        : fit(`${t.name} · ${t.sizeFt} ft · ${formatRowRange(t.firstRow, t.lastRow)}${bar.cutRight ? ' (folded to fit)' : ''}`, bar.widthPx) ??
          fit(`${t.name} · ${t.sizeFt} ft · ${formatRowRange(t.firstRow, t.lastRow)}`, bar.widthPx) ??
          fit(t.name, bar.widthPx);
    // A folded bar's toolbar parts and its button are on its first piece; later pieces repeat the click for the mouse only.
    const continued = Boolean(bar.cutLeft);
    const parts = t && !continued ? installsOnToolbar(planter.installs, t.id) : [];
    // Toolbar-level parts as chips on the bar, as many as fit, then "+N".
    let chipX = bar.xPx + 6;
    const chips: { key: string; x: number; category: ComponentCategory; text: string | null }[] = [];
    let hidden = 0;
    for (const part of parts) {
      const category = part.component?.category ?? 'other';
      const text = categoryShortLabels[category];
      const w = 16 + 4 + text.length * 6.4 + 8;
      if (chipX + w <= bar.xPx + bar.widthPx - 34) {
        chips.push({ key: `chip-${part.id}`, x: chipX, category, text });
        chipX += w + 4;
      } else if (chipX + 20 <= bar.xPx + bar.widthPx - 34) {
        chips.push({ key: `chip-${part.id}`, x: chipX, category, text: null });
        chipX += 22;
      } else hidden++;
    }
    return (
      <g key={bar.key}>
        {label && (
          <text x={bar.xPx + 2} y={y + 14} fontSize={13} fontWeight={700} fill={INK_900}>
            {label}
          </text>
        )}
        {t ? (
          <g
            role={continued ? undefined : 'button'}
            tabIndex={continued ? undefined : 0}
            aria-label={continued ? undefined : toolbarAccessibleName(t as Toolbar, planter.installs)}
            aria-hidden={continued ? true : undefined}
            aria-haspopup={continued ? undefined : 'dialog'}
            className="group cursor-pointer outline-none"
            onClick={() => onSelect({ kind: 'toolbar', toolbarId: t.id })}
            onKeyDown={continued ? undefined : (e) => activate(e, { kind: 'toolbar', toolbarId: t.id })}
            data-toolbar-id={continued ? undefined : t.id}
          >
            <rect
              x={bar.xPx - 4}
              y={barY - 4}
              width={bar.widthPx + 8}
              height={BAR_H + 8}
              rx={8}
              fill="none"
              stroke={INK_600}
              strokeWidth={3}
              className={cn('opacity-0 group-focus-visible:opacity-100', isSelectedBar(t.id) && 'opacity-100')}
            />
            <rect x={bar.xPx} y={barY} width={bar.widthPx} height={BAR_H} rx={5} fill={isSelectedBar(t.id) ? INK_600 : INK_800} className="transition-colors group-hover:fill-[#363f68]" />
            {bar.cutLeft && <path d={cutMark(bar.xPx, barY)} fill="none" stroke="#ffffff" strokeWidth={2} aria-hidden="true" />}
            {bar.cutRight && <path d={cutMark(bar.xPx + bar.widthPx, barY)} fill="none" stroke="#ffffff" strokeWidth={2} aria-hidden="true" />}
          </g>
        ) : (
          <rect x={bar.xPx} y={barY} width={bar.widthPx} height={BAR_H} rx={5} fill="none" stroke={LOAM_700} strokeDasharray="6 4" strokeWidth={2} />
        )}
        {t && (
          <Overlay>
            {chips.map((chip) => (
              <g key={chip.key}>
                <rect x={chip.x} y={barY + 4} width={chip.text ? 16 + 4 + chip.text.length * 6.4 + 8 : 20} height={BAR_H - 8} rx={4} fill="#ffffff" opacity={0.95} />
                <GlyphShape category={chip.category} x={chip.x + 2} y={barY + 6} size={16} />
                {chip.text && (
                  <text x={chip.x + 21} y={barY + BAR_H / 2 + 4} fontSize={11} fontWeight={600} fill={INK_900}>
                    {chip.text}
                  </text>
                )}
              </g>
            ))}
            {hidden > 0 && (
              <text x={chipX + 2} y={barY + BAR_H / 2 + 4} fontSize={11} fontWeight={700} fill="#ffffff">
                +{hidden}
              </text>
            )}
            {/* The bar's own "open" affordance at its right end. */}
            {!bar.cutRight && (
              <text x={bar.xPx + bar.widthPx - 10} y={barY + BAR_H / 2 + 5} textAnchor="end" fontSize={14} fontWeight={700} fill="#ffffff">
                ⋯
              </text>
            )}
          </Overlay>
        )}
        {bar.rows.map(({ row, cxPx }) => {
          const list = rowInstalls.get(row) ?? [];
          const glyphs = rowGlyphs(list);
          const unitTop = barY + BAR_H + SHANK_H;
          const x = cxPx - unitW / 2;
          const chosen = isSelectedRow(row);
          return (
            <g key={row}>
              <g
                ref={(el) => {
                  if (el) rowRefs.current.set(row, el);
                  else rowRefs.current.delete(row);
                }}
                role="button"
                tabIndex={0}
                aria-label={rowAccessibleName(row, list)}
                aria-haspopup="dialog"
                className="group cursor-pointer outline-none"
                onClick={() => onSelect({ kind: 'row', row })}
                onKeyDown={(e) => {
                  step(e, row);
                  activate(e, { kind: 'row', row });
                }}
                data-row={row}
              >
                <line x1={cxPx} y1={barY + BAR_H} x2={cxPx} y2={unitTop} stroke={LOAM_700} strokeWidth={3} />
                <rect
                  x={x - 4}
                  y={unitTop - 4}
                  width={unitW + 8}
                  height={unitH + 8}
                  rx={7}
                  fill="none"
                  stroke={INK_600}
                  strokeWidth={3}
                  className={cn('opacity-0 group-focus-visible:opacity-100', chosen && 'opacity-100')}
                />
                <rect
                  x={x}
                  y={unitTop}
                  width={unitW}
                  height={unitH}
                  rx={5}
                  fill={chosen ? '#e5e7f0' : LOAM_100}
                  stroke={list.length ? LOAM_700 : LOAM_400}
                  strokeWidth={1.5}
                  strokeDasharray={list.length ? undefined : '3 3'}
                  className="transition-colors group-hover:fill-[#f3f4f8]"
                />
                <text x={cxPx} y={unitTop + 14} textAnchor="middle" fontSize={unitW < 22 ? 10 : 12} fontWeight={700} fill={INK_900}>
                  {row}
                </text>
              </g>
              <Overlay>
                {glyphs.map((category, k) => (
                  <GlyphShape key={category} category={category} x={cxPx - glyph / 2} y={unitTop + NUMBER_H + k * (glyph + GLYPH_GAP)} size={glyph} />
                ))}
              </Overlay>
            </g>
          );
        })}
      </g>
    );
  };

  return (
    <div ref={containerRef} className="overflow-x-auto pb-2" data-testid="planter-drawing">
      <svg
        width={layout.widthPx}
        height={height}
        viewBox={`0 0 ${layout.widthPx} ${height}`}
        role="group"
        aria-label={`Drawing of ${planter.name}: ${planter.toolbars.length} ${planter.toolbars.length === 1 ? 'toolbar' : 'toolbars'} and ${planter.rows} row units. ${layout.folds > 1 ? ` Drawn on ${layout.folds} lines to fit the screen.` : ''} Use Tab or the arrow keys to move between rows; Enter opens a row's parts.`}
        className="mx-auto block select-none"
        style={{ fontFamily: 'inherit' }}
      >
        {/* Hitch and tongue: the front of the planter, towards the tractor. */}
        <g aria-hidden="true">
          <path d={`M${hitchX - Math.min(70, (frontRight - frontLeft) / 3)} ${HITCH_H + LABEL_H} L${hitchX} 14 L${hitchX + Math.min(70, (frontRight - frontLeft) / 3)} ${HITCH_H + LABEL_H}`} fill="none" stroke={LOAM_700} strokeWidth={4} strokeLinejoin="round" />
          <circle cx={hitchX} cy={12} r={6} fill="#ffffff" stroke={LOAM_700} strokeWidth={3} />
          <text x={hitchX + 14} y={17} fontSize={12} fill={LOAM_700} fontWeight={600}>
            Hitch{planter.tractor ? ` · ${planter.tractor.name}` : ''}
          </text>
        </g>
        {planterRoom >= 120 && (
          <g
            role="button"
            tabIndex={0}
            aria-label={planterLabel}
            aria-haspopup="dialog"
            className="group cursor-pointer outline-none"
            onClick={() => onSelect({ kind: 'planter' })}
            onKeyDown={(e) => activate(e, { kind: 'planter' })}
            data-planter-parts=""
          >
            <rect x={5} y={1} width={planterBoxW + 6} height={34} rx={8} fill="none" stroke={INK_600} strokeWidth={3} className={cn('opacity-0 group-focus-visible:opacity-100', planterSelected && 'opacity-100')} />
            <rect x={8} y={4} width={planterBoxW} height={28} rx={6} fill={planterSelected ? '#e5e7f0' : '#ffffff'} stroke={LOAM_400} strokeWidth={1.5} className="group-hover:fill-[#f3f4f8]" />
            <text x={14} y={22} fontSize={12} fontWeight={700} fill={INK_900}>
              {planterTitle}
            </text>
          </g>
        )}
        {planterRoom >= 120 && (
          <Overlay>
            {planterChips.map((chip) => (
              <g key={chip.key}>
                <GlyphShape category={chip.category} x={chip.x} y={10} size={16} />
                {chip.text && (
                  <text x={chip.x + 19} y={22} fontSize={11} fontWeight={600} fill={INK_900}>
                    {chip.text}
                  </text>
                )}
              </g>
            ))}
            {planterHidden > 0 && (
              <text x={planterX} y={22} fontSize={11} fontWeight={700} fill={INK_900}>
                +{planterHidden}
              </text>
            )}
            {planterParts.length === 0 && (
              <text x={14 + planterTitle.length * 6.6 + 8} y={22} fontSize={11} fill={LOAM_700}>
                none
              </text>
            )}
          </Overlay>
        )}
        {layout.lanes.map((lane, i) => {
          const y = HITCH_H + i * (laneH + LANE_GAP);
          return <g key={lane.index}>{lane.bars.map((bar) => renderBar(bar, y))}</g>;
        })}
      </svg>
    </div>
  );
}
