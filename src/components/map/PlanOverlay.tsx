import type { Feature, FeatureCollection, LineString, Point } from 'geojson';
import type { Map as MaplibreMap, MapStyleImageMissingEvent } from 'maplibre-gl';
import { useEffect, useMemo } from 'react';
import { Layer, Source, useMap } from 'react-map-gl/maplibre';
import type { CrossingCollection, LayoutPointView, LonLat } from '../../lib/schemas/crossing-view';
import type { FenceLine } from '../../lib/schemas/plan';
import {
  CROSSINGS_SOURCE_ID,
  FENCE_LINES_SOURCE_ID,
  FLOODGATE_SOURCE_ID,
  LAYOUT_ICONS,
  LAYOUT_ICON_COLOURS,
  LAYOUT_POINTS_SOURCE_ID,
  REALIGN_SOURCE_ID,
  crossingDotLayer,
  crossingHitLayer,
  crossingMarkLayer,
  crossingRedesignLayer,
  crossingRingLayer,
  fenceCasingLayer,
  fenceLabelLayer,
  fenceLineLayer,
  floodgateBandLayer,
  layoutLabelLayer,
  layoutMarkerLayer,
  layoutPostLayer,
  realignCasingLayer,
  realignLineLayer,
  selectedCrossingLayers,
} from './plan-layers';

export { CROSSING_INTERACTIVE_LAYER_IDS } from './plan-layers';

type Props = {
  fenceLines: FenceLine[] | null;
  crossings: CrossingCollection | null;
  selectedCrossingId: number | null;
  /** The selected crossing's strainers, posts and ties (shown from zoom 15). */
  layoutPoints: LayoutPointView[] | null;
  /** A suggested new shape of a fence line: its changed stretch is drawn dashed over the plan. */
  realignment: { fenceLineId: number; coordinates: LonLat[] } | null;
  /** Asks the map to bring a place into view at a zoom; a new `seq` asks again for the same place. */
  focus: { position: LonLat; zoom: number; seq: number } | null;
};

const EMPTY: FeatureCollection = { type: 'FeatureCollection', features: [] };

/**
 * The plan over the terrain: fence lines by status, crossings by angle class, the selected
 * crossing's layout, and a realignment preview. Every source is always mounted (empty when there
 * is nothing to draw) so the layers keep this order whatever loads first.
 */
export default function PlanOverlay({ fenceLines, crossings, selectedCrossingId, layoutPoints, realignment, focus }: Props) {
  const { current: mapRef } = useMap();

  const fenceData = useMemo<FeatureCollection<LineString>>(
    () => ({
      type: 'FeatureCollection',
      features: (fenceLines ?? []).map((fence) => ({
        type: 'Feature',
        id: fence.id,
        properties: { id: fence.id, name: fence.name, status: fence.status },
        geometry: { type: 'LineString', coordinates: fence.coordinates },
      })),
    }),
    [fenceLines],
  );

  const layoutData = useMemo<FeatureCollection<Point>>(
    () => ({
      type: 'FeatureCollection',
      features: (layoutPoints ?? []).map(
        (point, index): Feature<Point> => ({
          type: 'Feature',
          id: index,
          properties: { kind: point.kind, label: point.label, chainageM: point.chainageM, braced: point.braced === true, link: point.link ?? null },
          geometry: { type: 'Point', coordinates: point.position },
        }),
      ),
    }),
    [layoutPoints],
  );

  // The floodgate's stretch, through its posts in chainage order.
  const floodgateData = useMemo<FeatureCollection>(() => {
    const posts = (layoutPoints ?? []).filter((point) => point.kind === 'floodgate-post').sort((a, b) => a.chainageM - b.chainageM);
    if (posts.length < 2) return EMPTY;
    return {
      type: 'FeatureCollection',
      features: [{ type: 'Feature', properties: {}, geometry: { type: 'LineString', coordinates: posts.map((post) => post.position) } }],
    };
  }, [layoutPoints]);

  const realignData = useMemo<FeatureCollection>(() => {
    if (!realignment) return EMPTY;
    const original = fenceLines?.find((fence) => fence.id === realignment.fenceLineId)?.coordinates ?? [];
    const changed = changedStretch(original, realignment.coordinates);
    if (changed.length < 2) return EMPTY;
    return { type: 'FeatureCollection', features: [{ type: 'Feature', properties: {}, geometry: { type: 'LineString', coordinates: changed } }] };
  }, [realignment, fenceLines]);

  const selectedLayers = useMemo(() => selectedCrossingLayers(selectedCrossingId), [selectedCrossingId]);

  // The layout's markers are drawn here rather than shipped as a sprite: three small shapes.
  useEffect(() => {
    const map = mapRef?.getMap();
    if (!map) return;
    addLayoutIcons(map);
    const onMissing = (event: MapStyleImageMissingEvent) => {
      if ((Object.values(LAYOUT_ICONS) as string[]).includes(event.id)) addLayoutIcons(map);
    };
    map.on('styleimagemissing', onMissing);
    return () => {
      map.off('styleimagemissing', onMissing);
    };
  }, [mapRef]);

  useEffect(() => {
    const map = mapRef?.getMap();
    if (!map || !focus) return;
    const reduceMotion = window.matchMedia('(prefers-reduced-motion: reduce)').matches;
    map.easeTo({ center: focus.position, zoom: Math.max(map.getZoom(), focus.zoom), duration: reduceMotion ? 0 : 600 });
    // A new request is a new object (state in the workspace), so a re-render does not move the map.
  }, [mapRef, focus]);

  return (
    <>
      <Source id={FENCE_LINES_SOURCE_ID} type="geojson" data={fenceData}>
        <Layer {...fenceCasingLayer} />
        <Layer {...fenceLineLayer} />
        <Layer {...fenceLabelLayer} />
      </Source>
      <Source id={REALIGN_SOURCE_ID} type="geojson" data={realignData}>
        <Layer {...realignCasingLayer} />
        <Layer {...realignLineLayer} />
      </Source>
      <Source id={CROSSINGS_SOURCE_ID} type="geojson" data={crossings ?? EMPTY}>
        <Layer {...selectedLayers[0]} />
        <Layer {...selectedLayers[1]} />
        <Layer {...crossingRedesignLayer} />
        <Layer {...crossingRingLayer} />
        <Layer {...crossingDotLayer} />
        <Layer {...crossingMarkLayer} />
        <Layer {...crossingHitLayer} />
      </Source>
      {/* The selected crossing's layout goes over the crossings (it is only shown close up), under the hit discs. */}
      <Source id={FLOODGATE_SOURCE_ID} type="geojson" data={floodgateData}>
        <Layer {...floodgateBandLayer} beforeId={crossingHitLayer.id} />
      </Source>
      <Source id={LAYOUT_POINTS_SOURCE_ID} type="geojson" data={layoutData}>
        <Layer {...layoutPostLayer} beforeId={crossingHitLayer.id} />
        <Layer {...layoutMarkerLayer} beforeId={crossingHitLayer.id} />
        <Layer {...layoutLabelLayer} beforeId={crossingHitLayer.id} />
      </Source>
    </>
  );
}

