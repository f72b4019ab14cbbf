import type { Feature, FeatureCollection, LineString, Point } from 'geojson';
import { useContext, useEffect, useMemo, useState } from 'react';
import { Layer, Source, useMap } from 'react-map-gl/maplibre';
import type { CrossingCollection, LayoutPointView, LonLat } from '../../lib/schemas/crossing-view';
import type { FenceLine } from '../../lib/schemas/plan';
import PlanOverlay from '../map/PlanOverlay';
import PropertyMap, { MapLoadedContext } from '../map/PropertyMap';
import { PLAN_COLOURS, type CircleLayer } from '../map/plan-style';

type Props = { propertyName: string; propertyExtentWgs84: [number, number, number, number] | null; map: FeatureCollection };

const OWN_POSITION_SOURCE_ID = 'work-order-own-position';
// The person's own position: a dark dot in a wide white ring, apart from every plan mark by size and rim.
const ownPositionLayer: CircleLayer = {
  id: 'work-order-own-position',
  type: 'circle',
  source: OWN_POSITION_SOURCE_ID,
  paint: { 'circle-radius': 7, 'circle-color': PLAN_COLOURS.ink, 'circle-stroke-width': 4, 'circle-stroke-color': PLAN_COLOURS.casing },
};

type Where = { state: 'off' | 'asking' | 'denied' | 'unavailable' } | { state: 'shown'; position: LonLat; accuracyM: number };

/** [west, south, east, north] around every position of the order. */
function boundsOf(collection: FeatureCollection): [number, number, number, number] | null {
  const positions: number[][] = [];
  for (const feature of collection.features) {
    const geometry = feature.geometry;
    if (geometry.type === 'Point') positions.push(geometry.coordinates);
    else if (geometry.type === 'LineString') positions.push(...geometry.coordinates);
  }
  if (positions.length === 0) return null;
  const lons = positions.map((p) => p[0]!);
  const lats = positions.map((p) => p[1]!);
  return [Math.min(...lons), Math.min(...lats), Math.max(...lons), Math.max(...lats)];
}

/** Metres per pixel at zoom 0 on the equator for 512 px tiles (MapLibre's Web Mercator). */
const METRES_PER_PX_AT_ZOOM_0 = 78_271.517;

/**
 * A view that brings the order's work into a phone-sized map: centred on it, zoomed so its
 * longer side fills about 300 px, and never closer than the zoom where the posts show apart.
 */
function focusOn(bounds: [number, number, number, number] | null): { position: LonLat; zoom: number } | null {
  if (!bounds) return null;
  const [west, south, east, north] = bounds;
  const lat = (south + north) / 2;
  const cosLat = Math.cos((lat * Math.PI) / 180);
  const spanM = Math.max((east - west) * 111_320 * cosLat, (north - south) * 110_574, 50);
  const zoom = Math.log2((METRES_PER_PX_AT_ZOOM_0 * cosLat * 300) / spanM);
  return { position: [(west + east) / 2, lat], zoom: Math.min(17, Math.max(11, zoom)) };
}

/**
 * Moves the map to the order once it has loaded. The property map fits the property's extent in
 * its own effect on load, which runs after this child's; the next frame comes after both.
 */
function FocusOnLoad({ focus }: { focus: { position: LonLat; zoom: number } | null }) {
  const loaded = useContext(MapLoadedContext);
  const { current: mapRef } = useMap();
  useEffect(() => {
    const map = mapRef?.getMap();
    if (!loaded || !map || !focus) return;
    const frame = requestAnimationFrame(() => map.jumpTo({ center: focus.position, zoom: focus.zoom }));
    return () => cancelAnimationFrame(frame);
  }, [loaded, mapRef, focus]);
  return null;
}

/**
 * The order's fence lines, crossings and layout points on the property map (the plan overlay's
 * own layers), and the person's own position when they let the browser share it.
 */
