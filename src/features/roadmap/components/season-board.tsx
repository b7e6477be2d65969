import { useEffect, useRef, useState, type PointerEvent as ReactPointerEvent, type ReactNode } from 'react';
import { cn } from '@/lib/cn';
import type { Roadmap, RoadmapGoal, RoadmapItem, RoadmapSeason } from '../api/types';
import { formatUsd } from '../model/format';
import { BudgetBar, LockIcon } from './bits';
import { ItemCard, type ItemCardActions } from './item-card';

interface DragState {
  item: RoadmapItem;
  pointerId: number;
  startX: number;
  startY: number;
  x: number;
  y: number;
  /** The pointer has travelled far enough to be a drag, not a press. */
  active: boolean;
  overSeason: number | null;
}

const DRAG_THRESHOLD_PX = 6;
const EDGE_SCROLL_PX = 48;

export interface BoardActions extends Omit<ItemCardActions, 'onDragStart'> {
  /** A card was dropped on another season (a locked one too: the caller explains the refusal). */
  onDrop: (item: RoadmapItem, toSeason: number) => void;
}

/**
 * The seasons laid out across, one column each, with their spend against budget and their items.
 * Dragging uses pointer events, so a mouse, a pen and a finger on a tablet all work; keyboard
 * users have "Move to season…" on every card.
 */
