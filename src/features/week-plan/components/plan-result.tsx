import { lazy, Suspense, useMemo } from 'react';
import type { WeekPlanView } from '@shared/schemas/visits';
import { ErrorMark } from '@/components/ui/form-field';
import { LoadingBlock } from '@/components/ui/states';
import { toMapRoutes } from '@/features/map/model/map-route';
import { PURPOSE_SHORT } from '@/features/visits/model/labels';
import { clockText, durationText, shortDateText } from '@/features/visits/model/zone-time';
import { dayHours, dayLegs, dayLook, hoursText, kmText } from '../model/routes';
import { RouteSample } from './route-sample';

const TerritoryMap = lazy(() => import('@/features/map/components/territory-map'));

/** A computed week plan: totals, the day routes on a map, each day's ordered stops, and what did not fit. */
export function PlanResult({ plan }: { plan: WeekPlanView }) {
  const routes = useMemo(() => toMapRoutes(plan.days, dayLook, shortDateText, clockText), [plan]);
  const placedDays = plan.days.filter((d) => d.stops.length > 0).length;
  const driveHours = plan.totals.driveMin / 60;
  return (
    <div className="space-y-5">
      <dl className="grid grid-cols-2 gap-3 sm:grid-cols-4" aria-label="Week totals">
        <Total term="Visits placed" value={`${plan.totals.visits}`} detail={`over ${placedDays} ${placedDays === 1 ? 'day' : 'days'}`} />
        <Total term="Distance" value={kmText(plan.totals.distanceKm)} detail="road estimate" />
        <Total term="Driving" value={hoursText(driveHours)} detail={durationText(plan.totals.driveMin)} />
        <Total term="Not placed" value={`${plan.unplaced.length}`} detail={plan.unplaced.length ? 'see the reasons below' : 'everything fits'} warn={plan.unplaced.length > 0} />
      </dl>

      <div className="grid gap-4 xl:grid-cols-[minmax(0,1fr)_22rem]">
        <Suspense fallback={<LoadingBlock label="Loading the map…" className="h-[30rem] justify-center rounded-xl bg-loam-100" />}>
          <TerritoryMap label="Day routes of the plan" depot={plan.depot} routes={routes} fitKey={plan.days.map((d) => d.stops.length).join('-')} className="h-[30rem]" />
        </Suspense>
        <ul className="space-y-2" aria-label="Days at a glance">
          {plan.days.map((day, k) => (
            <li key={day.date} className="flex items-center gap-3 rounded-lg border border-loam-300 bg-white px-3 py-2">
              <RouteSample look={dayLook(k)} />
              <span className="font-semibold text-ink-900">{shortDateText(day.date)}</span>
              <span className="tabular ml-auto text-sm text-loam-700">
                {day.stops.length ? `${day.stops.length} · ${kmText(day.distanceKm)} · ${hoursText(dayHours(day))}` : 'Free'}
              </span>
            </li>
          ))}
        </ul>
      </div>

      <ol className="space-y-4" aria-label="Days of the plan">
        {plan.days.map((day, dayIndex) => (
          <PlanDay key={day.date} plan={plan} dayIndex={dayIndex} />
        ))}
      </ol>

      {plan.unplaced.length > 0 && (
        <section aria-labelledby="unplaced-title" className="rounded-xl border-2 border-amber-400 bg-amber-50 p-4">
          <h3 id="unplaced-title" className="flex items-center gap-2 text-lg font-bold text-amber-900">
            <ErrorMark className="mt-0 size-5" />
            {plan.unplaced.length === 1 ? '1 visit did not fit' : `${plan.unplaced.length} visits did not fit`}
          </h3>
          <ul className="mt-2 space-y-1">
            {plan.unplaced.map((u) => (
              <li key={u.visitId}>
                <span className="font-semibold text-ink-900">{u.accountName}</span>: <span className="text-amber-900">{u.reason}</span>
              </li>
            ))}
          </ul>
        </section>
      )}
    </div>
  );
}