export default function WorkOrderMap({ propertyName, propertyExtentWgs84, map }: Props) {
  const [where, setWhere] = useState<Where>({ state: 'off' });
  const focus = useMemo(() => focusOn(boundsOf(map)), [map]);
  const fenceLines = useMemo(
    () =>
      map.features
        .filter((f) => f.properties?.featureType === 'fence-line' && f.geometry.type === 'LineString')
        .map((f) => ({ id: f.properties!.id, name: f.properties!.name, status: f.properties!.status, coordinates: (f.geometry as LineString).coordinates as LonLat[] }) as FenceLine),
    [map],
  );
  const crossings = useMemo<CrossingCollection>(
    () => ({ type: 'FeatureCollection', features: map.features.filter((f) => f.properties?.featureType === 'crossing') as CrossingCollection['features'] }),
    [map],
  );
  const layoutPoints = useMemo<LayoutPointView[]>(
    () =>
      map.features
        .filter((f) => f.properties?.featureType === 'layout-point')
        .map((f) => ({
          kind: f.properties!.kind,
          label: f.properties!.label,
          chainageM: f.properties!.chainageM,
          position: (f.geometry as Point).coordinates as LonLat,
          braced: f.properties!.braced,
          link: f.properties!.hungDropperLink,
        })),
    [map],
  );

  // Only asking starts the watch; later positions arrive through the same watch.
  const watching = where.state === 'asking' || where.state === 'shown';
  useEffect(() => {
    if (!watching) return;
    if (!('geolocation' in navigator)) {
      setWhere({ state: 'unavailable' });
      return;
    }
    const watch = navigator.geolocation.watchPosition(
      (position) => setWhere({ state: 'shown', position: [position.coords.longitude, position.coords.latitude], accuracyM: position.coords.accuracy }),
      (error) => setWhere({ state: error.code === error.PERMISSION_DENIED ? 'denied' : 'unavailable' }),
      { enableHighAccuracy: true, maximumAge: 10_000, timeout: 30_000 },
    );
    return () => navigator.geolocation.clearWatch(watch);
  }, [watching]);

  const own = useMemo<FeatureCollection<Point>>(
    () => ({
      type: 'FeatureCollection',
      features: where.state === 'shown' ? [{ type: 'Feature', properties: {}, geometry: { type: 'Point', coordinates: where.position } } as Feature<Point>] : [],
    }),
    [where],
  );

  return (
    <div className="flex flex-col gap-2">
      <div className="h-72 overflow-hidden rounded-xl border border-sand-200 sm:h-96">
        <PropertyMap propertyName={propertyName} extentWgs84={propertyExtentWgs84}>
          <PlanOverlay fenceLines={fenceLines} crossings={crossings} selectedCrossingId={null} layoutPoints={layoutPoints} realignment={null} focus={null} />
          <FocusOnLoad focus={focus} />
          <Source id={OWN_POSITION_SOURCE_ID} type="geojson" data={own}>
            <Layer {...ownPositionLayer} />
          </Source>
        </PropertyMap>
      </div>
      <div className="flex flex-wrap items-center gap-3 text-sm" data-testid="own-position">
        {where.state === 'off' && (
          <button type="button" className="btn-quiet min-h-12" onClick={() => setWhere({ state: 'asking' })}>
            Show where I am
          </button>
        )}
        {where.state === 'asking' && <span role="status">Finding your position…</span>}
        {where.state === 'shown' && (
          <span role="status">
            You are the dark dot in the white ring (within about {Math.round(where.accuracyM)} m). Zoom in to see the strainers and posts.
          </span>
        )}
        {where.state === 'denied' && (
          <span role="status">
            Your position is not shared with this page, so the map shows the work only. Allow location for this site in the browser to see where you are.
          </span>
        )}
        {where.state === 'unavailable' && <span role="status">Your position could not be found here (no GPS fix). The map shows the work only.</span>}
      </div>
    </div>
  );
}
