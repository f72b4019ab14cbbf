import 'maplibre-gl/dist/maplibre-gl.css';
import { createContext, useEffect, useId, useMemo, useRef, useState, type ReactNode } from 'react';
import maplibregl from 'maplibre-gl';
import Map, { Layer, NavigationControl, ScaleControl, Source, useMap, type MapRef } from 'react-map-gl/maplibre';
import type { LngLatBoundsLike, MapGeoJSONFeature, Map as MaplibreMap, MapMouseEvent } from 'maplibre-gl';
import { createExtentFeatures, toUsableExtent } from './extent';
import { graticuleBboxFor, type BboxWgs84 } from './graticule';
import { PROPERTY_EXTENT_SOURCE_ID, propertyExtentLayers } from './layers';
import { BASE_FIRST_LABEL_LAYER_ID, createBaseStyle } from './style';
import { MAP_COLOURS } from './theme';

declare global {
  interface Window {
    /** The live map, set once it has loaded, so browser tests can wait for `loaded()` / `idle`. */
    __gullylineMap?: MaplibreMap;
  }
}

/**
 * Whether the map has fired `load` (its style is in place). Children that add sources and layers
 * by hand (the drawing layer) wait for it: before it MapLibre refuses them.
 */
export const MapLoadedContext = createContext(false);

export type PropertyMapProps = {
  propertyName: string;
  /** [west, south, east, north] in WGS84 degrees, or null while the property has no geometry yet. */
  extentWgs84: [number, number, number, number] | null;
  /** Sources and layers drawn over the base map (terrain, drainage lines, …). */
  children?: ReactNode;
  /** Layers whose features a click or tap picks (the pointer turns into a hand over them). */
  interactiveLayerIds?: readonly string[];
  /** Called with the topmost feature of `interactiveLayerIds` under a click or tap. */
  onFeatureClick?: (feature: MapGeoJSONFeature) => void;
  /** The ground height at a point, metres, or null off the elevation models (shown in the readout). */
  groundHeightAt?: (lon: number, lat: number) => Promise<number | null>;
};

/** Mainland Australia: with no extent the map frames it, which centres on inland country. */
const AUSTRALIA_MAINLAND_BOUNDS: BboxWgs84 = [113.2, -39.2, 153.7, -10.6];
const MAX_FIT_ZOOM = 16;
const NO_EXTENT_MESSAGE =
  'No extent yet — upload an elevation model or draw a fence line to place this property on the map.';

/** Padding for fitting the extent: generous on a desktop, never more than the screen can spare. */
function fitPadding(map: MaplibreMap): number {
  const container = map.getContainer();
  return Math.round(Math.min(48, 0.12 * Math.min(container.clientWidth, container.clientHeight)));
}

/** A mutable copy, as MapLibre's bounds types want. */
function toBounds([west, south, east, north]: BboxWgs84): LngLatBoundsLike {
  return [west, south, east, north];
}

/** Fits the map to the box, unless it is already fitted: each camera move redraws every layer. */
function fitExtent(map: MaplibreMap, bbox: BboxWgs84): void {
  const options = { padding: fitPadding(map), maxZoom: MAX_FIT_ZOOM };
  const camera = map.cameraForBounds(toBounds(bbox), options);
  // Where the fitted centre would fall on screen now: within a pixel of the middle is fitted already.
  const target = camera?.center ? map.project(camera.center) : null;
  const canvas = map.getCanvas();
  const fitted =
    camera && target && Math.abs((camera.zoom ?? 0) - map.getZoom()) < 0.02 && Math.hypot(target.x - canvas.clientWidth / 2, target.y - canvas.clientHeight / 2) < 1;
  if (fitted) return;
  map.fitBounds(toBounds(bbox), { ...options, duration: 0 });
}

/** The padding the first frame is fitted with, as fitPadding will find it once the map is laid out. */
const initialPadding = () => Math.round(Math.min(48, 0.12 * Math.min(window.innerWidth, window.innerHeight)));

function extentKeyOf(extent: BboxWgs84 | null): string {
  return extent ? extent.join(',') : '';
}

