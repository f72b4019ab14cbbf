import type { FeatureCollection } from 'geojson';
import { Layer, Source } from 'react-map-gl/maplibre';
import {
  DRAINAGE_SOURCE_ID,
  contourLabelLayer,
  contourLineLayer,
  contoursSourceId,
  drainageCasingLayer,
  drainageLineLayer,
  hillshadeLayer,
  hillshadeSourceId,
} from './terrain-layers';

export type TerrainRunLayer = { id: number; cornersWgs84: [number, number][]; contourIntervalM: number };
export type TerrainVisibility = { hillshade: boolean; contours: boolean; drainage: boolean };

type Props = {
  propertyId: number;
  runs: TerrainRunLayer[];
  drainage: FeatureCollection | null;
  visible: TerrainVisibility;
  /** Whether the property's extent is drawn: terrain then goes under its outline and name. */
  underExtent: boolean;
};

// Layer ids of the property extent (layers.ts) that the terrain is slid beneath.
const EXTENT_FILL = 'property-extent-fill';
const EXTENT_LABEL = 'property-extent-label';

/** Hillshade and contours of each finished terrain run, and the property's drainage lines. */
export default function TerrainOverlay({ propertyId, runs, drainage, visible, underExtent }: Props) {
  const belowExtent = underExtent ? EXTENT_FILL : undefined;
  const belowName = underExtent ? EXTENT_LABEL : undefined;
  const base = `/api/properties/${propertyId}/terrain-runs`;
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
        runs.map((run) => (
          <Source key={`c${run.id}`} id={contoursSourceId(run.id)} type="geojson" data={`${base}/${run.id}/contours.geojson`}>
            <Layer {...contourLineLayer(run.id, run.contourIntervalM)} beforeId={belowExtent} />
            <Layer {...contourLabelLayer(run.id)} beforeId={belowExtent} />
          </Source>
        ))}
      {visible.drainage && drainage && (
        <Source id={DRAINAGE_SOURCE_ID} type="geojson" data={drainage}>
          <Layer {...drainageCasingLayer} beforeId={belowName} />
          <Layer {...drainageLineLayer} beforeId={belowName} />
        </Source>
      )}
    </>
  );
}