function Total({ term, value, detail, warn = false }: { term: string; value: string; detail: string; warn?: boolean }) {
  return (
    <div className={warn ? 'rounded-xl border-2 border-amber-400 bg-amber-50 p-3' : 'rounded-xl border border-loam-300 bg-white p-3'}>
      <dt className="text-sm font-semibold text-loam-700">{term}</dt>
      <dd className="tabular text-2xl font-bold text-ink-900">{value}</dd>
      <dd className="text-sm text-loam-700">{detail}</dd>
    </div>
  );
}

function PlanDay({ plan, dayIndex }: { plan: WeekPlanView; dayIndex: number }) {
  const day = plan.days[dayIndex];
  const legs = dayLegs(day, plan.depot);
  const look = dayLook(dayIndex);
  const headingId = `plan-day-${day.date}`;
  return (
    <li className="rounded-xl border border-loam-300 bg-white" aria-labelledby={headingId}>
      <h3 id={headingId} className="flex flex-wrap items-center gap-x-3 gap-y-1 border-b border-loam-200 px-4 py-3 text-lg font-bold text-ink-900">
        <RouteSample look={look} />
        {shortDateText(day.date)}
        <span className="tabular text-sm font-normal text-loam-700">
          {day.stops.length === 0
            ? 'No visits'
            : `${day.stops.length} ${day.stops.length === 1 ? 'stop' : 'stops'} · ${kmText(day.distanceKm)} · ${durationText(day.driveMin)} driving · out ${clockText(day.startMin)}–${clockText(day.returnMin)} (${hoursText(dayHours(day))})`}
        </span>
      </h3>
      {day.stops.length > 0 && (
        <div className="overflow-x-auto">
          <table className="tabular w-full text-left text-sm">
            <thead className="bg-loam-50 text-loam-700">
              <tr>
                <th scope="col" className="px-4 py-2 font-semibold">
                  #
                </th>
                <th scope="col" className="px-2 py-2 font-semibold">
                  Account
                </th>
                <th scope="col" className="px-2 py-2 font-semibold">
                  Drive before
                </th>
                <th scope="col" className="px-2 py-2 font-semibold">
                  Arrive
                </th>
                <th scope="col" className="px-2 py-2 font-semibold">
                  Visit
                </th>
                <th scope="col" className="px-2 py-2 font-semibold">
                  Depart
                </th>
              </tr>
            </thead>
            <tbody className="divide-y divide-loam-200">
              {day.stops.map((stop, k) => (
                <tr key={stop.visitId}>
                  <td className="px-4 py-2 font-bold text-ink-900">{k + 1}</td>
                  <td className="px-2 py-2">
                    <span className="font-semibold text-ink-900">{stop.accountName}</span>
                    <span className="block text-loam-700">
                      {PURPOSE_SHORT[stop.purpose]}
                      {stop.kept ? ' · already planned, kept' : stop.fixed ? ' · fixed appointment' : ''}
                    </span>
                  </td>
                  <td className="px-2 py-2 text-ink-900">
                    {kmText(legs[k].km)}, {durationText(stop.arriveMin - (k === 0 ? day.startMin : day.stops[k - 1].departMin))}
                  </td>
                  <td className="px-2 py-2 text-ink-900">
                    {clockText(stop.arriveMin)}
                    {stop.waitMin >= 1 && <span className="block text-loam-700">waits {durationText(stop.waitMin)}</span>}
                  </td>
                  <td className="px-2 py-2 font-semibold text-ink-900">
                    {clockText(stop.startMin)}–{clockText(stop.departMin)}
                  </td>
                  <td className="px-2 py-2 text-ink-900">{clockText(stop.departMin)}</td>
                </tr>
              ))}
              <tr>
                <td className="px-4 py-2 text-loam-700" aria-hidden="true">
                  ↩
                </td>
                <td className="px-2 py-2 text-loam-700">Back to {plan.depot.name}</td>
                <td className="px-2 py-2 text-ink-900">
                  {kmText(legs[legs.length - 1].km)}, {durationText(day.returnMin - day.stops[day.stops.length - 1].departMin)}
                </td>
                <td className="px-2 py-2 text-ink-900">{clockText(day.returnMin)}</td>
                <td colSpan={2} />
              </tr>
            </tbody>
          </table>
        </div>
      )}
    </li>
  );
}
