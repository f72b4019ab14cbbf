import type { PlanEditor } from './use-plan-editor';
import type { SavedHistoryControls } from './use-saved-history';
import { formatMeasures } from './format-measure';

type Props = { editor: PlanEditor; saved: SavedHistoryControls };

const HINTS = {
  fence: 'Click to add points; click the last point again or press Enter to finish. Points snap to fence ends and tracks.',
  paddock: 'Click around the paddock; click the first point or press Enter to close it.',
  reshape: 'Drag a point to move it, drag a small middle point to add one, right-click a point (or use Remove points) to remove it.',
  removing: 'Tap or click a point to remove it. Press Remove points again to go back to moving them.',
} as const;

/**
 * The editing strip over the map: start drawing a fence line or a paddock, then the hint, the live
 * length or area, undo/redo and finish/cancel for the shape under way. With no drawing under way,
 * undo/redo of the saved changes instead. Shown only to editors.
 */
export function EditToolbar({ editor, saved }: Props) {
  const { task, tool, history, measures, controlsRef } = editor;
  const drawing = tool.kind === 'draw';
  const reshaping = tool.kind === 'reshape';
  const measure = formatMeasures(measures);
  const hint = drawing ? HINTS[tool.shape] : reshaping ? (editor.removingPoints ? HINTS.removing : HINTS.reshape) : null;

  return (
    <div
      className="absolute left-2 top-16 z-10 flex max-w-[calc(100%-4rem)] flex-col gap-2 rounded-lg bg-white/95 p-2 shadow-md md:left-auto md:right-12 md:top-2 md:max-w-[24rem] md:items-end"
      role="toolbar"
      aria-label="Edit the plan"
      data-testid="edit-toolbar"
    >
      {!task ? (
        <div className="flex flex-col gap-2 md:items-end">
          <div className="flex flex-row gap-2">
            <button type="button" className="btn-primary min-h-11" onClick={() => editor.startDrawing('fence')} data-testid="draw-fence" aria-keyshortcuts="F">
              Draw fence
            </button>
            <button type="button" className="btn-quiet min-h-11" onClick={() => editor.startDrawing('paddock')} data-testid="draw-paddock" aria-keyshortcuts="P">
              Draw paddock
            </button>
          </div>
          {/* On a phone the map is small: the row shows there only once there is something to undo or redo. */}
          <div className={`flex-row gap-2 ${saved.undoLabel || saved.redoLabel ? 'flex' : 'hidden md:flex'}`}>
            <SavedStepButton direction="undo" label={saved.undoLabel} busy={saved.busy} onClick={saved.undo} />
            <SavedStepButton direction="redo" label={saved.redoLabel} busy={saved.busy} onClick={saved.redo} />
          </div>
        </div>
      ) : (
        <>
          {hint && <p className="max-w-sm text-sm text-bark-700">{hint}</p>}
          <p className="text-sm font-semibold tabular-nums" aria-live="polite" data-testid="draft-measure">
            {measure ? `${tool.kind === 'draw' || task.kind.startsWith('new') ? 'New' : 'Now'}: ${measure}` : 'No points yet'}
          </p>
          {(drawing || reshaping) && (
            <div className="flex flex-wrap gap-2">
              <button type="button" className="btn-quiet min-h-11 px-3" disabled={!history.canUndo} onClick={() => controlsRef.current?.undo()} aria-keyshortcuts="Control+Z" data-testid="draft-undo">
                Undo
              </button>
              <button type="button" className="btn-quiet min-h-11 px-3" disabled={!history.canRedo} onClick={() => controlsRef.current?.redo()} aria-keyshortcuts="Control+Shift+Z" data-testid="draft-redo">
                Redo
              </button>
              {drawing && (
                <button type="button" className="btn-primary min-h-11 px-3" onClick={() => controlsRef.current?.finish()} aria-keyshortcuts="Enter" data-testid="draft-finish">
                  Finish
                </button>
              )}
              {reshaping && (
                <button
                  type="button"
                  className={`min-h-11 px-3 ${editor.removingPoints ? 'btn bg-bark-900 text-white' : 'btn-quiet'}`}
                  aria-pressed={editor.removingPoints}
                  onClick={() => editor.setRemovingPoints(!editor.removingPoints)}
                  data-testid="reshape-remove-points"
                >
                  Remove points
                </button>
              )}
              {reshaping && (
                <button type="button" className="btn-primary min-h-11 px-3" disabled={editor.busy} onClick={() => editor.saveShape()} data-testid="reshape-save">
                  {editor.busy ? 'Saving…' : 'Save shape'}
                </button>
              )}
              <button type="button" className="btn-quiet min-h-11 px-3" onClick={editor.cancel} aria-keyshortcuts="Escape" data-testid="draft-cancel">
                Cancel
              </button>
            </div>
          )}
          {tool.kind === 'hold' && <p className="text-sm text-bark-700">Fill in the details in the panel to save it.</p>}
        </>
      )}
    </div>
  );
}

/** Undo or redo of the last saved change, titled with what it sends back or again. */
function SavedStepButton({ direction, label, busy, onClick }: { direction: 'undo' | 'redo'; label: string | null; busy: boolean; onClick: () => void }) {
  const word = direction === 'undo' ? 'Undo' : 'Redo';
  const says = label ? `${word}: ${label}` : direction === 'undo' ? 'Nothing saved to undo' : 'Nothing to redo';
  return (
    <button
      type="button"
      className="btn-quiet min-h-11 px-3"
      disabled={!label || busy}
      onClick={onClick}
      title={says}
      aria-label={says}
      aria-keyshortcuts={direction === 'undo' ? 'Control+Z' : 'Control+Shift+Z Control+Y'}
      data-testid={`saved-${direction}`}
    >
      {word}
    </button>
  );
}
