import type { ReactNode } from 'react';
import { cn } from '@/lib/cn';
import type { FigureView } from '../model/figures';
import { formatFigure } from '../model/figures';

/** An up or down arrowhead beside a change, so its direction reads without colour. */
function ChangeMark({ up }: { up: boolean }) {
  return (
    <svg viewBox="0 0 10 10" className="size-2.5 shrink-0" aria-hidden="true">
      <path d={up ? 'M5 1 9.5 8.5h-9Z' : 'M5 9 .5 1.5h9Z'} fill="currentColor" />
    </svg>
  );
}

/** "+42 ac/day vs stored", "same as stored", "new", or what it was. */
export function ChangeNote({
  view,
  compareLabel,
  className,
  compact = false,
}: {
  view: FigureView;
  compareLabel: string;
  className?: string;
  /** In a table cell: no "vs …" words (the table says what changes are against). */
  compact?: boolean;
}) {
  let content: ReactNode;
  if (view.presence === 'both' && view.deltaText) {
    content = (
      <span className="inline-flex items-center gap-1 rounded-full bg-ink-50 px-2 py-0.5 font-semibold whitespace-nowrap text-ink-800 ring-1 ring-ink-200 ring-inset">
        <ChangeMark up={(view.delta ?? 0) > 0} />
        {view.deltaText}
        {!compact && <span className="font-normal text-ink-700"> vs {compareLabel}</span>}
      </span>
    );
  } else if (view.presence === 'both') {
    content = <span className="whitespace-nowrap text-loam-600">{compact ? 'same' : `same as ${compareLabel}`}</span>;
  } else if (view.presence === 'new') {
    content = <span className="font-semibold text-ink-800">new: not in the {compareLabel} figures</span>;
  } else if (view.presence === 'gone' && view.baseValue !== undefined) {
    content = <span className="text-loam-700">was {formatFigure(view.def, view.baseValue)}</span>;
  } else {
    return null;
  }
  return (
    <span className={cn('text-sm', className)} data-figure-change={view.def.key}>
      {content}
    </span>
  );
}

/** The figure's value (or why it is missing) with its raw number for tests and tools. */
export function FigureValue({ view, className }: { view: FigureView; className?: string }) {
  return (
    <span
      data-figure={view.def.key}
      data-value={view.value === undefined ? '' : String(view.value)}
      className={cn('tabular', view.value === undefined && 'text-loam-600', className)}
    >
      {view.text ?? '—'}
    </span>
  );
}

/** One figure as a card: label, value with unit, change, and the formula in words with its source. */
export function FigureCard({ view, compareLabel, note }: { view: FigureView; compareLabel: string; note?: ReactNode }) {
  const { def } = view;
  return (
    <div className="flex flex-col rounded-lg border border-loam-200 bg-loam-50 p-3">
      <dt className="text-sm font-semibold text-loam-700">{def.label}</dt>
      <dd className="mt-0.5 flex flex-1 flex-col">
        <span className="flex flex-wrap items-baseline gap-x-2 gap-y-1">
          <FigureValue view={view} className="text-2xl font-bold text-ink-900" />
          <ChangeNote view={view} compareLabel={compareLabel} />
        </span>
        {view.value === undefined && <span className="mt-1 text-sm text-loam-700 italic">{def.missing}</span>}
        {note}
        <span className="mt-2 text-sm leading-snug text-loam-700">
          {def.explain} <span className="text-loam-600">Source: {def.source}.</span>
        </span>
      </dd>
    </div>
  );
}

export function FigureGrid({ views, compareLabel, className }: { views: FigureView[]; compareLabel: string; className?: string }) {
  return (
    <dl className={cn('grid gap-3 sm:grid-cols-2', className)}>
      {views.map((view) => (
        <FigureCard key={view.def.key} view={view} compareLabel={compareLabel} />
      ))}
    </dl>
  );
}
