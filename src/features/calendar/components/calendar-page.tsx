// The visit calendar: day, work week, week and month views of a specialist's visits and installs.
// Dragging a visit asks the server to move it; the server checks working hours, the grower's window
// and the specialist's other visits, and a refusal leaves the event where it was, with the reason.
// react-big-calendar and its CSS load with this module only (the /calendar route).
import 'react-big-calendar/lib/css/react-big-calendar.css';
import 'react-big-calendar/lib/addons/dragAndDrop/styles.css';
import './calendar.css';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { format, getDay, parse, startOfWeek } from 'date-fns';
import { enUS } from 'date-fns/locale';
import { lazy, Suspense, useMemo, useState, type SyntheticEvent } from 'react';
import { Calendar, dateFnsLocalizer, type EventProps, type Formats, type HeaderProps } from 'react-big-calendar';
import * as dragAndDropModule from 'react-big-calendar/lib/addons/dragAndDrop';
import type { EventInteractionArgs } from 'react-big-calendar/lib/addons/dragAndDrop';
import type { VisitView } from '@shared/schemas/visits';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormAlert, inputClasses } from '@/components/ui/form-field';
import { PageHeader } from '@/components/ui/page-header';
import { EmptyState, ErrorState, LoadingBlock } from '@/components/ui/states';
import { useCurrentUser } from '@/features/auth/components/current-user';
import { useLiveSearchParams } from '@/features/visits/hooks/use-live-search-params';
import { toMapRoutes } from '@/features/map/model/map-route';
import { useSpecialistChoices } from '@/features/visits/api/specialists';
import { useUpdateVisitMutation } from '@/features/visits/api/update-visit';
import { visitKeys, visitListQueryOptions, type VisitListFilters } from '@/features/visits/api/visits';
import { VisitDetailPanel } from '@/features/visits/components/visit-detail-panel';
import { PURPOSE_LETTERS, PURPOSE_SHORT, VISIT_STATUS_BADGES } from '@/features/visits/model/labels';
import { clockText, instantText, shortDateText, todayAtDealership, wallDateIso, wallDateOf } from '@/features/visits/model/zone-time';
import { currentWeekRoutesQueryOptions } from '@/features/week-plan/api/week-plans';
import { WeekRoutesPanel } from '@/features/week-plan/components/week-routes-panel';
import { dayLook } from '@/features/week-plan/model/routes';
import { cn } from '@/lib/cn';
import {
  CALENDAR_VIEW_LABELS,
  CALENDAR_VIEWS,
  dropToStart,
  isIsoDate,
  parseCalendarView,
  rangeOfView,
  routesWeekOf,
  stepDate,
  viewTitle,
  visitsToEvents,
  type CalendarView,
  type VisitEvent,
} from '../model/events';
import { SubscribePanel } from './subscribe-panel';

const TerritoryMap = lazy(() => import('@/features/map/components/territory-map'));

const localizer = dateFnsLocalizer({
  format,
  parse,
  startOfWeek: (date: Date) => startOfWeek(date, { weekStartsOn: 1 }),
  getDay,
  locales: { 'en-US': enUS },
});
// The drag-and-drop add-on ships as CommonJS only; depending on the bundler's interop its function
// arrives as the default export or one level further down.
type WithDragAndDrop = typeof dragAndDropModule.default;
const dndExports = dragAndDropModule as unknown as { default: WithDragAndDrop | { default: WithDragAndDrop } };
const withDragAndDrop: WithDragAndDrop = typeof dndExports.default === 'function' ? dndExports.default : dndExports.default.default;
const DnDCalendar = withDragAndDrop<VisitEvent>(Calendar);

// 24-hour clock, as the rest of Rowpath.
const range = ({ start, end }: { start: Date; end: Date }) => `${format(start, 'HH:mm')}–${format(end, 'HH:mm')}`;
const formats: Formats = {
  timeGutterFormat: 'HH:mm',
  eventTimeRangeFormat: range,
  eventTimeRangeStartFormat: ({ start }) => `${format(start, 'HH:mm')} –`,
  eventTimeRangeEndFormat: ({ end }) => `– ${format(end, 'HH:mm')}`,
  selectRangeFormat: range,
  dayFormat: 'EEE d MMM',
  dayHeaderFormat: 'EEEE d MMMM',
  agendaTimeFormat: 'HH:mm',
};
// The visible day: an hour either side of the default working hours (07:00–18:00).
const DAY_MIN = new Date(1970, 0, 1, 6, 0);
const DAY_MAX = new Date(1970, 0, 1, 19, 0);
const SCROLL_TO = new Date(1970, 0, 1, 6, 30);

