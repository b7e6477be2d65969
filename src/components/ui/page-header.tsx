import type { ReactNode } from 'react';

/**
 * The page's h1. tabIndex -1 lets the layout move focus here after navigation, so screen-reader
 * and keyboard users start at the new page's title.
 */
export function PageHeader({ title, description, actions }: { title: ReactNode; description?: ReactNode; actions?: ReactNode }) {
  return (
    <div className="mb-6 flex flex-wrap items-end justify-between gap-4">
      <div>
        <h1 tabIndex={-1} data-page-title className="text-2xl font-bold text-ink-900 outline-none sm:text-3xl">
          {title}
        </h1>
        {description && <p className="mt-1 max-w-prose text-loam-700">{description}</p>}
      </div>
      {actions && <div className="flex flex-wrap gap-2">{actions}</div>}
    </div>
  );
}
