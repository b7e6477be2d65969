import type { ReactNode } from 'react';
import type { RoadmapStageName } from '@shared/schemas/roadmap';
import { cn } from '@/lib/cn';
import { budgetStatus } from '../model/budget';
import { formatUsd } from '../model/format';
import { STAGE_META, type StageShape, type StageTone } from '../model/stages';

const toneClasses: Record<StageTone, string> = {
  neutral: 'bg-loam-100 text-loam-800 ring-loam-300',
  info: 'bg-ink-50 text-ink-800 ring-ink-200',
  soon: 'bg-amber-50 text-amber-800 ring-amber-300',
  good: 'bg-seedling-50 text-seedling-800 ring-seedling-300',
  bad: 'bg-brick-50 text-brick-800 ring-brick-300',
};

export function StageShapeIcon({ shape, className }: { shape: StageShape; className?: string }) {
  return (
    <svg viewBox="0 0 12 12" className={cn('size-3 shrink-0', className)} aria-hidden="true">
      {shape === 'open' && <circle cx="6" cy="6" r="4.2" fill="none" stroke="currentColor" strokeWidth="1.6" strokeDasharray="1.6 1.6" />}
      {shape === 'ring' && <circle cx="6" cy="6" r="4.2" fill="none" stroke="currentColor" strokeWidth="2" />}
      {shape === 'half' && (
        <>
          <circle cx="6" cy="6" r="4.2" fill="none" stroke="currentColor" strokeWidth="1.6" />
          <path d="M6 1.8a4.2 4.2 0 0 1 0 8.4Z" fill="currentColor" />
        </>
      )}
      {shape === 'check' && <path d="M1.8 6.4 4.8 9.2 10.4 2.8" fill="none" stroke="currentColor" strokeWidth="2.2" strokeLinecap="round" strokeLinejoin="round" />}
      {shape === 'square' && <rect x="1.8" y="1.8" width="8.4" height="8.4" rx="1" fill="currentColor" />}
      {shape === 'dot' && <circle cx="6" cy="6" r="5" fill="currentColor" />}
      {shape === 'cross' && <path d="M2 2l8 8M10 2 2 10" stroke="currentColor" strokeWidth="2.2" strokeLinecap="round" />}
    </svg>
  );
}

/** The stage as a labelled chip: word, shape and tone. */
export function StageChip({ stage, className }: { stage: RoadmapStageName; className?: string }) {
  const meta = STAGE_META[stage];
  return (
    <span
      data-stage={stage}
      title={meta.hint}
      className={cn('inline-flex items-center gap-1.5 rounded-full px-2.5 py-0.5 text-sm font-semibold whitespace-nowrap ring-1 ring-inset', toneClasses[meta.tone], className)}
    >
      <StageShapeIcon shape={meta.shape} />
      {meta.label}
    </span>
  );
}

/** A padlock, open or shut. */
export function LockIcon({ locked, className }: { locked: boolean; className?: string }) {
  return (
    <svg viewBox="0 0 16 16" className={cn('size-4 shrink-0', className)} aria-hidden="true" fill="none" stroke="currentColor" strokeWidth="1.7" strokeLinecap="round">
      <rect x="3" y="7" width="10" height="7" rx="1.5" fill={locked ? 'currentColor' : 'none'} />
      {locked ? <path d="M5.5 7V5a2.5 2.5 0 0 1 5 0v2" /> : <path d="M5.5 7V5a2.5 2.5 0 0 1 4.9-.7" />}
    </svg>
  );
}

/** A warning triangle ("!"), for waste and problems: read by shape as well as colour. */
export function WarnIcon({ className }: { className?: string }) {
  return (
    <svg viewBox="0 0 20 20" className={cn('size-5 shrink-0', className)} aria-hidden="true">
      <path d="M10 2 19 18H1L10 2Z" fill="currentColor" />
      <path d="M10 8v4.5" stroke="white" strokeWidth="2" strokeLinecap="round" />
      <circle cx="10" cy="15.2" r="1.1" fill="white" />
    </svg>
  );
}

export function CheckIcon({ className }: { className?: string }) {
  return (
    <svg viewBox="0 0 20 20" className={cn('size-5 shrink-0', className)} aria-hidden="true">
      <circle cx="10" cy="10" r="9" fill="currentColor" />
      <path d="M5.8 10.4 8.6 13.1 14.3 7" fill="none" stroke="white" strokeWidth="2.2" strokeLinecap="round" strokeLinejoin="round" />
    </svg>
  );
}

/**
 * A season's spend against its budget: a bar, the numbers, and over budget said with a word and
 * a notch shape beyond the bar's end (never colour alone).
 */
export function BudgetBar({ costUsd, budgetUsd, compact = false }: { costUsd: number; budgetUsd: number | null; compact?: boolean }) {
  const status = budgetStatus(costUsd, budgetUsd);
  const width = status.kind === 'no-budget' ? 0 : Math.min(1, status.usedFraction) * 100;
  return (
    <div data-budget-status={status.kind}>
      <p className={cn('flex flex-wrap items-baseline justify-between gap-x-2 tabular', compact ? 'text-sm' : '')}>
        <span>
          <span className="font-bold text-ink-950">{formatUsd(costUsd)}</span>
          <span className="text-loam-700"> of {budgetUsd === null ? 'no budget set' : formatUsd(budgetUsd)}</span>
        </span>
        {status.kind === 'over' && (
          <span className="inline-flex items-center gap-1 font-bold text-brick-700">
            <WarnIcon className="size-4" />
            Over by {formatUsd(status.overByUsd)}
          </span>
        )}
        {status.kind === 'near' && <span className="font-semibold text-amber-800">Nearly spent</span>}
        {status.kind === 'within' && budgetUsd !== null && <span className="text-loam-700">{formatUsd(status.leftUsd)} left</span>}
      </p>
      {status.kind !== 'no-budget' && (
        <div className="relative mt-1.5 h-2.5 rounded-full bg-loam-200" aria-hidden="true">
          <div
            className={cn('h-full rounded-full', status.kind === 'over' ? 'bg-brick-600' : status.kind === 'near' ? 'bg-amber-500' : 'bg-seedling-600')}
            style={{ width: `${width}%` }}
          />
          {status.kind === 'over' && (
            // Hatched cap past the end of the bar: "over" as a shape.
            <svg viewBox="0 0 12 14" className="absolute -top-0.5 -right-2 h-3.5 w-3 text-brick-700">
              <path d="M0 0h4l8 7-8 7H0l8-7Z" fill="currentColor" />
            </svg>
          )}
        </div>
      )}
    </div>
  );
}

/** A titled card section of the roadmap page. */
export function Panel({ id, title, description, action, children, className }: { id: string; title: ReactNode; description?: ReactNode; action?: ReactNode; children: ReactNode; className?: string }) {
  return (
    <section id={id} aria-labelledby={`${id}-title`} className={cn('scroll-mt-24 rounded-xl border border-loam-200 bg-white p-5 shadow-sm', className)}>
      <div className="mb-3 flex flex-wrap items-start justify-between gap-3">
        <div>
          <h2 id={`${id}-title`} className="text-xl font-bold text-ink-900">
            {title}
          </h2>
          {description && <p className="mt-0.5 text-loam-700">{description}</p>}
        </div>
        {action}
      </div>
      {children}
    </section>
  );
}
