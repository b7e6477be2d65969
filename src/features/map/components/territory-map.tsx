// The territory map: the shipped county and state outlines as the base layer (street tiles only
// when VITE_TILE_URL is configured), account markers in Rowpath's scheme with grid clustering,
// the dealership, and day routes. Leaflet and its CSS load with this module only, which the map,
// week-plan and calendar screens import lazily.
import 'leaflet/dist/leaflet.css';
import './territory-map.css';
import { useQuery } from '@tanstack/react-query';
import L, { type LatLngBoundsExpression, type PathOptions } from 'leaflet';
import { useEffect, useMemo, useRef, useState } from 'react';
import { CircleMarker, GeoJSON, MapContainer, Marker, Pane, Polyline, Popup, TileLayer, Tooltip, useMap, useMapEvents } from 'react-leaflet';
import type { Feature } from 'geojson';
import type { MapMarker } from '@shared/schemas/visits';
import { cn } from '@/lib/cn';
import { basemapQueryOptions } from '../api/map';
import { clusterByGrid, type Cluster } from '../model/cluster';
import type { MapDepot, MapRoute } from '../model/map-route';
import { clusterHtml, markerHtml, summarizeCluster } from '../model/markers';

/** Grid cell for clustering, in screen pixels: a little over a marker and its "$" tab. */
const CLUSTER_CELL_PX = 38;
const MIN_ZOOM = 5;
const MAX_ZOOM = 13;
/** Kansas and Nebraska, for a map with nothing on it yet. */
const TERRITORY_BOUNDS: LatLngBoundsExpression = [
  [36.99, -102.05],
  [43.0, -94.6],
];
const tileUrl: string | undefined = import.meta.env.VITE_TILE_URL || undefined;

export interface TerritoryMapProps {
  /** Accessible name of the map region. */
  label: string;
  markers?: readonly MapMarker[];
  selectedId?: number | null;
  onSelect?: (accountId: number) => void;
  depot?: MapDepot | null;
  routes?: readonly MapRoute[];
  /** When this changes, the view refits to what is drawn. */
  fitKey?: string;
  className?: string;
}

export default function TerritoryMap({ label, markers = [], selectedId = null, onSelect, depot = null, routes = [], fitKey = '', className }: TerritoryMapProps) {
  return (
    <div role="region" aria-label={label} className={cn('relative isolate', className ?? 'h-[36rem]')}>
      <MapContainer className="rp-map h-full w-full" bounds={TERRITORY_BOUNDS} minZoom={MIN_ZOOM} maxZoom={MAX_ZOOM} zoomSnap={0.5} attributionControl scrollWheelZoom>
        <AttributionPrefix />
        {tileUrl ? <TileLayer url={tileUrl} /> : null}
        <BaseLayer />
        <SizeWatcher />
        {routes.map((route) => (
          <RouteLayer key={route.key} route={route} depot={depot} />
        ))}
        <ClusteredMarkers markers={markers} selectedId={selectedId} onSelect={onSelect} />
        {depot && <DepotMarker depot={depot} />}
        {/* Last, so the markers' zoom listener is in place before the first fit. */}
        <FitView markers={markers} depot={depot} routes={routes} fitKey={fitKey} />
      </MapContainer>
    </div>
  );
}

function AttributionPrefix() {
  const map = useMap();
  useEffect(() => {
    map.attributionControl.setPrefix(false);
  }, [map]);
  return null;
}

// With street tiles underneath, the counties are outlines only.
const countyStyle: PathOptions = { color: '#a99b89', weight: 0.8, fillColor: '#f8f6f2', fillOpacity: tileUrl ? 0 : 1 };
const stateStyle: PathOptions = { color: '#454f7c', weight: 2.5, fill: false };

/** County fills and outlines, then the state lines on top (the file orders them states first). */
function BaseLayer() {
  const basemap = useQuery(basemapQueryOptions());
  const data = basemap.data;
  const attribution = (data as { attribution?: string } | undefined)?.attribution;
  const parts = useMemo(() => {
    if (!data) return null;
    const isState = (f: Feature) => (f.properties as { kind?: string } | null)?.kind === 'state';
    return {
      counties: { ...data, features: data.features.filter((f) => !isState(f)) },
      states: { ...data, features: data.features.filter(isState) },
    };
  }, [data]);
  // Its own pane below the overlay pane: the outlines arrive after the routes and must not cover them.
  return (
    <Pane name="rp-basemap" style={{ zIndex: 250 }}>
      {parts && <GeoJSON data={parts.counties} style={countyStyle} interactive={false} attribution={attribution} />}
      {parts && <GeoJSON data={parts.states} style={stateStyle} interactive={false} />}
    </Pane>
  );
}