/** Inverse of extentKeyOf; exact, since JavaScript prints numbers so that they parse back unchanged. */
function extentFromKey(key: string): BboxWgs84 | null {
  if (!key) return null;
  const [west = NaN, south = NaN, east = NaN, north = NaN] = key.split(',').map(Number);
  return [west, south, east, north];
}

/**
 * The property's map: Gullyline's offline base style with the property extent and its name,
 * navigation and metric scale controls, and a readout of the pointer's coordinates.
 * Used from Astro as `<PropertyMap client:only="react" … />`; it fills its parent's box.
 */
export default function PropertyMap({ propertyName, extentWgs84, children, interactiveLayerIds, onFeatureClick, groundHeightAt }: PropertyMapProps) {
  const mapRef = useRef<MapRef>(null);
  const messageId = useId();
  const [loaded, setLoaded] = useState(false);
  const [overFeature, setOverFeature] = useState(false);
  const layerIds = useMemo(() => (interactiveLayerIds ? [...interactiveLayerIds] : undefined), [interactiveLayerIds]);

  // Memos are keyed on the numbers, not the array, so a re-render with an equal extent is free.
  const extentKey = extentKeyOf(toUsableExtent(extentWgs84));
  const extent = useMemo(() => extentFromKey(extentKey), [extentKey]);
  // Inside Australia this is always the same constant, so the style (and its graticule) is built once.
  const graticuleBbox = useMemo(() => graticuleBboxFor(extent), [extent]);
  const mapStyle = useMemo(() => createBaseStyle({ graticuleBboxWgs84: graticuleBbox }), [graticuleBbox]);
  const extentFeatures = useMemo(
    () => (extent ? createExtentFeatures(extent, propertyName) : null),
    [extent, propertyName],
  );

  // The first frame already shows the extent (or Australia); the fit with padding follows on load.
  const [initialViewState] = useState(() => ({
    bounds: toBounds(extent ?? AUSTRALIA_MAINLAND_BOUNDS),
    fitBoundsOptions: { padding: initialPadding(), maxZoom: MAX_FIT_ZOOM },
  }));

  // Fit on load, and again whenever the extent changes (e.g. an elevation model was just processed).
  // The map is published for browser tests only after the first fit, so waiting on it sees the final view.
  const fittedKey = useRef<string | null>(null);
  const publishedMap = useRef<MaplibreMap | null>(null);
  useEffect(() => {
    const map = mapRef.current?.getMap();
    if (!loaded || !map || fittedKey.current === extentKey) return;
    fittedKey.current = extentKey;
    fitExtent(map, extent ?? AUSTRALIA_MAINLAND_BOUNDS);
    window.__gullylineMap = map;
    publishedMap.current = map;
  }, [loaded, extentKey, extent]);

  // Unpublish on unmount (the map ref is already detached by then, hence the second ref).
  useEffect(
    () => () => {
      if (publishedMap.current && window.__gullylineMap === publishedMap.current) delete window.__gullylineMap;
    },
    [],
  );

  return (
    <div
      role="region"
      aria-label={`Map of ${propertyName}`}
      aria-describedby={extent ? undefined : messageId}
      data-testid="property-map"
      className="relative h-full min-h-80 w-full overflow-hidden"
    >
      <Map
        ref={mapRef}
        // Imported with this module rather than on first render (react-map-gl's default): the
        // browser then fetches MapLibre alongside the workspace's own code, not after it.
        mapLib={maplibregl}
        mapStyle={mapStyle}
        initialViewState={initialViewState}
        onLoad={() => setLoaded(true)}
        interactiveLayerIds={layerIds}
        onClick={
          onFeatureClick &&
          ((event) => {
            const feature = event.features?.[0];
            if (feature) onFeatureClick(feature);
          })
        }
        onMouseEnter={layerIds && (() => setOverFeature(true))}
        onMouseLeave={layerIds && (() => setOverFeature(false))}
        cursor={overFeature ? 'pointer' : undefined}
        maxZoom={18}
        // Labels appear at once: a fade is a second of extra frames, slow where WebGL is drawn in software.
        fadeDuration={0}
        renderWorldCopies={false}
        // Everything on this map is Gullyline's own; there is no third-party data to attribute.
        attributionControl={false}
        style={{ position: 'absolute', inset: 0 }}
      >
        {extentFeatures && (
          <Source id={PROPERTY_EXTENT_SOURCE_ID} type="geojson" data={extentFeatures}>
            {propertyExtentLayers.map((layer) => (
              // Fill and outline go under the grid labels; the property's name stays on top.
              <Layer key={layer.id} {...layer} beforeId={layer.type === 'symbol' ? undefined : BASE_FIRST_LABEL_LAYER_ID} />
            ))}
          </Source>
        )}
        <MapLoadedContext.Provider value={loaded}>{children}</MapLoadedContext.Provider>
        <NavigationControl position="top-right" visualizePitch={false} />
        <ScaleControl position="bottom-left" unit="metric" maxWidth={120} />
        <CursorReadout groundHeightAt={groundHeightAt} />
      </Map>

      {!extent && (
        <div className="pointer-events-none absolute inset-0 flex items-center justify-center p-6">
          <p
            id={messageId}
            role="status"
            className="max-w-sm rounded-lg px-5 py-4 text-center text-base leading-snug shadow-md"
            style={{ backgroundColor: `${MAP_COLOURS.casing}f2`, color: MAP_COLOURS.text, border: `1px solid ${MAP_COLOURS.gridMedium}` }}
          >
            {NO_EXTENT_MESSAGE}
          </p>
        </div>
      )}
    </div>
  );
}

