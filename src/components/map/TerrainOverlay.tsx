import { useEffect, useState } from 'react';
import { Layer, Source, useMap } from 'react-map-gl/maplibre';
import { DRAINAGE_TILE_MAX_ZOOM } from '../../lib/geo/drainage-tile-rules';
import {
  CONTOURS_MIN_ZOOM,
  contourLabelLayer,
  contourLineLayer,
  contoursSourceId,
  drainageCasingLayer,
  drainageLineLayer,
  drainageSourceId,
  hillshadeLayer,
  hillshadeSourceId,
} from './terrain-layers';

export type TerrainRunLayer = { id: number; cornersWgs84: [number, number][]; contourIntervalM: number };
export type TerrainVisibility = { hillshade: boolean; contours: boolean; drainage: boolean };

type Props = {
  propertyId: number;
  runs: TerrainRunLayer[];
  visible: TerrainVisibility;
  /** Whether the property's extent is drawn: terrain then goes under its outline and name. */
  underExtent: boolean;
};

// Layer ids of the property extent (layers.ts) that the terrain is slid beneath.
const EXTENT_FILL = 'property-extent-fill';
const EXTENT_LABEL = 'property-extent-label';

/** Hillshade, contours and drainage lines of each finished terrain run. */
export default function TerrainOverlay({ propertyId, runs, visible, underExtent }: Props) {
  const belowExtent = underExtent ? EXTENT_FILL : undefined;
  const belowName = underExtent ? EXTENT_LABEL : undefined;
  const base = `/api/properties/${propertyId}/terrain-runs`;
  // Tiles are fetched by MapLibre's workers, which need a full address.
  const origin = window.location.origin;
  const contoursWanted = useZoomReached(CONTOURS_MIN_ZOOM);
  return (
    <>
      {visible.hillshade &&
        runs.map((run) => (
          <Source
            key={`h${run.id}`}
            id={hillshadeSourceId(run.id)}
            type="image"
            url={`${base}/${run.id}/hillshade.png`}
            coordinates={run.cornersWgs84 as [[number, number], [number, number], [number, number], [number, number]]}
          >
            <Layer {...hillshadeLayer(run.id)} beforeId={belowExtent} />
          </Source>
        ))}
      {visible.contours &&
        contoursWanted &&
        runs.map((run) => (
          <Source key={`c${run.id}`} id={contoursSourceId(run.id)} type="geojson" data={`${base}/${run.id}/contours.geojson`}>
            <Layer {...contourLineLayer(run.id, run.contourIntervalM)} beforeId={belowExtent} />
            <Layer {...contourLabelLayer(run.id)} beforeId={belowExtent} />
          </Source>
        ))}
      {visible.drainage &&
        runs.map((run) => (
          // Vector tiles: only the tiles in view are fetched, already clipped and simplified for their zoom.
          <Source
            key={`d${run.id}`}
            id={drainageSourceId(run.id)}
            type="vector"
            tiles={[`${origin}${base}/${run.id}/drainage/{z}/{x}/{y}`]}
            maxzoom={DRAINAGE_TILE_MAX_ZOOM}
          >
            <Layer {...drainageCasingLayer(run.id)} beforeId={belowName} />
            <Layer {...drainageLineLayer(run.id)} beforeId={belowName} />
          </Source>
        ))}
    </>
  );
}

/**
 * Whether the map has been at `zoom` or closer. The contours (megabytes of GeoJSON on a big
 * station) are fetched only then: a first view of the whole property does not draw them.
 */
function useZoomReached(zoom: number): boolean {
  const { current: mapRef } = useMap();
  const [reached, setReached] = useState(() => (mapRef?.getZoom() ?? 0) >= zoom);
  useEffect(() => {
    const map = mapRef?.getMap();
    if (!map || reached) return;
    const check = () => map.getZoom() >= zoom && setReached(true);
    check();
    map.on('zoomend', check);
    return () => void map.off('zoomend', check);
  }, [mapRef, reached, zoom]);
  return reached;
}
