import { useQuery } from '@tanstack/react-query';
import { lazy, Suspense, useMemo } from 'react';
import { inputClasses } from '@/components/ui/form-field';
import { PageHeader } from '@/components/ui/page-header';
import { ErrorState, LoadingBlock } from '@/components/ui/states';
import { useCurrentUser } from '@/features/auth/components/current-user';
import { useLiveSearchParams } from '@/features/visits/hooks/use-live-search-params';
import { territoriesQueryOptions } from '@/features/territories/api/territories';
import { useSpecialistChoices } from '@/features/visits/api/specialists';
import { addDaysIso, clockText, mondayOf, shortDateText, todayAtDealership } from '@/features/visits/model/zone-time';
import { currentWeekRoutesQueryOptions } from '@/features/week-plan/api/week-plans';
import { WeekRoutesPanel } from '@/features/week-plan/components/week-routes-panel';
import { dayLook } from '@/features/week-plan/model/routes';
import { isApiError } from '@/lib/api';
import { mapAccountsQueryOptions } from '../api/map';
import { toMapRoutes } from '../model/map-route';
import { filterMarkers, mapFiltersToParams, parseMapFilters, VISIT_STATE_STYLES, VISIT_STATES, type MapFilters, type VisitState } from '../model/markers';
import { AccountCard } from './account-card';
import { MapLegend } from './map-legend';
import { StateGlyph } from './state-glyph';

const TerritoryMap = lazy(() => import('./territory-map'));

type RoutesChoice = 'none' | 'this' | 'next';
const parseRoutes = (text: string | null): RoutesChoice => (text === 'none' || text === 'next' ? text : 'this');