export function SeasonBoard({
  roadmap,
  goals,
  actions,
  seasonFooter,
}: {
  roadmap: Roadmap;
  goals: Map<number, RoadmapGoal>;
  actions: BoardActions | null;
  seasonFooter?: (season: RoadmapSeason) => ReactNode;
}) {
  const [drag, setDrag] = useState<DragState | null>(null);
  const dragRef = useRef<DragState | null>(null);
  const scrollerRef = useRef<HTMLDivElement>(null);
  dragRef.current = drag;

  useEffect(() => {
    if (!drag) return;
    const seasonAt = (x: number, y: number) => {
      const el = document.elementFromPoint(x, y)?.closest<HTMLElement>('[data-season-drop]');
      return el ? Number(el.dataset.seasonDrop) : null;
    };
    const onMove = (event: PointerEvent) => {
      const current = dragRef.current;
      if (!current || event.pointerId !== current.pointerId) return;
      const active = current.active || Math.hypot(event.clientX - current.startX, event.clientY - current.startY) > DRAG_THRESHOLD_PX;
      const scroller = scrollerRef.current;
      if (active && scroller) {
        const box = scroller.getBoundingClientRect();
        if (event.clientX < box.left + EDGE_SCROLL_PX) scroller.scrollLeft -= 16;
        else if (event.clientX > box.right - EDGE_SCROLL_PX) scroller.scrollLeft += 16;
      }
      const next = { ...current, x: event.clientX, y: event.clientY, active, overSeason: active ? seasonAt(event.clientX, event.clientY) : null };
      dragRef.current = next;
      setDrag(next);
    };
    const onUp = (event: PointerEvent) => {
      const current = dragRef.current;
      if (!current || event.pointerId !== current.pointerId) return;
      dragRef.current = null;
      setDrag(null);
      const season = current.active ? seasonAt(event.clientX, event.clientY) : null;
      if (season !== null && season !== current.item.season) actions?.onDrop(current.item, season);
    };
    const onCancel = () => setDrag(null);
    const onKey = (event: KeyboardEvent) => {
      if (event.key === 'Escape') setDrag(null);
    };
    window.addEventListener('pointermove', onMove);
    window.addEventListener('pointerup', onUp);
    window.addEventListener('pointercancel', onCancel);
    window.addEventListener('keydown', onKey);
    return () => {
      window.removeEventListener('pointermove', onMove);
      window.removeEventListener('pointerup', onUp);
      window.removeEventListener('pointercancel', onCancel);
      window.removeEventListener('keydown', onKey);
    };
    // Listeners follow one drag from press to release; its position is read from the ref.
  }, [drag?.item.id, drag?.pointerId]);

  const cardActions: ItemCardActions | null = actions
    ? {
        ...actions,
        onDragStart: (item: RoadmapItem, event: ReactPointerEvent<HTMLElement>) => {
          if (event.button !== 0) return;
          event.preventDefault();
          setDrag({ item, pointerId: event.pointerId, startX: event.clientX, startY: event.clientY, x: event.clientX, y: event.clientY, active: false, overSeason: null });
        },
      }
    : null;

  const replacementsBySeason = new Map<number, Roadmap['replacements']>();
  for (const r of roadmap.replacements) replacementsBySeason.set(r.season, [...(replacementsBySeason.get(r.season) ?? []), r]);
  const planterName = (id: number) => roadmap.planters.find((p) => p.id === id)?.name ?? 'a planter';

  return (
    <div className="relative">
      <div
        ref={scrollerRef}
        className="grid auto-cols-[minmax(15.5rem,1fr)] grid-flow-col gap-3 overflow-x-auto pb-3"
        role="region"
        aria-label="Seasons of the roadmap"
        tabIndex={0}
      >
        {roadmap.seasons.map((season) => {
          const isTarget = drag?.active && drag.overSeason === season.season && season.season !== drag.item.season;
          const replacements = replacementsBySeason.get(season.season) ?? [];
          return (
            <section
              key={season.season}
              data-season-drop={season.season}
              data-season-column={season.season}
              aria-labelledby={`season-${season.season}-title`}
              className={cn(
                'flex min-h-64 flex-col rounded-xl border-2 p-2.5 transition-colors',
                isTarget ? 'border-dashed border-ink-600 bg-ink-50' : 'border-loam-200 bg-loam-100/70',
              )}
            >
              <header className="mb-3 rounded-lg bg-white p-3 shadow-sm">
                <div className="flex items-baseline justify-between gap-2">
                  <h3 id={`season-${season.season}-title`} className="text-xl font-bold text-ink-900 tabular">
                    {season.season}
                  </h3>
                  <span className="text-sm text-loam-700">
                    {season.items.length} {season.items.length === 1 ? 'item' : 'items'}
                  </span>
                </div>
                <div className="mt-1">
                  <BudgetBar costUsd={season.costUsd} budgetUsd={season.budgetUsd} compact />
                </div>
                {replacements.map((r) => (
                  <p key={r.id} className="mt-2 flex items-center gap-1.5 rounded-md bg-amber-50 px-2 py-1 text-sm font-semibold text-amber-800">
                    <span aria-hidden="true">⟲</span>
                    {r.kind === 'toolbar' ? 'Toolbar' : 'Planter'} replaced on {planterName(r.planterId)}
                  </p>
                ))}
              </header>
              {isTarget && (
                <p className="mb-2 rounded-md bg-white px-2 py-1 text-center font-semibold text-ink-800" aria-hidden="true">
                  {drag.item.locked ? 'Locked: it stays put' : `Drop to move here`}
                </p>
              )}
              <div className="flex flex-1 flex-col gap-3">
                {season.items.length === 0 ? (
                  <p className="rounded-lg border border-dashed border-loam-300 px-3 py-6 text-center text-loam-700">Nothing planned for {season.season}.</p>
                ) : (
                  season.items.map((item) => <ItemCard key={item.id} item={item} goals={goals} actions={cardActions} dragging={drag?.active && drag.item.id === item.id} />)
                )}
              </div>
              {seasonFooter && <div className="mt-3">{seasonFooter(season)}</div>}
            </section>
          );
        })}
      </div>

      {drag?.active && (
        // The card under the pointer while it is dragged; it never takes pointer events itself.
        <div
          aria-hidden="true"
          className="pointer-events-none fixed z-50 w-64 -translate-x-4 -translate-y-4 rotate-1 rounded-lg border-2 border-ink-600 bg-white p-3 shadow-2xl"
          style={{ left: drag.x, top: drag.y }}
        >
          <p className="flex items-center gap-2 font-bold text-ink-950">
            {drag.item.locked && <LockIcon locked />}
            {drag.item.partName}
          </p>
          <p className="text-sm text-loam-700 tabular">
            {formatUsd(drag.item.costUsd)} · from {drag.item.season}
            {drag.overSeason && drag.overSeason !== drag.item.season ? ` to ${drag.overSeason}` : ''}
          </p>
        </div>
      )}
      <p className="sr-only" role="status" aria-live="polite">
        {drag?.active ? `Dragging ${drag.item.partName}${drag.overSeason ? ` over ${drag.overSeason}` : ''}` : ''}
      </p>
    </div>
  );
}
