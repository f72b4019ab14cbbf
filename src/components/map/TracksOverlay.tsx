import type { FeatureCollection, LineString, Polygon } from 'geojson';
import { useMemo } from 'react';
import { Layer, Source } from 'react-map-gl/maplibre';
import type { Paddock } from '../../lib/schemas/paddock';
import type { Track } from '../../lib/schemas/tracks';
import {
  PADDOCKS_SOURCE_ID,
  TRACKS_SOURCE_ID,
  paddockEdgeLayer,
  paddockFillLayer,
  paddockLabelLayer,
  trackCasingLayer,
  trackLabelLayer,
  trackLineLayer,
} from './track-layers';

type Props = { tracks: Track[] | null; paddocks: Paddock[] | null; visible: { tracks: boolean; paddocks: boolean } };

const hectares = new Intl.NumberFormat('en-AU', { minimumFractionDigits: 1, maximumFractionDigits: 1 });

/** Paddocks under the plan, and imported GPS tracks over them; both always mounted to keep layer order. */
export default function TracksOverlay({ tracks, paddocks, visible }: Props) {
  const paddockData = useMemo<FeatureCollection<Polygon>>(
    () => ({
      type: 'FeatureCollection',
      features: (paddocks ?? []).map((paddock) => ({
        type: 'Feature',
        id: paddock.id,
        properties: { id: paddock.id, name: paddock.name, areaLabel: `${hectares.format(paddock.areaHa)} ha` },
        geometry: { type: 'Polygon', coordinates: paddock.rings },
      })),
    }),
    [paddocks],
  );
  const trackData = useMemo<FeatureCollection<LineString>>(
    () => ({
      type: 'FeatureCollection',
      features: (tracks ?? []).map((track) => ({
        type: 'Feature',
        id: track.id,
        properties: { id: track.id, name: track.name },
        geometry: { type: 'LineString', coordinates: track.coordinates },
      })),
    }),
    [tracks],
  );
  const paddockVisibility = visible.paddocks ? 'visible' : 'none';
  const trackVisibility = visible.tracks ? 'visible' : 'none';
  return (
    <>
      <Source id={PADDOCKS_SOURCE_ID} type="geojson" data={paddockData}>
        {[paddockFillLayer, paddockEdgeLayer, paddockLabelLayer].map((layer) => (
          <Layer key={layer.id} {...layer} layout={{ ...layer.layout, visibility: paddockVisibility }} />
        ))}
      </Source>
      <Source id={TRACKS_SOURCE_ID} type="geojson" data={trackData}>
        {[trackCasingLayer, trackLineLayer, trackLabelLayer].map((layer) => (
          <Layer key={layer.id} {...layer} layout={{ ...layer.layout, visibility: trackVisibility }} />
        ))}
      </Source>
    </>
  );
}
