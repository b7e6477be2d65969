// Rowpath's marker scheme for the territory map. Each visit state has a shape, a letter, a word
// and a colour, so a marker reads without colour: a diamond "R" is an open request, a triangle
// "!" an overdue visit, a square "D" a visit due soon, a circle "✓" an account seen recently.
// A "$" tab on the marker's corner means roadmap items are due this season.
import type { MapMarker } from '@shared/schemas/visits';

export type VisitState = MapMarker['visitState'];
export type MarkerShape = 'diamond' | 'triangle' | 'square' | 'circle';

/** Most pressing first: the order of the legend and the filter. */
export const VISIT_STATES: readonly VisitState[] = ['request', 'overdue', 'due-soon', 'ok'];

export interface VisitStateStyle {
  label: string;
  /** What the state means, for the legend. */
  meaning: string;
  letter: string;
  shape: MarkerShape;
  fill: string;
  text: string;
}

// Colours are the palette's (src/styles.css): ink, brick (overdue), amber (due soon), seedling (good).
export const VISIT_STATE_STYLES: Record<VisitState, VisitStateStyle> = {
  request: { label: 'Open request', meaning: 'The grower asked for a visit', letter: 'R', shape: 'diamond', fill: '#363f68', text: '#ffffff' },
  overdue: { label: 'Overdue', meaning: 'No visit in over a year', letter: '!', shape: 'triangle', fill: '#8f3a2c', text: '#ffffff' },
  'due-soon': { label: 'Due soon', meaning: 'No visit in over 180 days', letter: 'D', shape: 'square', fill: '#d59c2c', text: '#12162b' },
  ok: { label: 'Visited recently', meaning: 'Seen within 180 days', letter: '✓', shape: 'circle', fill: '#17776b', text: '#ffffff' },
};

export interface MapFilters {
  territoryId?: number;
  specialistId?: number;
  /** Empty means every state. */
  states: VisitState[];
  /** Only accounts with roadmap value due this season. */
  roadmapDue: boolean;
}

const positiveId = (text: string | null): number | undefined => {
  const n = Number(text);
  return text && Number.isInteger(n) && n > 0 ? n : undefined;
};

/** Filters from the page address (?territory=&specialist=&state=request,overdue&due=1). Unknown values are dropped. */
export function parseMapFilters(params: URLSearchParams): MapFilters {
  const states = (params.get('state') ?? '')
    .split(',')
    .map((s) => s.trim())
    .filter((s): s is VisitState => (VISIT_STATES as readonly string[]).includes(s));
  return {
    territoryId: positiveId(params.get('territory')),
    specialistId: positiveId(params.get('specialist')),
    states: VISIT_STATES.filter((s) => states.includes(s)),
    roadmapDue: params.get('due') === '1',
  };
}

/** The address form of the filters; the other parameters of `base` are kept. */
export function mapFiltersToParams(filters: MapFilters, base = new URLSearchParams()): URLSearchParams {
  const next = new URLSearchParams(base);
  const set = (key: string, value: string | undefined) => (value ? next.set(key, value) : next.delete(key));
  set('territory', filters.territoryId ? String(filters.territoryId) : undefined);
  set('specialist', filters.specialistId ? String(filters.specialistId) : undefined);
  set('state', filters.states.length && filters.states.length < VISIT_STATES.length ? filters.states.join(',') : undefined);
  set('due', filters.roadmapDue ? '1' : undefined);
  return next;
}

export function filterMarkers(markers: readonly MapMarker[], filters: MapFilters): MapMarker[] {
  return markers.filter(
    (m) =>
      (filters.territoryId === undefined || m.territoryId === filters.territoryId) &&
      (filters.specialistId === undefined || m.specialistId === filters.specialistId) &&
      (filters.states.length === 0 || filters.states.includes(m.visitState)) &&
      (!filters.roadmapDue || m.roadmapDueThisSeasonUsd > 0),
  );
}

export interface ClusterSummary {
  counts: Record<VisitState, number>;
  /** The most pressing state among the members. */
  worst: VisitState;
  roadmapDue: number;
  /** "12 accounts: 3 open requests, 2 overdue, …" for screen readers and tooltips. */
  text: string;
}

