import { useQuery } from '@tanstack/react-query';
import { Fragment, useState, type FormEvent } from 'react';
import { shopWeekSchema } from '@shared/schemas/forecast';
import { Button } from '@/components/ui/button';
import { ErrorMark, inputClasses } from '@/components/ui/form-field';
import { ErrorState, LoadingBlock } from '@/components/ui/states';
import { StatusBadge } from '@/components/ui/status-badge';
import { isApiError } from '@/lib/api';
import { cn } from '@/lib/cn';
import { installWindow, isBusy, loadShare, shopCapacityQueryOptions, usePutShopWeekMutation, weekStatus, type ShopWeek } from '../api/shop-capacity';

const hoursFormat = new Intl.NumberFormat('en-US', { maximumFractionDigits: 1 });
const h = (value: number) => `${hoursFormat.format(value)} h`;
const usd = new Intl.NumberFormat('en-US', { style: 'currency', currency: 'USD', maximumFractionDigits: 0 });
const dayFormat = new Intl.DateTimeFormat('en-US', { month: 'short', day: 'numeric', timeZone: 'UTC' });
const yearDayFormat = new Intl.DateTimeFormat('en-US', { month: 'short', day: 'numeric', year: 'numeric', timeZone: 'UTC' });
const day = (iso: string) => dayFormat.format(new Date(`${iso}T00:00:00Z`));
const yearDay = (iso: string) => yearDayFormat.format(new Date(`${iso}T00:00:00Z`));

function WeekStatusBadge({ week }: { week: ShopWeek }) {
  const status = weekStatus(week);
  if (status === 'over') return <StatusBadge tone="bad" shape="triangle">Over by {h(week.hoursOver)}</StatusBadge>;
  if (status === 'near') return <StatusBadge tone="soon" shape="ring">Nearly full</StatusBadge>;
  return <StatusBadge tone="good" shape="dot">Room</StatusBadge>;
}

function LoadBar({ week }: { week: ShopWeek }) {
  const share = loadShare(week);
  const pct = Number.isFinite(share) ? Math.min(100, Math.round(share * 100)) : 100;
  const status = weekStatus(week);
  return (
    <span className="flex min-w-32 items-center gap-2" aria-hidden="true">
      <span className="relative h-3 flex-1 overflow-hidden rounded-full bg-loam-200">
        <span
          className={cn('absolute inset-y-0 left-0 rounded-full', status === 'over' ? 'bg-brick-500' : status === 'near' ? 'bg-amber-400' : 'bg-seedling-500')}
          style={{ width: `${pct}%` }}
        />
      </span>
      <span className="w-12 text-right text-sm tabular text-loam-800">{Number.isFinite(share) ? `${Math.round(share * 100)} %` : '—'}</span>
    </span>
  );
}

function TechnicianHoursEditor({ week }: { week: ShopWeek }) {
  const [text, setText] = useState(String(week.technicianHours));
  const [error, setError] = useState<string | null>(null);
  const putWeek = usePutShopWeekMutation();
  const inputId = `tech-hours-${week.weekStart}`;

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const cleaned = text.trim();
    const value = cleaned === '' ? null : /^\d+(\.\d+)?$/.test(cleaned) ? Number(cleaned) : Number.NaN;
    // The shared schema: the same refusal, in the same words, as the server.
    const parsedWeek = shopWeekSchema.safeParse({ technicianHours: value });
    if (!parsedWeek.success) return setError(parsedWeek.error.issues[0]?.message ?? 'Check the hours');
    setError(null);
    putWeek.mutate(
      { weekStart: week.weekStart, technicianHours: parsedWeek.data.technicianHours },
      { onError: (failure) => setError(isApiError(failure) ? (failure.fields.technicianHours ?? failure.message) : 'The hours could not be saved') },
    );
  };

  return (
    <form onSubmit={submit} noValidate className="flex items-start gap-2" data-week-hours-form={week.weekStart}>
      <div className="w-28">
        <label htmlFor={inputId} className="sr-only">
          Technician hours, week of {yearDay(week.weekStart)} (empty for the default)
        </label>
        <div className="relative">
          <input
            id={inputId}
            type="text"
            inputMode="decimal"
            className={cn(inputClasses, 'pr-8 text-right tabular')}
            value={text}
            onChange={(event) => setText(event.target.value)}
            aria-invalid={error ? true : undefined}
            aria-describedby={error ? `${inputId}-error` : undefined}
            autoComplete="off"
          />
          <span className="pointer-events-none absolute inset-y-0 right-3 flex items-center text-loam-700" aria-hidden="true">
            h
          </span>
        </div>
        {error && (
          <p id={`${inputId}-error`} className="mt-1 flex items-start gap-1.5 text-sm font-semibold text-brick-700">
            <ErrorMark />
            <span>{error}</span>
          </p>
        )}
      </div>
      <Button type="submit" variant="secondary" busy={putWeek.isPending} className="px-3 print:hidden">
        Set<span className="sr-only"> technician hours for the week of {yearDay(week.weekStart)}</span>
      </Button>
    </form>
  );
}