/** Fits the view to the markers, routes and dealership when they first arrive and when fitKey changes. */
function FitView({ markers, depot, routes, fitKey }: { markers: readonly MapMarker[]; depot: MapDepot | null; routes: readonly MapRoute[]; fitKey: string }) {
  const map = useMap();
  const fitted = useRef<string | null>(null);
  const hasContent = markers.length > 0 || routes.some((r) => r.stops.length > 0);
  useEffect(() => {
    if (!hasContent) return;
    const key = `${fitKey}`;
    if (fitted.current === key) return;
    fitted.current = key;
    const points: L.LatLngExpression[] = [...markers.map((m) => [m.lat, m.lng] as [number, number]), ...routes.flatMap((r) => r.stops.map((s) => [s.lat, s.lng] as [number, number]))];
    if (depot) points.push([depot.lat, depot.lng]);
    const bounds = L.latLngBounds(points);
    // No animation: a fit is a new view, not a journey (and a half-finished zoom looks broken).
    if (bounds.isValid()) map.fitBounds(bounds, { padding: [36, 36], maxZoom: 11, animate: false });
  }, [map, markers, depot, routes, fitKey, hasContent]);
  return null;
}

/** Leaflet measures its box once; a panel opening beside it changes the width. */
function SizeWatcher() {
  const map = useMap();
  useEffect(() => {
    const element = map.getContainer();
    const observer = new ResizeObserver(() => map.invalidateSize());
    observer.observe(element);
    return () => observer.disconnect();
  }, [map]);
  return null;
}

function ClusteredMarkers({ markers, selectedId, onSelect }: { markers: readonly MapMarker[]; selectedId: number | null; onSelect?: (id: number) => void }) {
  const map = useMap();
  const [zoom, setZoom] = useState(() => map.getZoom());
  const [openCluster, setOpenCluster] = useState<Cluster<MapMarker> | null>(null);
  useMapEvents({
    zoomend: () => {
      setZoom(map.getZoom());
      setOpenCluster(null);
    },
  });
  // A zoom change that happened before the listener was attached still counts.
  useEffect(() => {
    if (map.getZoom() !== zoom) setZoom(map.getZoom());
  });
  // Positions at a zoom are absolute pixels, so panning never changes the grouping: only zooming.
  const clusters = useMemo(
    () =>
      clusterByGrid(
        markers.map((m) => {
          const p = map.project([m.lat, m.lng], zoom);
          return { item: m, x: p.x, y: p.y };
        }),
        CLUSTER_CELL_PX,
      ),
    [markers, map, zoom],
  );

  return (
    <>
      {clusters.map((cluster) =>
        cluster.items.length === 1 ? (
          <AccountMarker key={`m${cluster.items[0].id}`} marker={cluster.items[0]} selected={cluster.items[0].id === selectedId} onSelect={onSelect} />
        ) : (
          <ClusterMarker
            key={`c${cluster.key}`}
            cluster={cluster}
            zoom={zoom}
            onOpen={() => {
              const bounds = L.latLngBounds(cluster.items.map((m) => [m.lat, m.lng] as [number, number]));
              // Markers that stay together even at the closest zoom are listed instead.
              if (map.getZoom() >= MAX_ZOOM || bounds.getNorthEast().equals(bounds.getSouthWest())) setOpenCluster(cluster);
              else map.fitBounds(bounds, { padding: [60, 60], maxZoom: MAX_ZOOM });
            }}
          />
        ),
      )}
      {openCluster && (
        <Popup position={map.unproject([openCluster.x, openCluster.y], zoom)} eventHandlers={{ remove: () => setOpenCluster(null) }}>
          <p className="mb-1 font-semibold">{openCluster.items.length} accounts here</p>
          <ul className="space-y-1">
            {openCluster.items.map((m) => (
              <li key={m.id}>
                <button type="button" className="min-h-9 text-left font-semibold text-ink-800 underline" onClick={() => onSelect?.(m.id)}>
                  {m.name}
                </button>
              </li>
            ))}
          </ul>
        </Popup>
      )}
    </>
  );
}

