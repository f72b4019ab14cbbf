import { useQueryClient } from '@tanstack/react-query';
import { useCallback, useMemo, useRef, useState } from 'react';
import { ApiError, api } from '../../../lib/client/api';
import { refreshPlanQueries } from '../../../lib/client/plan-queries';
import { lineLengthM, polygonAreaHa } from '../../../lib/geo/measure';
import type { FenceLine } from '../../../lib/schemas/plan';
import type { Paddock } from '../../../lib/schemas/paddock';
import type { FenceLineDetails } from './FenceLineForm';
import type { DraftShape, DrawControls, DrawTool } from './PlanDrawing';
import type { SavedChange } from './saved-history';

/** The edit under way: a new fence line or paddock (being drawn, then described), or a reshape. */
export type EditTask =
  | { kind: 'new-fence'; stage: 'drawing' | 'details' }
  | { kind: 'new-paddock'; stage: 'drawing' | 'details' }
  | { kind: 'reshape-fence'; fence: FenceLine }
  | { kind: 'reshape-paddock'; paddock: Paddock };

/** A save refused because someone else changed the same thing: theirs is kept aside, ours stays on the map. */
export type EditConflict = { message: string; latestVersion: number | null };

/** A save that went through: what the server answered, the change for the saved history, and a sentence saying so. */
export type EditorSave = { fenceLine?: FenceLine; paddock?: Paddock; change: SavedChange; message: string };

type Options = { propertyId: number; onSaved: (saved: EditorSave) => void };

const fieldsOf = (error: unknown) => (error instanceof ApiError ? Object.fromEntries(Object.entries(error.fields).map(([k, v]) => [k.replace(/^wireSpec\./, ''), v])) : {});
const messageOf = (error: unknown) => (error instanceof Error ? error.message : 'The change could not be saved.');

/** Live measures of a shape: metres of fence, or hectares of paddock. */
export function measureShape(shape: DraftShape | null): { lengthM?: number; areaHa?: number } {
  if (!shape) return {};
  if (shape.kind === 'fence') return shape.coordinates.length >= 2 ? { lengthM: lineLengthM(shape.coordinates) } : {};
  return shape.ring.length >= 4 ? { areaHa: polygonAreaHa([shape.ring]) } : {};
}

/** The version now saved of what a reshape changes, so a person can choose to save over it. */
async function latestVersionOf(propertyId: number, task: EditTask | null): Promise<number | null> {
  if (task?.kind === 'reshape-fence') return (await api.getFenceLine(propertyId, task.fence.id)).fenceLine.version;
  if (task?.kind === 'reshape-paddock') return (await api.getPaddock(propertyId, task.paddock.id)).paddock.version;
  return null;
}

/**
 * The workspace's editing state: which tool the drawing layer has, the shape as drawn so far,
 * undo/redo availability, and the saves (new fence lines and paddocks, reshapes with stale-edit
 * checks). Saved changes refresh the plan's queries; a refused save keeps the drawing.
 */
