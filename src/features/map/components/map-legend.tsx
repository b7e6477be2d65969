import { VISIT_STATE_STYLES, VISIT_STATES } from '../model/markers';
import { DueGlyph, StateGlyph } from './state-glyph';

export function DepotGlyph() {
  return (
    <span aria-hidden="true" className="inline-flex size-7 shrink-0 items-center justify-center rounded-md border-2 border-white bg-ink-950 shadow">
      <svg viewBox="0 0 20 20" width="16" height="16">
        <path d="M2 18V8l8-6 8 6v10h-5v-6H7v6Z" fill="#6fcbbd" stroke="#ffffff" strokeWidth="1.5" strokeLinejoin="round" />
      </svg>
    </span>
  );
}

/** What the marks on the map mean: shape, letter and word for each state, never colour alone. */
export function MapLegend() {
  return (
    <section aria-labelledby="map-legend-title" className="rounded-xl border border-loam-300 bg-white p-4">
      <h2 id="map-legend-title" className="text-lg font-bold text-ink-900">
        Legend
      </h2>
      <ul className="mt-2 space-y-2">
        {VISIT_STATES.map((state) => (
          <li key={state} className="flex items-center gap-3">
            <StateGlyph state={state} />
            <span>
              <span className="block font-semibold text-ink-900">{VISIT_STATE_STYLES[state].label}</span>
              <span className="block text-sm text-loam-700">{VISIT_STATE_STYLES[state].meaning}</span>
            </span>
          </li>
        ))}
        <li className="flex items-center gap-3">
          <span className="flex w-7 justify-center">
            <DueGlyph />
          </span>
          <span className="font-semibold text-ink-900">Roadmap items due this season</span>
        </li>
        <li className="flex items-center gap-3">
          <span aria-hidden="true" className="inline-flex size-7 items-center justify-center rounded-full border-2 border-white bg-ink-800 text-xs font-extrabold text-white shadow">
            12
          </span>
          <span className="text-ink-900">
            <span className="font-semibold">Group of accounts</span>
            <span className="block text-sm text-loam-700">Its tab shows the most pressing state inside; select to zoom in</span>
          </span>
        </li>
        <li className="flex items-center gap-3">
          <DepotGlyph />
          <span className="font-semibold text-ink-900">Dealership (routes start and end here)</span>
        </li>
      </ul>
    </section>
  );
}
