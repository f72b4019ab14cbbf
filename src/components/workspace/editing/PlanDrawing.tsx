import { useContext, useEffect, useImperativeHandle, useRef, useState, type Ref } from 'react';
import { useMap } from 'react-map-gl/maplibre';
import type { TerraDraw } from 'terra-draw';
import { snapToPlan, type SnapTargets } from '../../../lib/geo/snap-to-plan';
import { MapLoadedContext } from '../../map/PropertyMap';
import { DRAW_MODES, createPlanDraw } from './draw-modes';

type LonLat = [number, number];

/** A shape on the drawing layer: a fence line's points or a paddock's outer ring (closed). */
export type DraftShape = { kind: 'fence'; coordinates: LonLat[] } | { kind: 'paddock'; ring: LonLat[] };

/**
 * What the drawing layer is doing: nothing; drawing a new fence line or paddock; reshaping a given
 * shape; or holding a finished shape on screen while its details are filled in.
 */
export type DrawTool =
  | { kind: 'idle' }
  | { kind: 'draw'; shape: DraftShape['kind'] }
  | { kind: 'reshape'; shape: DraftShape }
  | { kind: 'hold'; shape: DraftShape };

export type DrawControls = { undo: () => void; redo: () => void; finish: () => void };

type Props = {
  tool: DrawTool;
  snapTargets: SnapTargets;
  /** A new shape was finished (the last point clicked again, or Enter). */
  onFinished: (shape: DraftShape) => void;
  /** The shape as it is now, while drawing (with the point under the pointer) or reshaping. */
  onShapeChange: (shape: DraftShape | null) => void;
  onHistoryChange: (history: { canUndo: boolean; canRedo: boolean }) => void;
  /** A shape given to reshape could not be put on the drawing layer, or a point could not go. */
  onLoadFailed: (message: string) => void;
  /** While reshaping: a click or tap on a point removes it (the touch way; right-click also works). */
  removingPoints: boolean;
  controlsRef: Ref<DrawControls>;
};

/** How near, in screen pixels, a tap must fall to a point to remove it (a fingertip's width). */
const REMOVE_REACH_PX = 22;

/** How near, in screen pixels, a pointer must come to a fence end or a track to snap to it. */
const SNAP_TOLERANCE_PX = 12;

function shapeOf(draw: TerraDraw): DraftShape | null {
  const feature = draw.getSnapshot().find((f) => f.properties.mode === DRAW_MODES.fence || f.properties.mode === DRAW_MODES.paddock);
  if (!feature) return null;
  if (feature.geometry.type === 'LineString') return { kind: 'fence', coordinates: feature.geometry.coordinates as LonLat[] };
  if (feature.geometry.type === 'Polygon') return { kind: 'paddock', ring: feature.geometry.coordinates[0] as LonLat[] };
  return null;
}

/** Terra Draw refuses coordinates finer than its precision (9 decimals, about 0.1 mm). */
const toPrecision = (positions: LonLat[]): LonLat[] => positions.map(([lon, lat]) => [Number(lon.toFixed(9)), Number(lat.toFixed(9))]);

function toFeature(draw: TerraDraw, shape: DraftShape) {
  return shape.kind === 'fence'
    ? { id: draw.getFeatureId(), type: 'Feature' as const, properties: { mode: DRAW_MODES.fence }, geometry: { type: 'LineString' as const, coordinates: toPrecision(shape.coordinates) } }
    : { id: draw.getFeatureId(), type: 'Feature' as const, properties: { mode: DRAW_MODES.paddock }, geometry: { type: 'Polygon' as const, coordinates: [toPrecision(shape.ring)] } };
}

/**
 * The drawing layer on the map (Terra Draw). Rendered inside the map; the workspace drives it
 * through `tool` and hears back through the callbacks, so the map's own layers stay the saved plan.
 */