/** /map (staff): every account in scope by visit status, filters in the address, the week's day routes. */
export function MapPage() {
  const me = useCurrentUser();
  const [params, setParams] = useLiveSearchParams();
  const filters = parseMapFilters(params);
  const routesChoice = parseRoutes(params.get('routes'));
  const selectedId = Number(params.get('account')) || null;

  const markersQuery = useQuery(mapAccountsQueryOptions());
  const territories = useQuery(territoriesQueryOptions());
  const specialists = useSpecialistChoices();

  const thisWeek = mondayOf(todayAtDealership());
  const weekStart = routesChoice === 'next' ? addDaysIso(thisWeek, 7) : thisWeek;
  // Routes belong to one specialist: the user, or the one picked in the filter.
  const routesSpecialistId = me.role === 'specialist' ? me.id : filters.specialistId;
  // The dealership is the same for everyone; any specialist's week carries it.
  const depotSpecialistId = routesSpecialistId ?? specialists.choices[0]?.id;
  const routesQuery = useQuery({
    ...currentWeekRoutesQueryOptions({ weekStart, specialistId: depotSpecialistId, days: 5 }),
    enabled: depotSpecialistId !== undefined,
  });
  const showRoutes = routesChoice !== 'none' && routesSpecialistId !== undefined && routesQuery.data !== undefined;

  const all = markersQuery.data?.items;
  const filterKey = mapFiltersToParams(filters).toString();
  // filterKey stands for the filters (a new object each render).
  const shown = useMemo(() => filterMarkers(all ?? [], filters), [all, filterKey]);
  const selected = all?.find((m) => m.id === selectedId) ?? null;
  const mapRoutes = useMemo(
    () => (showRoutes && routesQuery.data ? toMapRoutes(routesQuery.data.days, dayLook, shortDateText, clockText) : []),
    [showRoutes, routesQuery.data],
  );

  const update = (change: (next: URLSearchParams) => void) => {
    const next = new URLSearchParams(params);
    change(next);
    setParams(next);
  };
  const setFilters = (f: MapFilters) => setParams(mapFiltersToParams(f, params));
  const select = (id: number | null) => update((next) => (id ? next.set('account', String(id)) : next.delete('account')));

  return (
    <>
      <PageHeader title="Territory map" description="Every account you cover, marked by when it was last visited. Select a marker for the account's summary." />

      <form role="search" aria-label="Filter the map" className="mb-4 grid gap-4 rounded-xl border border-loam-300 bg-white p-4 lg:grid-cols-[1fr_1fr_1fr]" onSubmit={(e) => e.preventDefault()}>
        <div>
          <label htmlFor="map-territory" className="mb-1 block font-semibold text-ink-900">
            Territory
          </label>
          <select
            id="map-territory"
            className={inputClasses}
            value={filters.territoryId ?? ''}
            onChange={(e) => setFilters({ ...filters, territoryId: Number(e.target.value) || undefined })}
          >
            <option value="">All territories</option>
            {(territories.data ?? []).map((t) => (
              <option key={t.id} value={t.id}>
                {t.name}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor="map-specialist" className="mb-1 block font-semibold text-ink-900">
            Specialist
          </label>
          <select
            id="map-specialist"
            className={inputClasses}
            value={filters.specialistId ?? ''}
            onChange={(e) => setFilters({ ...filters, specialistId: Number(e.target.value) || undefined })}
          >
            <option value="">Everyone</option>
            {specialists.choices.map((s) => (
              <option key={s.id} value={s.id}>
                {s.id === me.id ? `${s.name} (you)` : s.name}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor="map-routes" className="mb-1 block font-semibold text-ink-900">
            Day routes
          </label>
          <select id="map-routes" className={inputClasses} value={routesChoice} onChange={(e) => update((next) => next.set('routes', e.target.value))}>
            <option value="this">This week ({shortDateText(thisWeek)})</option>
            <option value="next">Next week ({shortDateText(addDaysIso(thisWeek, 7))})</option>
            <option value="none">Hide routes</option>
          </select>
        </div>
        <fieldset className="lg:col-span-3">
          <legend className="mb-1 font-semibold text-ink-900">Show</legend>
          <div className="flex flex-wrap gap-2">
            {VISIT_STATES.map((state) => (
              <StateToggle
                key={state}
                state={state}
                checked={filters.states.length === 0 || filters.states.includes(state)}
                onChange={(checked) => {
                  const current = filters.states.length ? filters.states : [...VISIT_STATES];
                  const states = checked ? [...current, state] : current.filter((s) => s !== state);
                  setFilters({ ...filters, states: VISIT_STATES.filter((s) => states.includes(s)) });
                }}
              />
            ))}
            <label className="flex min-h-11 cursor-pointer items-center gap-2 rounded-lg border border-loam-400 px-3 has-[:checked]:border-ink-700 has-[:checked]:bg-ink-50">
              <input type="checkbox" className="size-5 accent-ink-700" checked={filters.roadmapDue} onChange={(e) => setFilters({ ...filters, roadmapDue: e.target.checked })} />
              <span className="font-semibold text-ink-900">Only roadmap due this season</span>
            </label>
          </div>
        </fieldset>
      </form>

      {markersQuery.isError ? (
        <ErrorState message={isApiError(markersQuery.error) ? markersQuery.error.message : undefined} onRetry={() => void markersQuery.refetch()} retrying={markersQuery.isFetching} />
      ) : (
        <div className="grid gap-4 xl:grid-cols-[minmax(0,1fr)_20rem]">
          <div>
            <Suspense fallback={<LoadingBlock label="Loading the map…" className="h-[36rem] justify-center rounded-xl bg-loam-100" />}>
              <TerritoryMap
                label="Territory map of accounts"
                markers={shown}
                selectedId={selectedId}
                onSelect={(id) => select(id)}
                depot={routesQuery.data?.depot ?? null}
                routes={mapRoutes}
                fitKey={`${filters.territoryId ?? ''}-${filters.specialistId ?? ''}-${markersQuery.isSuccess}`}
              />
            </Suspense>
            <p role="status" className="tabular mt-2 text-loam-700">
              {markersQuery.isPending
                ? 'Loading accounts…'
                : `Showing ${shown.length.toLocaleString('en-US')} of ${(all?.length ?? 0).toLocaleString('en-US')} accounts${markersQuery.data?.withoutLocation ? ` · ${markersQuery.data.withoutLocation} without a map location are not drawn` : ''}.`}
            </p>
          </div>
          <aside className="space-y-4" aria-label="Map details">
            {selected && markersQuery.data && <AccountCard marker={selected} season={markersQuery.data.season} onClose={() => select(null)} />}
            <MapLegend />
            <section aria-labelledby="map-routes-title" className="rounded-xl border border-loam-300 bg-white p-4">
              <h2 id="map-routes-title" className="text-lg font-bold text-ink-900">
                Day routes
              </h2>
              {routesChoice === 'none' ? (
                <p className="mt-1 text-loam-700">Routes are hidden.</p>
              ) : routesSpecialistId === undefined ? (
                <p className="mt-1 text-loam-700">Choose a specialist above to see their day routes.</p>
              ) : routesQuery.isPending ? (
                <LoadingBlock label="Loading routes…" />
              ) : routesQuery.isError ? (
                <p className="mt-1 text-brick-700">{routesQuery.error.message}</p>
              ) : routesQuery.data.days.every((d) => d.stops.length === 0) ? (
                <p className="mt-1 text-loam-700">No visits are planned for the week of {shortDateText(weekStart)}.</p>
              ) : (
                <div className="mt-2">
                  <WeekRoutesPanel routes={routesQuery.data} showStops={false} />
                </div>
              )}
            </section>
          </aside>
        </div>
      )}
    </>
  );
}

function StateToggle({ state, checked, onChange }: { state: VisitState; checked: boolean; onChange: (checked: boolean) => void }) {
  return (
    <label className="flex min-h-11 cursor-pointer items-center gap-2 rounded-lg border border-loam-400 px-3 has-[:checked]:border-ink-700 has-[:checked]:bg-ink-50">
      <input type="checkbox" className="size-5 accent-ink-700" checked={checked} onChange={(e) => onChange(e.target.checked)} />
      <StateGlyph state={state} size={24} />
      <span className="font-semibold text-ink-900">{VISIT_STATE_STYLES[state].label}</span>
    </label>
  );
}