function MovableList({ week }: { week: ShopWeek }) {
  if (week.movableCount === 0) {
    return (
      <p className="text-loam-800">
        No item you can see could move: every booking this week is locked (accepted or ordered by the grower). Add technician hours, or agree a new
        date with a grower.
      </p>
    );
  }
  return (
    <div>
      <p className="mb-2 font-semibold text-ink-900">
        Items that could move to another week ({week.movableCount}
        {week.movableCount > week.movableItems.length ? `, first ${week.movableItems.length} shown` : ''}), smallest labour first:
      </p>
      <ul className="grid gap-1.5 sm:grid-cols-2">
        {week.movableItems.map((item) => (
          <li key={item.id} className="rounded-lg border border-loam-200 bg-white px-3 py-2" data-movable-item={item.id}>
            <span className="block font-semibold text-ink-900">{item.componentName}</span>
            <span className="block text-sm text-loam-800">
              {item.accountName} · {h(item.labourHours)} · {usd.format(item.totalUsd)} · {item.stage}
              {item.specialistName ? ` · ${item.specialistName}` : ''}
            </span>
          </li>
        ))}
      </ul>
    </div>
  );
}

/**
 * Install labour booked per week (accepted and ordered items) from harvest to planting, against
 * the shop's technician hours. An over-capacity week is flagged with a word and a triangle and
 * lists the items that could move. Managers set a week's technician hours in place.
 */
