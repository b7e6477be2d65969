import type { ReactNode } from 'react';
import { cn } from '@/lib/cn';
import { Button } from './button';
import { ErrorMark } from './form-field';
import { Spinner } from './spinner';

export function Skeleton({ className }: { className?: string }) {
  return <span aria-hidden="true" className={cn('block animate-pulse rounded bg-loam-200', className ?? 'h-4 w-full')} />;
}

/** A polite "Loading…" line for screen readers plus a visible spinner. */
export function LoadingBlock({ label = 'Loading…', className }: { label?: string; className?: string }) {
  return (
    <div role="status" className={cn('flex items-center gap-3 py-6 text-loam-700', className)}>
      <Spinner />
      <span>{label}</span>
    </div>
  );
}

export function EmptyState({ title, children, action }: { title: ReactNode; children?: ReactNode; action?: ReactNode }) {
  return (
    <div className="rounded-xl border border-dashed border-loam-400 bg-white px-6 py-10 text-center">
      <EmptyMark />
      <p className="mt-3 text-lg font-semibold text-ink-900">{title}</p>
      {children && <div className="mx-auto mt-1 max-w-prose text-loam-700">{children}</div>}
      {action && <div className="mt-4 flex justify-center">{action}</div>}
    </div>
  );
}

/** Three empty furrows: the "nothing here yet" picture. */
function EmptyMark() {
  return (
    <svg viewBox="0 0 48 32" className="mx-auto h-8 w-12 text-loam-400" aria-hidden="true" fill="none">
      <path d="M4 8h40M4 16h40M4 24h40" stroke="currentColor" strokeWidth="3" strokeLinecap="round" strokeDasharray="1 6" />
    </svg>
  );
}

export function ErrorState({
  title = 'This could not be loaded',
  message,
  onRetry,
  retrying = false,
}: {
  title?: ReactNode;
  message?: ReactNode;
  onRetry?: () => void;
  retrying?: boolean;
}) {
  return (
    <div role="alert" className="rounded-xl border border-brick-300 bg-brick-50 px-6 py-6">
      <p className="flex items-center gap-2 text-lg font-semibold text-brick-800">
        <ErrorMark className="mt-0 size-5" />
        {title}
      </p>
      {message && <p className="mt-1 text-brick-800">{message}</p>}
      {onRetry && (
        <Button variant="secondary" className="mt-4" onClick={onRetry} busy={retrying}>
          Try again
        </Button>
      )}
    </div>
  );
}