function AccountMarker({ marker, selected, onSelect }: { marker: MapMarker; selected: boolean; onSelect?: (id: number) => void }) {
  const icon = useMemo(
    () => L.divIcon({ html: markerHtml(marker, selected), className: 'rp-icon', iconSize: [32, 32], iconAnchor: [16, 16], tooltipAnchor: [14, 0] }),
    [marker, selected],
  );
  return (
    <Marker
      position={[marker.lat, marker.lng]}
      icon={icon}
      keyboard
      zIndexOffset={selected ? 1000 : 0}
      eventHandlers={{ click: () => onSelect?.(marker.id) }}
    >
      <Tooltip direction="right">{marker.name}</Tooltip>
    </Marker>
  );
}

function ClusterMarker({ cluster, zoom, onOpen }: { cluster: Cluster<MapMarker>; zoom: number; onOpen: () => void }) {
  const map = useMap();
  const summary = useMemo(() => summarizeCluster(cluster.items), [cluster]);
  const icon = useMemo(() => L.divIcon({ html: clusterHtml(summary, cluster.items.length), className: 'rp-icon', iconSize: [44, 44], iconAnchor: [22, 22] }), [summary, cluster]);
  // Pixels back to a place at the zoom they were measured at.
  const position = map.unproject([cluster.x, cluster.y], zoom);
  return (
    <Marker position={position} icon={icon} keyboard zIndexOffset={500} eventHandlers={{ click: onOpen }}>
      <Tooltip direction="right">{summary.text}</Tooltip>
    </Marker>
  );
}

const DEPOT_ICON_HTML =
  '<span class="rp-depot">' +
  '<svg viewBox="0 0 20 20" width="18" height="18" aria-hidden="true"><path d="M2 18V8l8-6 8 6v10h-5v-6H7v6Z" fill="#6fcbbd" stroke="#ffffff" stroke-width="1.5" stroke-linejoin="round"/></svg>' +
  'Dealership</span>';

function DepotMarker({ depot }: { depot: MapDepot }) {
  const icon = useMemo(() => L.divIcon({ html: DEPOT_ICON_HTML, className: 'rp-icon', iconSize: undefined, iconAnchor: [12, 14] }), []);
  return (
    <Marker position={[depot.lat, depot.lng]} icon={icon} keyboard title={`${depot.name} (dealership: every day route starts and ends here)`} zIndexOffset={2000}>
      <Tooltip direction="bottom" offset={[30, 12]}>
        {depot.name}: every day route starts and ends here
      </Tooltip>
    </Marker>
  );
}

function RouteLayer({ route, depot }: { route: MapRoute; depot: MapDepot | null }) {
  const positions = useMemo(() => {
    const line = route.stops.map((s) => [s.lat, s.lng] as [number, number]);
    return depot ? [[depot.lat, depot.lng] as [number, number], ...line, [depot.lat, depot.lng] as [number, number]] : line;
  }, [route, depot]);
  if (!route.stops.length) return null;
  return (
    <>
      <Polyline positions={positions} pathOptions={{ color: '#ffffff', weight: 8, opacity: 0.85 }} interactive={false} />
      <Polyline positions={positions} pathOptions={{ color: route.look.color, weight: 4.5, opacity: 0.95, dashArray: route.look.dash, lineCap: 'round' }}>
        <Tooltip sticky>{route.label}</Tooltip>
      </Polyline>
      {route.stops.map((stop) => (
        <CircleMarker key={`dot${stop.visitId}`} center={[stop.lat, stop.lng]} radius={5} pathOptions={{ color: '#ffffff', weight: 2, fillColor: route.look.color, fillOpacity: 1 }} interactive={false} />
      ))}
      {route.stops.map((stop) => (
        <StopBadge key={stop.visitId} route={route} stop={stop} />
      ))}
    </>
  );
}

function StopBadge({ route, stop }: { route: MapRoute; stop: MapRoute['stops'][number] }) {
  const icon = useMemo(
    () =>
      L.divIcon({
        html: `<span class="rp-stop" style="background:${route.look.color}" aria-hidden="true">${route.dayTag}${stop.order}</span><span class="rp-sr-only">${escapeText(stop.title)}</span>`,
        className: 'rp-icon',
        iconSize: undefined,
        // Up and to the right of the stop (and of the account's own marker), so both stay visible.
        iconAnchor: [-8, 28],
      }),
    [route, stop],
  );
  return (
    <Marker position={[stop.lat, stop.lng]} icon={icon} keyboard={false} zIndexOffset={1500}>
      <Tooltip direction="top">{stop.title}</Tooltip>
    </Marker>
  );
}

const escapeText = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