type Message = { tone: 'error' | 'ok'; text: string } | null;

/** /calendar (staff): one specialist's visits; drag or "Move to…" to reschedule. */
export function CalendarPage() {
  const me = useCurrentUser();
  const queryClient = useQueryClient();
  const [params, setParams] = useLiveSearchParams();
  const view = parseCalendarView(params.get('view'));
  const dateParam = params.get('date');
  const date = isIsoDate(dateParam) ? dateParam : todayAtDealership();
  const specialists = useSpecialistChoices();
  const specialistParam = Number(params.get('specialist')) || undefined;
  const specialistId = me.role === 'specialist' ? me.id : (specialistParam ?? specialists.choices[0]?.id);

  const { from, to } = rangeOfView(view, date);
  const filters: VisitListFilters = { from, to, specialistId, status: 'requested,planned,done' };
  const visits = useQuery({ ...visitListQueryOptions(filters), enabled: specialistId !== undefined });
  const routesWeek = routesWeekOf(date);
  const routes = useQuery({ ...currentWeekRoutesQueryOptions({ weekStart: routesWeek, specialistId, days: 5 }), enabled: specialistId !== undefined });

  const update = useUpdateVisitMutation();
  // Moves waiting for the server's answer: the event shows there meanwhile, and snaps back on refusal.
  const [pending, setPending] = useState<Map<number, { start: Date; end: Date }>>(new Map());
  const [message, setMessage] = useState<Message>(null);
  const [openVisit, setOpenVisit] = useState<VisitView | null>(null);
  const [subscribeOpen, setSubscribeOpen] = useState(false);

  const events = useMemo(() => {
    const list = visitsToEvents(visits.data?.items ?? []);
    return list.map((e) => (pending.has(e.id) ? { ...e, ...pending.get(e.id)! } : e));
  }, [visits.data, pending]);

  const setParam = (changes: Record<string, string | undefined>) => {
    const next = new URLSearchParams(params);
    for (const [k, v] of Object.entries(changes)) {
      if (v === undefined) next.delete(k);
      else next.set(k, v);
    }
    setParams(next);
  };

  const clearPending = (id: number) =>
    setPending((prev) => {
      const next = new Map(prev);
      next.delete(id);
      return next;
    });

  const onEventDrop = ({ event, start, end, isAllDay }: EventInteractionArgs<VisitEvent>) => {
      const outcome = dropToStart(event, new Date(start), Boolean(isAllDay));
      if (!outcome.ok) {
        setMessage({ tone: 'error', text: outcome.reason });
        return;
      }
      if (!outcome.moved) return;
      setMessage(null);
      setPending((prev) => new Map(prev).set(event.id, { start: new Date(start), end: new Date(end) }));
      update.mutate(
        { id: event.id, changes: { startsAt: outcome.startsAt }, version: event.visit.version },
        {
          onSuccess: ({ visit }) => {
            // Put the answer in the list at once, so the event does not flick back while the list refetches.
            queryClient.setQueryData(visitKeys.list(filters), (old: { items: VisitView[]; total: number } | undefined) =>
              old ? { ...old, items: old.items.map((v) => (v.id === visit.id ? visit : v)) } : old,
            );
            clearPending(event.id);
            setMessage({ tone: 'ok', text: `Moved ${visit.accountName} to ${instantText(visit.startsAt!)}. The week’s routes are updated below.` });
          },
          onError: (err) => {
            clearPending(event.id);
            setMessage({ tone: 'error', text: `${event.visit.accountName} was not moved: ${err.message} The visit keeps its time.` });
          },
        },
      );
  };

  const mapRoutes = useMemo(() => (routes.data ? toMapRoutes(routes.data.days, dayLook, shortDateText, clockText) : []), [routes.data]);

  return (
    <>
      <PageHeader
        title="Calendar"
        description="Visits and installs. Drag a visit to another time or day, or open it and use “Move to…”; Rowpath checks working hours, the grower’s window and the other visits before it moves."
        actions={
          <Button variant="secondary" onClick={() => setSubscribeOpen(true)}>
            Subscribe in your calendar…
          </Button>
        }
      />

      <div className="mb-3 flex flex-wrap items-end gap-3">
        {me.role !== 'specialist' && (
          <div className="min-w-64">
            <label htmlFor="calendar-specialist" className="mb-1 block font-semibold text-ink-900">
              Specialist
            </label>
            <select id="calendar-specialist" className={inputClasses} value={specialistId ?? ''} onChange={(e) => setParam({ specialist: e.target.value || undefined })}>
              {specialists.choices.length === 0 && <option value="">{specialists.loading ? 'Loading…' : 'No specialists'}</option>}
              {specialists.choices.map((s) => (
                <option key={s.id} value={s.id}>
                  {s.name}
                </option>
              ))}
            </select>
          </div>
        )}
        <nav aria-label="Calendar dates" className="flex flex-wrap items-center gap-2">
          <Button variant="secondary" onClick={() => setParam({ date: stepDate(view, date, -1) })} aria-label={`Previous ${CALENDAR_VIEW_LABELS[view].toLowerCase()}`}>
            ‹
          </Button>
          <Button variant="secondary" onClick={() => setParam({ date: undefined })}>
            Today
          </Button>
          <Button variant="secondary" onClick={() => setParam({ date: stepDate(view, date, 1) })} aria-label={`Next ${CALENDAR_VIEW_LABELS[view].toLowerCase()}`}>
            ›
          </Button>
          <h2 className="tabular ml-2 text-xl font-bold text-ink-900" aria-live="polite">
            {viewTitle(view, date)}
          </h2>
        </nav>
        <div role="group" aria-label="View" className="ml-auto flex rounded-lg border border-loam-500 bg-white p-0.5">
          {CALENDAR_VIEWS.map((v) => (
            <button
              key={v}
              type="button"
              aria-pressed={v === view}
              onClick={() => setParam({ view: v })}
              className={cn('min-h-10 rounded-md px-3 font-semibold', v === view ? 'bg-ink-800 text-white' : 'text-ink-800 hover:bg-loam-100')}
            >
              {CALENDAR_VIEW_LABELS[v]}
            </button>
          ))}
        </div>
      </div>

      <div aria-live="polite" className="mb-3 empty:hidden">
        {message?.tone === 'error' && <FormAlert>{message.text}</FormAlert>}
        {message?.tone === 'ok' && (
          <p role="status" className="rounded-lg border-l-4 border-seedling-500 bg-seedling-50 px-4 py-3 font-semibold text-seedling-800">
            <span aria-hidden="true">✓ </span>
            {message.text}
          </p>
        )}
      </div>

      <CalendarKey />

      {specialistId === undefined ? (
        specialists.loading ? (
          <LoadingBlock />
        ) : (
          <EmptyState title="No specialist to show">There is no specialist in your territories yet.</EmptyState>
        )
      ) : visits.isError ? (
        <ErrorState message={visits.error.message} onRetry={() => void visits.refetch()} retrying={visits.isFetching} />
      ) : (
        <div className={cn('rp-calendar relative rounded-xl border border-loam-300 bg-white p-2', view === 'month' ? 'h-[46rem]' : 'h-[52rem]')} aria-busy={visits.isFetching || update.isPending}>
          {visits.isPending && <LoadingBlock label="Loading visits…" className="absolute inset-x-0 top-16 z-10 justify-center" />}
          <DnDCalendar
            localizer={localizer}
            culture="en-US"
            formats={formats}
            events={events}
            date={wallDateOf(date)}
            view={view}
            views={[...CALENDAR_VIEWS]}
            onNavigate={(d) => setParam({ date: wallDateIso(d) })}
            onView={(v) => setParam({ view: v })}
            toolbar={false}
            min={DAY_MIN}
            max={DAY_MAX}
            scrollToTime={SCROLL_TO}
            step={15}
            timeslots={4}
            popup
            showMultiDayTimes
            resizable={false}
            selectable={false}
            draggableAccessor={(e) => e.draggable}
            onEventDrop={onEventDrop}
            onSelectEvent={(e) => setOpenVisit(e.visit)}
            onKeyPressEvent={(e, keyEvent: SyntheticEvent<HTMLElement>) => {
              const key = (keyEvent.nativeEvent as KeyboardEvent).key;
              if (key !== 'Enter' && key !== ' ') return;
              // Without this the same key press would go on to "click" the panel's first button (Close).
              keyEvent.preventDefault();
              setOpenVisit(e.visit);
            }}
            tooltipAccessor={(e) => describe(e.visit)}
            eventPropGetter={(e) => ({
              className: cn('rp-event', `rp-event--${e.visit.purpose}`, `rp-event--${e.visit.status}`, pending.has(e.id) && 'rp-event--moving', !e.draggable && 'rp-event--locked'),
            })}
            components={view === 'month' ? { event: EventContent } : { event: EventContent, header: DayHeading }}
            onDrillDown={(d) => setParam({ date: wallDateIso(d), view: 'day' })}
          />
        </div>
      )}

      {specialistId !== undefined && (
        <section aria-labelledby="calendar-routes-title" className="mt-6">
          <h2 id="calendar-routes-title" className="mb-1 text-xl font-bold text-ink-900">
            Routes for the week of {shortDateText(routesWeek)}
          </h2>
          <p className="mb-3 text-loam-700">Each day from the dealership and back, in time order. They follow every change you make above.</p>
          {routes.isPending ? (
            <LoadingBlock label="Loading routes…" />
          ) : routes.isError ? (
            <ErrorState message={routes.error.message} onRetry={() => void routes.refetch()} retrying={routes.isFetching} />
          ) : (
            <div className="grid gap-4 xl:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]" aria-busy={routes.isFetching}>
              <WeekRoutesPanel routes={routes.data} />
              <Suspense fallback={<LoadingBlock label="Loading the map…" className="h-[28rem] justify-center rounded-xl bg-loam-100" />}>
                <TerritoryMap label="Day routes of the week" depot={routes.data.depot} routes={mapRoutes} fitKey={routes.data.weekStart} className="h-[28rem] xl:sticky xl:top-4" />
              </Suspense>
            </div>
          )}
        </section>
      )}

      <VisitDetailPanel
        visitId={openVisit?.id ?? null}
        initial={openVisit ?? undefined}
        canEdit
        onClose={() => setOpenVisit(null)}
        onChanged={(text, visit, moved) => setMessage({ tone: 'ok', text: moved ? `${visit.accountName}: ${text} The week’s routes are updated below.` : `${visit.accountName}: ${text}` })}
      />

      <Dialog open={subscribeOpen} onClose={() => setSubscribeOpen(false)} title="Subscribe in your calendar" variant="panel">
        <SubscribePanel />
      </Dialog>
    </>
  );
}