export function usePlanEditor({ propertyId, onSaved }: Options) {
  const queryClient = useQueryClient();
  const [task, setTask] = useState<EditTask | null>(null);
  const [tool, setTool] = useState<DrawTool>({ kind: 'idle' });
  const [shape, setShape] = useState<DraftShape | null>(null);
  const [finished, setFinished] = useState<DraftShape | null>(null);
  const [history, setHistory] = useState({ canUndo: false, canRedo: false });
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<{ message: string; fields: Record<string, string> } | null>(null);
  const [conflict, setConflict] = useState<EditConflict | null>(null);
  const [removingPoints, setRemovingPoints] = useState(false);
  const controlsRef = useRef<DrawControls>(null);
  const taskRef = useRef(task);
  taskRef.current = task;

  const reset = useCallback(() => {
    setTask(null);
    setTool({ kind: 'idle' });
    setShape(null);
    setFinished(null);
    setError(null);
    setConflict(null);
    setBusy(false);
    setRemovingPoints(false);
  }, []);

  const refreshPlan = useCallback(async () => {
    await refreshPlanQueries(queryClient, propertyId);
  }, [propertyId, queryClient]);

  const startDrawing = useCallback(
    (kind: 'fence' | 'paddock') => {
      reset();
      setTask({ kind: kind === 'fence' ? 'new-fence' : 'new-paddock', stage: 'drawing' });
      setTool({ kind: 'draw', shape: kind });
    },
    [reset],
  );

  const startReshape = useCallback(
    (target: { fence: FenceLine } | { paddock: Paddock }) => {
      reset();
      if ('fence' in target) {
        setTask({ kind: 'reshape-fence', fence: target.fence });
        setTool({ kind: 'reshape', shape: { kind: 'fence', coordinates: target.fence.coordinates } });
      } else {
        setTask({ kind: 'reshape-paddock', paddock: target.paddock });
        setTool({ kind: 'reshape', shape: { kind: 'paddock', ring: target.paddock.rings[0]! } });
      }
    },
    [reset],
  );

  const onFinished = useCallback((drawn: DraftShape) => {
    setFinished(drawn);
    setShape(drawn);
    setTool({ kind: 'hold', shape: drawn });
    setTask((current) => (current && (current.kind === 'new-fence' || current.kind === 'new-paddock') ? { ...current, stage: 'details' } : current));
  }, []);

  const run = useCallback(
    async (save: () => Promise<EditorSave>) => {
      setBusy(true);
      setError(null);
      try {
        const saved = await save();
        await refreshPlan();
        reset();
        onSaved(saved);
      } catch (caught) {
        setBusy(false);
        if (caught instanceof ApiError && caught.status === 409) {
          setConflict({ message: caught.message, latestVersion: await latestVersionOf(propertyId, taskRef.current).catch(() => null) });
        } else {
          setError({ message: messageOf(caught), fields: fieldsOf(caught) });
        }
      }
    },
    [onSaved, propertyId, refreshPlan, reset],
  );

  const saveNewFence = useCallback(
    (details: FenceLineDetails) => {
      if (finished?.kind !== 'fence') return;
      void run(async () => {
        const { fenceLine } = await api.createFenceLine(propertyId, { ...details, coordinates: finished.coordinates });
        return { fenceLine, change: { what: 'fence-created', fence: fenceLine }, message: `${fenceLine.name} saved; its crossings were found and designed.` };
      });
    },
    [finished, propertyId, run],
  );

  const saveNewPaddock = useCallback(
    (name: string) => {
      if (finished?.kind !== 'paddock') return;
      void run(async () => {
        const { paddock } = await api.createPaddock(propertyId, { name, rings: [finished.ring] });
        return { paddock, change: { what: 'paddock-created', paddock }, message: `${paddock.name} saved: ${paddock.areaHa.toFixed(1)} ha.` };
      });
    },
    [finished, propertyId, run],
  );

  /** Saves the reshaped line or paddock; `overVersion` saves over someone else's newer change on purpose. */
  const saveShape = useCallback(
    (overVersion?: number) => {
      if (!task || !shape) return;
      setConflict(null);
      if (task.kind === 'reshape-fence' && shape.kind === 'fence') {
        void run(async () => {
          const { fenceLine } = await api.updateFenceLine(propertyId, task.fence.id, { coordinates: shape.coordinates, version: overVersion ?? task.fence.version });
          return {
            fenceLine,
            change: { what: 'fence-reshaped', before: task.fence, after: fenceLine },
            message: `${fenceLine.name} has its new shape; its crossings were found and designed again.`,
          };
        });
      }
      if (task.kind === 'reshape-paddock' && shape.kind === 'paddock') {
        void run(async () => {
          const { paddock } = await api.updatePaddock(propertyId, task.paddock.id, { rings: [shape.ring], version: overVersion ?? task.paddock.version });
          return { paddock, change: { what: 'paddock-reshaped', before: task.paddock, after: paddock }, message: `${paddock.name} has its new boundary: ${paddock.areaHa.toFixed(1)} ha.` };
        });
      }
    },
    [propertyId, run, shape, task],
  );

  const measures = useMemo(() => measureShape(shape), [shape]);

  return {
    task,
    tool,
    shape,
    measures,
    history,
    busy,
    error,
    conflict,
    controlsRef,
    startDrawing,
    startReshape,
    cancel: reset,
    /** Drops the local change and shows the saved plan (after a conflict). */
    discardAndReload: async () => {
      reset();
      await refreshPlan();
    },
    saveNewFence,
    saveNewPaddock,
    saveShape,
    removingPoints,
    setRemovingPoints,
    drawingProps: {
      tool,
      removingPoints,
      onFinished,
      onShapeChange: setShape,
      onHistoryChange: setHistory,
      onLoadFailed: (message: string) => setError({ message, fields: {} }),
      controlsRef,
    },
  };
}

export type PlanEditor = ReturnType<typeof usePlanEditor>;
