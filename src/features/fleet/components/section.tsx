import type { ReactNode } from 'react';
import { cn } from '@/lib/cn';

/**
 * One part of an account's fleet page: a titled card with a count and its own "Add" action. The
 * id doubles as the anchor the page's "On this page" list jumps to.
 */
export function FleetSection({
  id,
  title,
  count,
  description,
  action,
  children,
  className,
}: {
  id: string;
  title: string;
  count?: number;
  description?: ReactNode;
  action?: ReactNode;
  children: ReactNode;
  className?: string;
}) {
  return (
    <section id={id} aria-labelledby={`${id}-title`} className={cn('scroll-mt-24 rounded-xl border border-loam-200 bg-white p-5 shadow-sm sm:p-6', className)}>
      <div className="mb-4 flex flex-wrap items-start justify-between gap-3">
        <div>
          <h2 id={`${id}-title`} className="flex items-baseline gap-2 text-xl font-bold text-ink-900">
            {title}
            {count !== undefined && (
              <span className="rounded-full bg-loam-100 px-2 py-0.5 text-sm font-semibold text-loam-800 tabular">
                {count}
                <span className="sr-only"> recorded</span>
              </span>
            )}
          </h2>
          {description && <p className="mt-0.5 text-loam-700">{description}</p>}
        </div>
        {action}
      </div>
      {children}
    </section>
  );
}

/** A row of facts with small labels: "Flow 55 gpm · Pressure 3,000 psi". */
export function FactList({ items }: { items: Array<{ label: string; value: ReactNode } | null | false> }) {
  const shown = items.filter((i): i is { label: string; value: ReactNode } => Boolean(i));
  return (
    <dl className="flex flex-wrap gap-x-5 gap-y-1">
      {shown.map((item) => (
        <div key={item.label} className="flex items-baseline gap-1.5">
          <dt className="text-sm text-loam-700">{item.label}</dt>
          <dd className="font-semibold text-ink-950 tabular">{item.value}</dd>
        </div>
      ))}
    </dl>
  );
}

export function Missing({ text = 'Not recorded' }: { text?: string }) {
  return <span className="text-loam-700 italic">{text}</span>;
}