/** Tooltip and spoken text of an event. */
function describe(visit: VisitView): string {
  const parts = [visit.accountName, PURPOSE_SHORT[visit.purpose], VISIT_STATUS_BADGES[visit.status].label];
  if (visit.fixed) parts.push('fixed appointment');
  if (visit.startsAt) parts.push(instantText(visit.startsAt));
  return parts.join(' · ');
}

function EventContent({ event }: EventProps<VisitEvent>) {
  const v = event.visit;
  return (
    <span className="rp-event__body" data-visit-id={v.id}>
      <span className="rp-event__tag" aria-hidden="true">
        {PURPOSE_LETTERS[v.purpose]}
      </span>
      <span className="rp-event__text">
        <span className="rp-event__name">{v.accountName}</span>
        <span className="rp-event__meta">
          {PURPOSE_SHORT[v.purpose]}
          {v.status === 'requested' && ' · requested'}
          {v.status === 'done' && ' · done ✓'}
          {v.fixed && ' · fixed'}
        </span>
      </span>
    </span>
  );
}

/**
 * A day's heading above the day, work-week and week columns. The library's own heading claims the
 * "columnheader" role, but there it sits inside a drill-down button with no table or grid around
 * it, which assistive technology cannot place; plain text inside the button says the same. (The
 * month view keeps the library's heading: its header row is a real ARIA table row.)
 */
function DayHeading({ label }: HeaderProps) {
  return <span>{label}</span>;
}

/** What the event marks mean: a letter per purpose, a border per status. */
function CalendarKey() {
  return (
    <details className="mb-3 rounded-lg border border-loam-300 bg-white px-3 py-2">
      <summary className="min-h-9 cursor-pointer font-semibold text-ink-900">How to read the calendar</summary>
      <ul className="mt-2 grid gap-x-6 gap-y-1 text-sm sm:grid-cols-2">
        {Object.entries(PURPOSE_LETTERS).map(([purpose, letter]) => (
          <li key={purpose} className="flex items-center gap-2">
            <span className="inline-flex size-6 items-center justify-center rounded bg-ink-800 text-xs font-extrabold text-white" aria-hidden="true">
              {letter}
            </span>
            {PURPOSE_SHORT[purpose as keyof typeof PURPOSE_SHORT]}
          </li>
        ))}
        <li>Solid border: planned · dashed border: requested · ✓ and pale: done (cannot be moved)</li>
        <li>Installs are shown on a hatched band.</li>
      </ul>
    </details>
  );
}
