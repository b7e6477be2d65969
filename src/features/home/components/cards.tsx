import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { cn } from '@/lib/cn';
import { Skeleton } from '@/components/ui/states';

export const countFormat = new Intl.NumberFormat('en-US');

export function Panel({ title, titleId, children, className }: { title: ReactNode; titleId: string; children: ReactNode; className?: string }) {
  return (
    <section aria-labelledby={titleId} className={cn('rounded-xl border border-loam-200 bg-white p-5 shadow-sm sm:p-6', className)}>
      <h2 id={titleId} className="mb-4 text-lg font-bold text-ink-900">
        {title}
      </h2>
      {children}
    </section>
  );
}

/** A big number with what it counts; a link when there is a page behind it. */
export function StatCard({ label, value, to, linkLabel, loading }: { label: string; value: number | undefined; to?: string; linkLabel?: string; loading?: boolean }) {
  return (
    <div className="rounded-xl border border-loam-200 bg-white p-5 shadow-sm">
      <p className="font-semibold text-loam-700">{label}</p>
      {loading || value === undefined ? (
        <Skeleton className="mt-2 h-10 w-20" />
      ) : (
        <p className="mt-1 text-4xl font-bold text-ink-900 tabular">{countFormat.format(value)}</p>
      )}
      {to && linkLabel && (
        <Link to={to} className="-ml-2 mt-2 inline-flex min-h-11 items-center rounded px-2 font-semibold text-ink-700 underline underline-offset-4 hover:text-ink-900">
          {linkLabel}
        </Link>
      )}
    </div>
  );
}

/** What is not in Rowpath yet, said plainly instead of an empty widget. */
export function ComingNote({ children }: { children: ReactNode }) {
  return <p className="rounded-xl border border-dashed border-loam-400 px-5 py-4 text-loam-700">{children}</p>;
}
