import {
  TerraDraw,
  TerraDrawLineStringMode,
  TerraDrawModeUndoRedo,
  TerraDrawPolygonMode,
  TerraDrawSelectMode,
  TerraDrawSessionUndoRedo,
  TerraDrawUndoRedoKeyboardShortcuts,
  type SnapToCustom,
} from 'terra-draw';
import { TerraDrawMapLibreGLAdapter } from 'terra-draw-maplibre-gl-adapter';
import type { Map as MaplibreMap } from 'maplibre-gl';
import { DRAFT_COLOURS, DRAFT_SHOWS_POINTS } from '../../map/draft-style';

/** Terra Draw's mode names in Gullyline: a fence line, a paddock, and reshaping either. */
export const DRAW_MODES = { fence: 'fence', paddock: 'paddock', reshape: 'reshape', idle: 'static' } as const;

const hex = (colour: string) => colour as `#${string}`;

const vertexStyles = {
  coordinatePointColor: hex(DRAFT_COLOURS.vertexFill),
  coordinatePointOutlineColor: hex(DRAFT_COLOURS.vertexOutline),
  coordinatePointWidth: 5,
  coordinatePointOutlineWidth: 2,
  closingPointColor: hex(DRAFT_COLOURS.vertexFill),
  closingPointOutlineColor: hex(DRAFT_COLOURS.vertexOutline),
  closingPointWidth: 6,
  closingPointOutlineWidth: 2,
  snappingPointColor: hex(DRAFT_COLOURS.snap),
  snappingPointOutlineColor: hex(DRAFT_COLOURS.vertexFill),
  snappingPointWidth: 7,
  snappingPointOutlineWidth: 2,
};

/**
 * A Terra Draw instance on the map with Gullyline's modes: `fence` (click to add points, click the
 * last point or press Enter to finish, Escape to cancel), `paddock` (the same, closing on the
 * first point), and `reshape` (drag a point, drag a midpoint to add one, right-click to remove
 * one). Session and in-drawing undo/redo are on, with the usual Ctrl/Cmd+Z and Ctrl/Cmd+Shift+Z.
 * `snap` is asked for a position on every pointer move; it returns undefined to leave it free.
 */
export function createPlanDraw(map: MaplibreMap, snap: SnapToCustom): TerraDraw {
  const snapping = { toCustom: snap, toCoordinate: true };
  const reshapeCoordinates = { draggable: true, midpoints: { draggable: true }, deletable: true, snappable: snapping };
  return new TerraDraw({
    adapter: new TerraDrawMapLibreGLAdapter({ map, coordinatePrecision: 9 }),
    modes: [
      new TerraDrawLineStringMode({
        modeName: DRAW_MODES.fence,
        snapping,
        showCoordinatePoints: DRAFT_SHOWS_POINTS,
        styles: { lineStringColor: hex(DRAFT_COLOURS.line), lineStringWidth: 4, ...vertexStyles },
      }),
      new TerraDrawPolygonMode({
        modeName: DRAW_MODES.paddock,
        snapping,
        showCoordinatePoints: DRAFT_SHOWS_POINTS,
        styles: {
          fillColor: hex(DRAFT_COLOURS.paddockFill),
          fillOpacity: 0.25,
          outlineColor: hex(DRAFT_COLOURS.line),
          outlineWidth: 3,
          ...vertexStyles,
        },
      }),
      new TerraDrawSelectMode({
        modeName: DRAW_MODES.reshape,
        // The shape being reshaped stays selected; leaving is the toolbar's job.
        allowManualDeselection: false,
        keyEvents: { deselect: null, delete: null, rotate: null, scale: null },
        flags: {
          [DRAW_MODES.fence]: { feature: { coordinates: reshapeCoordinates } },
          [DRAW_MODES.paddock]: { feature: { coordinates: reshapeCoordinates } },
        },
        styles: {
          selectedLineStringColor: hex(DRAFT_COLOURS.line),
          selectedLineStringWidth: 4,
          selectedPolygonColor: hex(DRAFT_COLOURS.paddockFill),
          selectedPolygonFillOpacity: 0.25,
          selectedPolygonOutlineColor: hex(DRAFT_COLOURS.line),
          selectedPolygonOutlineWidth: 3,
          selectionPointColor: hex(DRAFT_COLOURS.vertexFill),
          selectionPointOutlineColor: hex(DRAFT_COLOURS.vertexOutline),
          selectionPointWidth: 6,
          selectionPointOutlineWidth: 2,
          midPointColor: hex(DRAFT_COLOURS.midpoint),
          midPointOutlineColor: hex(DRAFT_COLOURS.vertexFill),
          midPointWidth: 4,
          midPointOutlineWidth: 1,
        },
      }),
    ],
    undoRedo: {
      modeLevel: new TerraDrawModeUndoRedo(),
      sessionLevel: new TerraDrawSessionUndoRedo(),
      keyboardShortcuts: new TerraDrawUndoRedoKeyboardShortcuts(),
    },
  });
}
