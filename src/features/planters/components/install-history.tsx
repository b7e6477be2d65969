import { useState } from 'react';
import { Button } from '@/components/ui/button';
import type { Install, PlanterDetail } from '@/features/fleet/api/types';
import { GlyphIcon } from '@/features/fleet/components/component-glyph';
import { formatDate, formatUsd } from '@/features/fleet/lib/labels';
import { installTimeline, placementText } from '../lib/planter-layout';

const PAGE = 12;

/**
 * Every install and removal on the planter as a timeline, newest first: the mark on the line says
 * which it was (a filled dot for fitted, a cross for removed) as well as the word.
 */
export function InstallHistory({ planter }: { planter: PlanterDetail }) {
  const events = installTimeline<Install>(planter.installs);
  const [shown, setShown] = useState(PAGE);
  if (events.length === 0) return <p className="text-loam-700">Nothing has been recorded on this planter yet.</p>;
  let lastYear: string | null = null;
  return (
    <>
      <ol className="border-l-2 border-loam-300">
        {events.slice(0, shown).map((event) => {
          const year = event.date ? event.date.slice(0, 4) : 'Date not recorded';
          const showYear = year !== lastYear;
          lastYear = year;
          const c = event.install.component;
          return (
            <li key={event.key} className="relative pb-4 pl-6 last:pb-0">
              {showYear && (
                <p className="mb-2 text-sm font-bold text-loam-800">
                  <span className="rounded bg-loam-100 px-2 py-0.5">{year}</span>
                </p>
              )}
              <span aria-hidden="true" className="absolute -left-[0.55rem] mt-1.5 flex size-4 items-center justify-center rounded-full bg-white">
                {event.kind === 'installed' ? (
                  <svg viewBox="0 0 12 12" className="size-3.5"><circle cx="6" cy="6" r="5" fill="#17776b" /></svg>
                ) : (
                  <svg viewBox="0 0 12 12" className="size-3.5"><path d="M2 2l8 8M10 2 2 10" stroke="#752f25" strokeWidth="2.4" strokeLinecap="round" /></svg>
                )}
              </span>
              <div className="flex flex-wrap items-baseline gap-x-2">
                <span className="font-semibold text-ink-900">{event.kind === 'installed' ? 'Installed' : 'Removed'}</span>
                <span className="text-loam-700">{event.date ? formatDate(event.date) : 'date not recorded'}</span>
              </div>
              <p className="flex items-center gap-2 text-ink-950">
                {c && <GlyphIcon category={c.category} size={18} />}
                <span>
                  {c?.name ?? 'Unknown part'} on {placementText(event.install, planter.toolbars)}
                  {event.kind === 'installed' && <span className="text-loam-700"> · {event.install.quantity} {event.install.quantity === 1 ? 'unit' : 'units'}</span>}
                  {event.kind === 'installed' && event.install.pricePaidUsd !== null && <span className="text-loam-700"> · {formatUsd(event.install.pricePaidUsd)}</span>}
                  {event.kind === 'installed' && event.install.workOrder && <span className="text-loam-700"> · {event.install.workOrder}</span>}
                  {event.kind === 'removed' && event.install.removedReason && <span className="text-loam-700"> · {event.install.removedReason}</span>}
                </span>
              </p>
            </li>
          );
        })}
      </ol>
      {events.length > shown && (
        <Button variant="secondary" className="mt-4" onClick={() => setShown((n) => n + PAGE * 2)}>
          Show {Math.min(PAGE * 2, events.length - shown)} older entries
        </Button>
      )}
    </>
  );
}
