// Rowpath's own marker scheme (no outside source: a design rule of the product, DESIGN.md "status
// must never rely on colour alone"). The checks make sure each state differs by shape and letter
// as well as colour, and that the filters in the address read back as they were written.
import { describe, expect, it } from 'vitest';
import type { MapMarker } from '@shared/schemas/visits';
import {
  clusterHtml,
  filterMarkers,
  mapFiltersToParams,
  markerHtml,
  parseMapFilters,
  summarizeCluster,
  VISIT_STATE_STYLES,
  VISIT_STATES,
} from '@/features/map/model/markers';

const marker = (id: number, over: Partial<MapMarker> = {}): MapMarker => ({
  id,
  name: `Account ${id}`,
  lat: 39.8,
  lng: -98.2,
  town: 'Mankato',
  status: 'active',
  territoryId: 1,
  specialistId: 10,
  daysSinceLastVisit: 30,
  roadmapDueThisSeasonUsd: 0,
  openRequests: 0,
  nextVisitAt: null,
  visitState: 'ok',
  ...over,
});

describe('the marker scheme', () => {
  it('when the four visit states are drawn, then no two share a shape, a letter or a word', () => {
    const styles = VISIT_STATES.map((s) => VISIT_STATE_STYLES[s]);
    for (const key of ['shape', 'letter', 'label', 'fill'] as const) expect(new Set(styles.map((s) => s[key])).size).toBe(4);
  });

  it('when a marker is drawn, then its HTML carries the letter and a spoken label, and a "$" tab only with roadmap value due', () => {
    const plain = markerHtml(marker(1, { visitState: 'overdue' }));
    expect(plain).toContain('>!<');
    expect(plain).toContain('Account 1: overdue</span>');
    expect(plain).not.toContain('rp-marker__due');
    const due = markerHtml(marker(2, { visitState: 'request', roadmapDueThisSeasonUsd: 1200 }));
    expect(due).toContain('rp-marker__due');
    expect(due).toContain('roadmap items due this season');
  });

  it('when an account name holds markup, then it is escaped in the icon', () => {
    expect(markerHtml(marker(3, { name: '<b>Lowe & Sons</b>' }))).toContain('&lt;b&gt;Lowe &amp; Sons&lt;/b&gt;');
  });

  it('when a cluster holds several states, then the summary counts each and names the most pressing', () => {
    const summary = summarizeCluster([
      marker(1, { visitState: 'ok' }),
      marker(2, { visitState: 'due-soon', roadmapDueThisSeasonUsd: 500 }),
      marker(3, { visitState: 'overdue' }),
      marker(4, { visitState: 'overdue' }),
    ]);
    expect(summary.counts).toEqual({ request: 0, overdue: 2, 'due-soon': 1, ok: 1 });
    expect(summary.worst).toBe('overdue');
    expect(summary.text).toBe('4 accounts: 2 overdue, 1 due soon, 1 visited recently, 1 with roadmap items due');
    expect(clusterHtml(summary, 4)).toContain('>4<');
  });
});

describe('map filters', () => {
  const markers = [
    marker(1, { territoryId: 1, specialistId: 10, visitState: 'request', roadmapDueThisSeasonUsd: 900 }),
    marker(2, { territoryId: 1, specialistId: 11, visitState: 'ok' }),
    marker(3, { territoryId: 2, specialistId: 11, visitState: 'overdue', roadmapDueThisSeasonUsd: 100 }),
    marker(4, { territoryId: 2, specialistId: null, visitState: 'due-soon' }),
  ];
  const ids = (list: MapMarker[]) => list.map((m) => m.id);

  it('when no filter is set, then every marker shows', () => {
    expect(ids(filterMarkers(markers, { states: [], roadmapDue: false }))).toEqual([1, 2, 3, 4]);
  });

  it('when territory, specialist, states and "roadmap due" are set, then only markers meeting all of them show', () => {
    expect(ids(filterMarkers(markers, { territoryId: 2, states: [], roadmapDue: false }))).toEqual([3, 4]);
    expect(ids(filterMarkers(markers, { specialistId: 11, states: [], roadmapDue: false }))).toEqual([2, 3]);
    expect(ids(filterMarkers(markers, { states: ['request', 'overdue'], roadmapDue: false }))).toEqual([1, 3]);
    expect(ids(filterMarkers(markers, { states: [], roadmapDue: true }))).toEqual([1, 3]);
    expect(ids(filterMarkers(markers, { territoryId: 2, specialistId: 11, states: ['overdue'], roadmapDue: true }))).toEqual([3]);
  });

  it('when filters are written to the address and read back, then they are the same; junk values are dropped', () => {
    const filters = { territoryId: 2, specialistId: 11, states: ['request' as const, 'due-soon' as const], roadmapDue: true };
    const params = mapFiltersToParams(filters, new URLSearchParams('routes=next'));
    expect(params.get('routes')).toBe('next');
    expect(parseMapFilters(params)).toEqual(filters);
    expect(parseMapFilters(new URLSearchParams('territory=abc&specialist=-3&state=bogus,ok&due=yes'))).toEqual({ territoryId: undefined, specialistId: undefined, states: ['ok'], roadmapDue: false });
  });
});
