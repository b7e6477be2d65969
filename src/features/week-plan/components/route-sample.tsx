import type { DayLook } from '../model/routes';

/** A short stretch of a day route's line, drawn as on the map. */
export function RouteSample({ look }: { look: DayLook }) {
  return (
    <svg viewBox="0 0 40 10" width="40" height="10" aria-hidden="true" className="shrink-0">
      <line x1="2" y1="5" x2="38" y2="5" stroke="#ffffff" strokeWidth="7" strokeLinecap="round" />
      <line x1="2" y1="5" x2="38" y2="5" stroke={look.color} strokeWidth="4" strokeDasharray={look.dash} strokeLinecap="round" />
    </svg>
  );
}