export function summarizeCluster(markers: readonly Pick<MapMarker, 'visitState' | 'roadmapDueThisSeasonUsd'>[]): ClusterSummary {
  const counts: Record<VisitState, number> = { request: 0, overdue: 0, 'due-soon': 0, ok: 0 };
  let roadmapDue = 0;
  for (const m of markers) {
    counts[m.visitState] += 1;
    if (m.roadmapDueThisSeasonUsd > 0) roadmapDue += 1;
  }
  const worst = VISIT_STATES.find((s) => counts[s] > 0) ?? 'ok';
  const words: Record<VisitState, [string, string]> = {
    request: ['open request', 'open requests'],
    overdue: ['overdue', 'overdue'],
    'due-soon': ['due soon', 'due soon'],
    ok: ['visited recently', 'visited recently'],
  };
  const parts = VISIT_STATES.filter((s) => counts[s] > 0).map((s) => `${counts[s]} ${words[s][counts[s] === 1 ? 0 : 1]}`);
  if (roadmapDue) parts.push(`${roadmapDue} with roadmap items due`);
  const text = `${markers.length} ${markers.length === 1 ? 'account' : 'accounts'}: ${parts.join(', ')}`;
  return { counts, worst, roadmapDue, text };
}

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

/** The marker's outline as SVG, in a 32 × 32 box. */
export function shapeSvg(shape: MarkerShape, fill: string, size = 32): string {
  const stroke = 'stroke="#ffffff" stroke-width="2.5"';
  const body =
    shape === 'diamond'
      ? `<path d="M16 2 30 16 16 30 2 16Z" fill="${fill}" ${stroke}/>`
      : shape === 'triangle'
        ? `<path d="M16 2.5 30.5 28.5H1.5Z" fill="${fill}" ${stroke} stroke-linejoin="round"/>`
        : shape === 'square'
          ? `<rect x="3.5" y="3.5" width="25" height="25" rx="3" fill="${fill}" ${stroke}/>`
          : `<circle cx="16" cy="16" r="13" fill="${fill}" ${stroke}/>`;
  return `<svg viewBox="0 0 32 32" width="${size}" height="${size}" aria-hidden="true" focusable="false">${body}</svg>`;
}

/** The inner HTML of one account's map icon (a Leaflet divIcon). */
export function markerHtml(marker: Pick<MapMarker, 'name' | 'visitState' | 'roadmapDueThisSeasonUsd'>, selected = false): string {
  const style = VISIT_STATE_STYLES[marker.visitState];
  // The triangle's body sits low: its letter goes lower and a little smaller.
  const letterY = style.shape === 'triangle' ? 'top:5px;font-size:13px' : 'top:0';
  const due = marker.roadmapDueThisSeasonUsd > 0;
  const label = `${marker.name}: ${style.label.toLowerCase()}${due ? ', roadmap items due this season' : ''}`;
  return (
    `<span class="rp-marker${selected ? ' rp-marker--selected' : ''}">` +
    shapeSvg(style.shape, style.fill) +
    `<span class="rp-marker__letter" style="color:${style.text};${letterY}" aria-hidden="true">${escapeHtml(style.letter)}</span>` +
    (due ? '<span class="rp-marker__due" aria-hidden="true">$</span>' : '') +
    `<span class="rp-sr-only">${escapeHtml(label)}</span>` +
    '</span>'
  );
}

/** The inner HTML of a cluster's icon: the count, ringed, with the worst member's shape as a tab. */
export function clusterHtml(summary: ClusterSummary, count: number): string {
  const worst = VISIT_STATE_STYLES[summary.worst];
  return (
    '<span class="rp-cluster">' +
    `<span class="rp-cluster__count" aria-hidden="true">${count}</span>` +
    `<span class="rp-cluster__worst" aria-hidden="true">${shapeSvg(worst.shape, worst.fill, 18)}<span style="color:${worst.text}">${escapeHtml(worst.letter)}</span></span>` +
    `<span class="rp-sr-only">${escapeHtml(summary.text)}. Zoom in to see them.</span>` +
    '</span>'
  );
}
