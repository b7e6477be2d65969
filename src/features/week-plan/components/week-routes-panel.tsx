import { ErrorMark } from '@/components/ui/form-field';
import { PURPOSE_SHORT } from '@/features/visits/model/labels';
import { clockText, durationText, shortDateText } from '@/features/visits/model/zone-time';
import { cn } from '@/lib/cn';
import type { CurrentWeekRoutes } from '../api/week-plans';
import { dayHours, dayLook, hoursText, kmText } from '../model/routes';
import { RouteSample } from './route-sample';

/**
 * The specialist's week as day routes from the dealership: each day's stops in time order with
 * the drive before each, the day's distance and hours, and warnings where the times leave too
 * little room to drive or run past the day.
 */
export function WeekRoutesPanel({ routes, showStops = true, headingLevel = 3 }: { routes: CurrentWeekRoutes; showStops?: boolean; headingLevel?: 2 | 3 }) {
  const Heading = headingLevel === 2 ? 'h2' : 'h3';
  const warningCount = routes.days.reduce((n, d) => n + d.warnings.length, 0);
  return (
    <div>
      {warningCount > 0 && (
        <p role="status" className="mb-3 flex items-center gap-2 rounded-lg border-l-4 border-amber-500 bg-amber-50 px-3 py-2 font-semibold text-amber-800">
          <ErrorMark className="mt-0" />
          {warningCount === 1 ? '1 warning on this week’s routes' : `${warningCount} warnings on this week’s routes`}
        </p>
      )}
      <ol className="space-y-3" aria-label="Day routes">
        {routes.days.map((day, dayIndex) => {
          const look = dayLook(dayIndex);
          const hours = dayHours(day);
          return (
            <li key={day.date} className={cn('rounded-lg border bg-white p-3', day.warnings.length ? 'border-amber-400' : 'border-loam-300')} data-route-day={day.date}>
              <Heading className="flex flex-wrap items-center gap-x-3 gap-y-1 font-semibold text-ink-900">
                <RouteSample look={look} />
                <span>{shortDateText(day.date)}</span>
                <span className="tabular text-sm font-normal text-loam-700">
                  {day.stops.length === 0
                    ? 'No visits'
                    : `${day.stops.length} ${day.stops.length === 1 ? 'stop' : 'stops'} · ${kmText(day.distanceKm)} · ${hoursText(hours)} out (${durationText(day.driveMin)} driving)`}
                </span>
              </Heading>
              {showStops && day.stops.length > 0 && (
                <ol className="mt-2 space-y-1 text-sm">
                  {day.stops.map((stop, k) => (
                    <li key={stop.visitId} className="tabular flex flex-wrap gap-x-2">
                      <span className="font-semibold text-ink-900">
                        {k + 1}. {clockText(stop.startMin)}–{clockText(stop.departMin)}
                      </span>
                      <span className="text-ink-900">{stop.accountName}</span>
                      <span className="text-loam-700">
                        {PURPOSE_SHORT[stop.purpose]}
                        {stop.fixed ? ', fixed' : ''} · {kmText(stop.legKm)}, {durationText(stop.legDriveMin)} drive before
                      </span>
                    </li>
                  ))}
                  {day.returnMin !== null && <li className="tabular text-loam-700">Back at the dealership {clockText(day.returnMin)}</li>}
                </ol>
              )}
              {day.warnings.length > 0 && (
                <ul className="mt-2 space-y-1">
                  {day.warnings.map((w) => (
                    <li key={w} className="flex items-start gap-1.5 text-sm font-semibold text-amber-800">
                      <ErrorMark />
                      <span>{w}</span>
                    </li>
                  ))}
                </ul>
              )}
            </li>
          );
        })}
      </ol>
    </div>
  );
}
