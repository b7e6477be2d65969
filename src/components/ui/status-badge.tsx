import type { ReactNode } from 'react';
import { cn } from '@/lib/cn';

export type BadgeTone = 'good' | 'soon' | 'bad' | 'neutral' | 'info';
export type BadgeShape = 'dot' | 'ring' | 'dash' | 'cross' | 'triangle';

const tones: Record<BadgeTone, string> = {
  good: 'bg-seedling-50 text-seedling-800 ring-seedling-300',
  soon: 'bg-amber-50 text-amber-800 ring-amber-300',
  bad: 'bg-brick-50 text-brick-800 ring-brick-300',
  neutral: 'bg-loam-100 text-loam-800 ring-loam-300',
  info: 'bg-ink-50 text-ink-800 ring-ink-200',
};

/** The shape carries the status as well as the colour and the word: three ways to read it. */
function Shape({ shape }: { shape: BadgeShape }) {
  return (
    <svg viewBox="0 0 12 12" className="size-3 shrink-0" aria-hidden="true">
      {shape === 'dot' && <circle cx="6" cy="6" r="5" fill="currentColor" />}
      {shape === 'ring' && <circle cx="6" cy="6" r="4" fill="none" stroke="currentColor" strokeWidth="2" />}
      {shape === 'dash' && <rect x="1" y="5" width="10" height="2.4" rx="1" fill="currentColor" />}
      {shape === 'cross' && <path d="M2 2l8 8M10 2 2 10" stroke="currentColor" strokeWidth="2.2" strokeLinecap="round" />}
      {shape === 'triangle' && <path d="M6 1 11 11H1L6 1Z" fill="currentColor" />}
    </svg>
  );
}

export function StatusBadge({ tone, shape, children }: { tone: BadgeTone; shape: BadgeShape; children: ReactNode }) {
  return (
    <span
      className={cn(
        'inline-flex items-center gap-1.5 rounded-full px-2.5 py-0.5 text-sm font-semibold whitespace-nowrap ring-1 ring-inset',
        tones[tone],
      )}
    >
      <Shape shape={shape} />
      {children}
    </span>
  );
}
