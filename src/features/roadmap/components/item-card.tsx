import type { PointerEvent as ReactPointerEvent } from 'react';
import { componentCategories, type ComponentCategory } from '@shared/schemas/fleet';
import { GOAL_LABELS, roadmapStages, type RoadmapStageName } from '@shared/schemas/roadmap';
import { GlyphIcon } from '@/features/fleet/components/component-glyph';
import { cn } from '@/lib/cn';
import type { RoadmapGoal, RoadmapItem } from '../api/types';
import { formatHours, formatProbability, formatUsd } from '../model/format';
import { STAGE_META } from '../model/stages';
import { ActionMenu, type MenuEntry } from './action-menu';
import { LockIcon, StageChip } from './bits';

export interface ItemCardActions {
  onMove: (item: RoadmapItem) => void;
  onStage: (item: RoadmapItem, stage: RoadmapStageName) => void;
  onLock: (item: RoadmapItem, locked: boolean) => void;
  onDragStart: (item: RoadmapItem, event: ReactPointerEvent<HTMLElement>) => void;
}

const isCategory = (c: string | null): c is ComponentCategory => c !== null && (componentCategories as readonly string[]).includes(c);

/** Six dots: "grab here". */
function GripIcon() {
  return (
    <svg viewBox="0 0 12 20" className="h-5 w-3" aria-hidden="true" fill="currentColor">
      {[4, 10, 16].map((y) => (
        <g key={y}>
          <circle cx="3" cy={y} r="1.5" />
          <circle cx="9" cy={y} r="1.5" />
        </g>
      ))}
    </svg>
  );
}

/**
 * One purchase on the roadmap. Staff drag it by its grip (mouse, pen or finger) or use
 * "Move to season…" from the keyboard; the stage and the lock are in the card's menu.
 */
export function ItemCard({ item, goals, actions, dragging = false }: { item: RoadmapItem; goals: Map<number, RoadmapGoal>; actions: ItemCardActions | null; dragging?: boolean }) {
  const served = item.goalIds.map((id) => goals.get(id)).filter((g): g is RoadmapGoal => Boolean(g));
  const titleId = `roadmap-item-${item.id}-title`;
  const menu: MenuEntry[] = actions
    ? [
        { kind: 'heading', key: 'h-stage', label: 'Stage' },
        ...roadmapStages.map(
          (stage): MenuEntry => ({ kind: 'item', key: stage, label: STAGE_META[stage].label, checked: item.stage === stage, onSelect: () => stage !== item.stage && actions.onStage(item, stage) }),
        ),
        { kind: 'heading', key: 'h-lock', label: 'Season' },
        item.locked
          ? { kind: 'item', key: 'unlock', label: 'Unlock (let it move)', onSelect: () => actions.onLock(item, false) }
          : { kind: 'item', key: 'lock', label: 'Lock in this season', onSelect: () => actions.onLock(item, true) },
      ]
    : [];

  return (
    <article
      aria-labelledby={titleId}
      data-item-id={item.id}
      data-part-number={item.partNumber ?? ''}
      data-season={item.season}
      data-stage={item.stage}
      className={cn(
        'rounded-lg border bg-white p-2.5 shadow-sm',
        item.stage === 'declined' ? 'border-dashed border-loam-400 bg-loam-50' : 'border-loam-300',
        item.locked && 'border-l-4 border-l-ink-700',
        dragging && 'opacity-40',
      )}
    >
      <div className="flex items-start gap-2">
        {actions && (
          <span
            role="presentation"
            title={item.locked ? 'Locked: it cannot be dragged' : 'Drag to another season'}
            data-drag-handle
            onPointerDown={(event) => actions.onDragStart(item, event)}
            className={cn(
              '-ml-1 flex min-h-11 w-7 shrink-0 touch-none items-center justify-center rounded text-loam-600 select-none',
              item.locked ? 'cursor-not-allowed opacity-50' : 'cursor-grab hover:bg-loam-100 hover:text-ink-800 active:cursor-grabbing',
            )}
          >
            <GripIcon />
          </span>
        )}
        <div className="min-w-0 flex-1">
          <h3 id={titleId} className="flex items-start gap-2 leading-snug font-bold text-ink-950">
            {isCategory(item.category) && (
              <span className="mt-0.5">
                <GlyphIcon category={item.category} size={18} />
              </span>
            )}
            <span className="min-w-0 flex-1">{item.partName}</span>
          </h3>
          <p className="mt-0.5 text-sm text-loam-700">
            {item.partNumber && <span className="font-mono">{item.partNumber}</span>}
            {item.planterName && <span> · {item.planterName}</span>}
            <span className="tabular"> · × {item.quantity}</span>
          </p>
        </div>
      </div>

      <p className="mt-2 text-sm tabular text-loam-800" aria-label={`Parts ${formatUsd(item.partsUsd)} plus labour ${formatUsd(item.labourUsd)} makes ${formatUsd(item.costUsd)}`}>
        {formatUsd(item.partsUsd)} parts + {formatUsd(item.labourUsd)} labour ({formatHours(item.labourHours)}) ={' '}
        <span className="text-base font-bold text-ink-950">{formatUsd(item.costUsd)}</span>
      </p>

      <div className="mt-1.5 flex flex-wrap items-center gap-x-2">
        {actions ? (
          // Staff open the stage and lock menu from the chip itself.
          <ActionMenu
            label={`Stage: ${STAGE_META[item.stage].label}. Change the stage or lock of ${item.partName}`}
            className="-ml-1 border-transparent bg-transparent px-1 hover:border-loam-300"
            buttonContent={
              <>
                <StageChip stage={item.stage} />
                <span aria-hidden="true" className="text-loam-700">
                  ▾
                </span>
              </>
            }
            entries={menu}
          />
        ) : (
          <StageChip stage={item.stage} />
        )}
        {item.locked && (
          <span className="inline-flex items-center gap-1 text-sm font-semibold text-ink-700" title="Locked in this season">
            <LockIcon locked />
            Locked
          </span>
        )}
        <span className="text-sm text-loam-700 tabular">{formatProbability(item.probability)} likely</span>
      </div>

      {served.length > 0 && (
        <div className="mt-2">
          <p className="sr-only">Serves the goals:</p>
          <ul className="flex flex-wrap gap-1.5" aria-label="Goals it serves">
            {served.map((g) => (
              <li key={g.id} className="rounded-md bg-ink-50 px-2 py-0.5 text-sm text-ink-800" title={GOAL_LABELS[g.kind]}>
                <span aria-hidden="true">◎ </span>
                {g.label} <span className="whitespace-nowrap text-ink-600 tabular">by {g.targetSeason}</span>
              </li>
            ))}
          </ul>
        </div>
      )}

      <details className="group mt-2">
        <summary className="inline-flex min-h-11 cursor-pointer items-center gap-1 rounded font-semibold text-ink-700 hover:text-ink-900">
          <span aria-hidden="true" className="inline-block transition-transform group-open:rotate-90">
            ›
          </span>
          Why {item.season}
        </summary>
        <p className="mt-1 text-sm text-loam-800">{item.explanation}</p>
      </details>

      {actions && (
        <button
          type="button"
          onClick={() => actions.onMove(item)}
          className="mt-1 inline-flex min-h-11 w-full items-center justify-center rounded-lg border border-loam-400 bg-white px-2.5 font-semibold text-ink-800 hover:bg-loam-100"
          aria-describedby={titleId}
        >
          Move to season…
        </button>
      )}
    </article>
  );
}