export default function PlanDrawing({ tool, snapTargets, onFinished, onShapeChange, onHistoryChange, onLoadFailed, removingPoints, controlsRef }: Props) {
  const { current: mapRef } = useMap();
  const mapLoaded = useContext(MapLoadedContext);
  const drawRef = useRef<TerraDraw | null>(null);
  // Callbacks and targets are read through refs so the Terra Draw instance is made only once.
  const latest = useRef({ snapTargets, onFinished, onShapeChange, onHistoryChange, onLoadFailed });
  latest.current = { snapTargets, onFinished, onShapeChange, onHistoryChange, onLoadFailed };

  // Terra Draw starts with the first drawing task, not with the map: its sources and layers would
  // cost a big station's first load more redraws (seconds where WebGL is drawn in software).
  const [needed, setNeeded] = useState(tool.kind !== 'idle');
  if (tool.kind !== 'idle' && !needed) setNeeded(true);

  // Terra Draw adds its sources and layers at start: only once the style is in place.
  useEffect(() => {
    const map = mapRef?.getMap();
    if (!map || !mapLoaded || !needed) return;
    const draw = createPlanDraw(map, (event, context) =>
      snapToPlan({ x: event.containerX, y: event.containerY }, latest.current.snapTargets, (lon, lat) => context.project(lon, lat), SNAP_TOLERANCE_PX),
    );
    draw.start();
    const reportHistory = () => latest.current.onHistoryChange({ canUndo: draw.canUndo(), canRedo: draw.canRedo() });
    draw.on('change', () => {
      latest.current.onShapeChange(shapeOf(draw));
      reportHistory();
    });
    draw.on('history', reportHistory);
    draw.on('finish', (id, context) => {
      if (context.action !== 'draw') return;
      const feature = draw.getSnapshotFeature(id);
      if (!feature) return;
      const shape =
        feature.geometry.type === 'LineString'
          ? ({ kind: 'fence', coordinates: feature.geometry.coordinates as LonLat[] } as const)
          : ({ kind: 'paddock', ring: (feature.geometry.coordinates as LonLat[][])[0]! } as const);
      latest.current.onFinished(shape);
    });
    drawRef.current = draw;
    return () => {
      drawRef.current = null;
      draw.stop();
    };
  }, [mapRef, mapLoaded, needed]);

  // Each tool change sets the mode and what is on the drawing layer.
  const toolKey = JSON.stringify(tool);
  useEffect(() => {
    const draw = drawRef.current;
    if (!draw?.enabled) return;
    const current = JSON.parse(toolKey) as DrawTool;
    if (current.kind === 'hold') {
      // Keep the finished shape on screen, but stop taking clicks.
      draw.setMode(DRAW_MODES.idle);
      return;
    }
    draw.setMode(DRAW_MODES.idle);
    draw.clear();
    draw.clearUndoRedoHistory();
    if (current.kind === 'draw') draw.setMode(DRAW_MODES[current.shape]);
    if (current.kind === 'reshape') {
      const feature = toFeature(draw, current.shape);
      const [result] = draw.addFeatures([feature]);
      if (result?.valid) {
        draw.setMode(DRAW_MODES.reshape);
        draw.selectFeature(feature.id);
      } else {
        latest.current.onLoadFailed(`This shape cannot be reshaped on the map (${result?.reason ?? 'not accepted'}).`);
      }
    }
    latest.current.onShapeChange(shapeOf(draw));
    latest.current.onHistoryChange({ canUndo: false, canRedo: false });
  }, [toolKey, mapLoaded, needed]);

  // Removing points by tapping them: the nearest point within reach of the tap goes.
  useEffect(() => {
    const map = mapRef?.getMap();
    const draw = drawRef.current;
    if (!map || !draw || !removingPoints || tool.kind !== 'reshape') return;
    const onClick = (event: { point: { x: number; y: number } }) => {
      const feature = draw.getSnapshot().find((f) => f.properties.mode === DRAW_MODES.fence || f.properties.mode === DRAW_MODES.paddock);
      if (!feature) return;
      const isFence = feature.geometry.type === 'LineString';
      const points = (isFence ? feature.geometry.coordinates : (feature.geometry.coordinates as LonLat[][])[0]!.slice(0, -1)) as LonLat[];
      let nearest = -1;
      let nearestPx = REMOVE_REACH_PX;
      points.forEach(([lon, lat], index) => {
        const at = map.project([lon, lat]);
        const px = Math.hypot(at.x - event.point.x, at.y - event.point.y);
        if (px <= nearestPx) [nearest, nearestPx] = [index, px];
      });
      if (nearest < 0) return;
      if (points.length <= (isFence ? 2 : 3)) {
        latest.current.onLoadFailed(isFence ? 'A fence line keeps at least two points.' : 'A paddock keeps at least three corners.');
        return;
      }
      const kept = points.filter((_, index) => index !== nearest);
      draw.updateFeatureGeometry(feature.id!, isFence ? { type: 'LineString', coordinates: kept } : { type: 'Polygon', coordinates: [[...kept, kept[0]!]] });
      latest.current.onShapeChange(shapeOf(draw));
    };
    map.on('click', onClick);
    return () => {
      map.off('click', onClick);
    };
  }, [mapRef, removingPoints, tool.kind]);

  useImperativeHandle(controlsRef, () => ({
    undo: () => drawRef.current?.undo(),
    redo: () => drawRef.current?.redo(),
    // Enter on the map finishes a shape in Terra Draw; the toolbar's Finish button sends the same key.
    finish: () => {
      mapRef?.getMap().getCanvas().dispatchEvent(new KeyboardEvent('keyup', { key: 'Enter', bubbles: true }));
    },
  }));

  return null;
}