/**
 * The stretch of a new line that differs from the original (the dog-leg), so the original stays
 * visible beside it; the whole new line when nothing is shared.
 */
function changedStretch(original: readonly number[][], next: LonLat[]): LonLat[] {
  const same = (a: readonly number[] | undefined, b: readonly number[] | undefined) => !!a && !!b && a[0] === b[0] && a[1] === b[1];
  let start = 0;
  while (start < next.length && same(original[start], next[start])) start += 1;
  let end = 0;
  while (end < next.length - start && same(original[original.length - 1 - end], next[next.length - 1 - end])) end += 1;
  const changed = next.slice(start, next.length - end);
  return changed.length >= 2 ? changed : next;
}

/** Size of the icons in device pixels; drawn at twice their CSS size for sharp edges. */
const ICON_PX = 32;
const ICON_RATIO = 2;

function addLayoutIcons(map: MaplibreMap): void {
  const draw = (id: string, paint: (ctx: CanvasRenderingContext2D, size: number) => void) => {
    if (map.hasImage(id)) return;
    const canvas = document.createElement('canvas');
    canvas.width = ICON_PX;
    canvas.height = ICON_PX;
    const ctx = canvas.getContext('2d');
    if (!ctx) return;
    paint(ctx, ICON_PX);
    map.addImage(id, ctx.getImageData(0, 0, ICON_PX, ICON_PX), { pixelRatio: ICON_RATIO });
  };
  const { endStrainer, flexRunStrainer, breakawayTie } = LAYOUT_ICON_COLOURS;
  // End strainer: a solid dark square with a pale rim.
  draw(LAYOUT_ICONS.endStrainer, (ctx, size) => {
    ctx.fillStyle = endStrainer.rim;
    ctx.fillRect(2, 2, size - 4, size - 4);
    ctx.fillStyle = endStrainer.fill;
    ctx.fillRect(6, 6, size - 12, size - 12);
  });
  // Flex-run strainer: an open square.
  draw(LAYOUT_ICONS.flexRunStrainer, (ctx, size) => {
    ctx.fillStyle = flexRunStrainer.rim;
    ctx.fillRect(3, 3, size - 6, size - 6);
    ctx.strokeStyle = flexRunStrainer.outline;
    ctx.lineWidth = 5;
    ctx.strokeRect(8, 8, size - 16, size - 16);
  });
  // Breakaway tie: a diamond.
  draw(LAYOUT_ICONS.breakawayTie, (ctx, size) => {
    const half = size / 2;
    const diamond = (inset: number) => {
      ctx.beginPath();
      ctx.moveTo(half, inset);
      ctx.lineTo(size - inset, half);
      ctx.lineTo(half, size - inset);
      ctx.lineTo(inset, half);
      ctx.closePath();
    };
    ctx.fillStyle = breakawayTie.rim;
    diamond(1);
    ctx.fill();
    ctx.fillStyle = breakawayTie.fill;
    ctx.strokeStyle = breakawayTie.outline;
    ctx.lineWidth = 2.5;
    diamond(6);
    ctx.fill();
    ctx.stroke();
  });
}