type Cursor = { lat: number; lon: number };

/** The pointer must rest this long before its ground height is asked for. */
const HEIGHT_PAUSE_MS = 120;

/**
 * Latitude and longitude under the pointer (or the last tap), 5 decimals (about 1 m), and the
 * ground height there once the pointer pauses. It listens to the map itself so that pointer moves
 * re-render only this box, not the map.
 */
function CursorReadout({ groundHeightAt }: { groundHeightAt?: PropertyMapProps['groundHeightAt'] }) {
  const { current: mapRef } = useMap();
  const [cursor, setCursor] = useState<Cursor | null>(null);
  const [height, setHeight] = useState<{ at: Cursor; metres: number | null } | null>(null);

  // Ask once the pointer rests; a newer position drops the older answer.
  useEffect(() => {
    if (!cursor || !groundHeightAt) return;
    let current = true;
    const timer = setTimeout(() => {
      groundHeightAt(cursor.lon, cursor.lat)
        .then((metres) => current && setHeight({ at: cursor, metres }))
        .catch(() => current && setHeight(null));
    }, HEIGHT_PAUSE_MS);
    return () => {
      current = false;
      clearTimeout(timer);
    };
  }, [cursor, groundHeightAt]);

  useEffect(() => {
    const map = mapRef?.getMap();
    if (!map) return;
    const show = (event: MapMouseEvent) => setCursor({ lat: event.lngLat.lat, lon: event.lngLat.lng });
    const clear = () => {
      setCursor(null);
      setHeight(null);
    };
    map.on('mousemove', show);
    map.on('click', show);
    map.on('mouseout', clear);
    return () => {
      map.off('mousemove', show);
      map.off('click', show);
      map.off('mouseout', clear);
    };
  }, [mapRef]);

  return (
    <div
      data-testid="cursor-readout"
      className="pointer-events-none absolute bottom-2 right-2 z-10 rounded px-2 py-1 font-mono text-xs tabular-nums shadow-sm"
      style={{ backgroundColor: `${MAP_COLOURS.casing}e6`, color: MAP_COLOURS.text }}
    >
      {cursor ? `lat ${cursor.lat.toFixed(5)}, lon ${cursor.lon.toFixed(5)}` : 'lat —, lon —'}
      {groundHeightAt && cursor && (
        <span data-testid="cursor-height">
          {' · '}
          {height?.at === cursor ? (height.metres === null ? 'no ground model here' : `ground ${height.metres.toFixed(1)} m`) : 'ground …'}
        </span>
      )}
    </div>
  );
}