export function ShopCapacitySection({ season, canEdit }: { season: number; canEdit: boolean }) {
  const span = installWindow(season);
  const capacity = useQuery(shopCapacityQueryOptions(span));
  const overWeeks = capacity.data?.weeks.filter((w) => w.over) ?? [];
  // Quiet weeks (nothing booked, default hours) fold away unless asked for: the busy ones matter.
  const [showAll, setShowAll] = useState(false);
  const busyWeeks = capacity.data?.weeks.filter(isBusy) ?? [];
  const shownWeeks = showAll ? (capacity.data?.weeks ?? []) : busyWeeks;
  const quietCount = (capacity.data?.weeks.length ?? 0) - busyWeeks.length;

  return (
    <section aria-labelledby="shop-capacity-title" className="mb-8" id="shop-capacity" data-shop-capacity>
      <h2 id="shop-capacity-title" className="mb-1 text-xl font-bold text-ink-900">
        Shop capacity, harvest to planting {season}
      </h2>
      <p className="mb-3 max-w-prose text-loam-700">
        Install hours booked (accepted and ordered items, whole shop) each week from {yearDay(span.from)} to {yearDay(span.to)}, against the technician
        hours available{capacity.data ? ` (${h(capacity.data.defaultTechnicianHours)} a week unless set)` : ''}.
      </p>
      {capacity.isError ? (
        <ErrorState title="Shop capacity could not be loaded" message={capacity.error.message} onRetry={() => void capacity.refetch()} retrying={capacity.isFetching} />
      ) : capacity.isPending ? (
        <LoadingBlock label="Loading shop weeks…" />
      ) : (
        <>
          <p className="mb-3 flex flex-wrap items-center gap-3" role="status" data-over-summary>
            {overWeeks.length ? (
              <StatusBadge tone="bad" shape="triangle">
                {overWeeks.length} {overWeeks.length === 1 ? 'week' : 'weeks'} over capacity
              </StatusBadge>
            ) : (
              <StatusBadge tone="good" shape="dot">No week over capacity</StatusBadge>
            )}
            <span className="text-loam-800 tabular">
              {h(capacity.data.totals.bookedHours)} booked of {h(capacity.data.totals.technicianHours)} available
            </span>
          </p>
          <div className="overflow-x-auto rounded-xl border border-loam-200 bg-white shadow-sm" role="region" aria-label="Shop weeks" tabIndex={0}>
            <table className={cn('w-full border-collapse text-left', capacity.isPlaceholderData && 'opacity-70')}>
              <caption className="sr-only">Shop weeks: booked install hours against technician hours</caption>
              <thead className="bg-loam-100 text-sm text-loam-800">
                <tr>
                  <th scope="col" className="px-4 py-3 font-semibold">Week</th>
                  <th scope="col" className="px-4 py-3 text-right font-semibold">Booked</th>
                  <th scope="col" className="px-4 py-3 font-semibold">Technician hours</th>
                  <th scope="col" className="px-4 py-3 font-semibold">Load</th>
                  <th scope="col" className="px-4 py-3 font-semibold">Status</th>
                </tr>
              </thead>
              <tbody className="divide-y divide-loam-200">
                {shownWeeks.map((week) => (
                  <Fragment key={week.weekStart}>
                    <tr data-shop-week={week.weekStart} data-over={week.over ? 'true' : 'false'} className={cn(week.over && 'bg-brick-50')}>
                      <th scope="row" className={cn('px-4 py-1.5 font-semibold whitespace-nowrap text-ink-900', week.over && 'border-l-4 border-brick-600')}>
                        {day(week.weekStart)} – {day(week.weekEnd)}
                      </th>
                      <td className="px-4 py-1.5 text-right tabular">
                        {h(week.bookedHours)}
                        {week.bookedHoursInScope !== week.bookedHours && <span className="block text-sm text-loam-700">{h(week.bookedHoursInScope)} yours</span>}
                      </td>
                      <td className="px-4 py-1.5">
                        {canEdit ? (
                          <TechnicianHoursEditor key={`${week.technicianHours}-${week.technicianHoursSet}`} week={week} />
                        ) : (
                          <span className="tabular">{h(week.technicianHours)}</span>
                        )}
                        {week.technicianHoursSet && <span className="block text-sm text-loam-700">Set for this week</span>}
                      </td>
                      <td className="px-4 py-1.5">
                        <LoadBar week={week} />
                      </td>
                      <td className="px-4 py-1.5">
                        <WeekStatusBadge week={week} />
                      </td>
                    </tr>
                    {week.over && (
                      <tr className="bg-brick-50" data-movable-for={week.weekStart}>
                        <td colSpan={5} className="border-l-4 border-brick-600 px-4 pt-1 pb-3">
                          <MovableList week={week} />
                        </td>
                      </tr>
                    )}
                  </Fragment>
                ))}
                {shownWeeks.length === 0 && (
                  <tr>
                    <td colSpan={5} className="px-4 py-4 text-loam-700">
                      Nothing booked for the shop in these weeks yet.
                    </td>
                  </tr>
                )}
              </tbody>
            </table>
          </div>
          {quietCount > 0 && (
            <Button variant="ghost" className="mt-2 print:hidden" aria-expanded={showAll} onClick={() => setShowAll((v) => !v)}>
              {showAll ? `Hide the ${quietCount} quiet weeks` : `Show all ${capacity.data.weeks.length} weeks (${quietCount} with nothing booked)`}
            </Button>
          )}
        </>
      )}
    </section>
  );
}
