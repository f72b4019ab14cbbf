import { useEffect, useRef } from 'react';
import type { PlanEditor } from './use-plan-editor';
import type { SavedHistoryControls } from './use-saved-history';

type Shortcut = { keys: string[]; does: string; editorsOnly?: boolean };

/** Every keyboard shortcut of the workspace, as the help panel lists them. */
export const SHORTCUTS: Shortcut[] = [
  { keys: ['F'], does: 'Draw a fence line', editorsOnly: true },
  { keys: ['P'], does: 'Draw a paddock', editorsOnly: true },
  { keys: ['Enter'], does: 'Finish the line or paddock being drawn', editorsOnly: true },
  { keys: ['Ctrl', 'Z'], does: 'Undo the last point or move; with nothing being drawn, undo the last saved change', editorsOnly: true },
  { keys: ['Ctrl', 'Shift', 'Z'], does: 'Redo', editorsOnly: true },
  { keys: ['Ctrl', 'Y'], does: 'Redo a saved change (with nothing being drawn)', editorsOnly: true },
  { keys: ['Esc'], does: 'Stop drawing or reshaping, or close this list' },
  { keys: ['?'], does: 'Show or hide this list' },
  { keys: ['+', '−'], does: 'Zoom the map in or out (with the map focused)' },
  { keys: ['Arrows'], does: 'Pan the map (with the map focused)' },
];

const isTyping = (target: EventTarget | null) =>
  target instanceof HTMLElement && (target.isContentEditable || ['INPUT', 'SELECT', 'TEXTAREA'].includes(target.tagName));

/** Keys inside the map's canvas go to the drawing layer itself (Terra Draw), not here. */
const isMapCanvas = (target: EventTarget | null) => target instanceof HTMLCanvasElement && target.classList.contains('maplibregl-canvas');

/** The workspace's keyboard shortcuts (listed in SHORTCUTS); none fire while typing in a field. */
export function useWorkspaceShortcuts({ editor, saved, canEdit, onHelp }: { editor: PlanEditor; saved: SavedHistoryControls; canEdit: boolean; onHelp: () => void }) {
  const latest = useRef({ editor, saved, canEdit, onHelp });
  latest.current = { editor, saved, canEdit, onHelp };

  useEffect(() => {
    const onKeyDown = (event: KeyboardEvent) => {
      if (isTyping(event.target) || event.altKey) return;
      const { editor: e, saved: history, canEdit: editable, onHelp: help } = latest.current;
      const drawingOrReshaping = e.tool.kind === 'draw' || e.tool.kind === 'reshape';
      const command = event.ctrlKey || event.metaKey;
      if (command && drawingOrReshaping && !isMapCanvas(event.target) && event.key.toLowerCase() === 'z') {
        event.preventDefault();
        if (event.shiftKey) e.controlsRef.current?.redo();
        else e.controlsRef.current?.undo();
        return;
      }
      // With nothing being drawn, the same keys undo and redo saved changes.
      const key = event.key.toLowerCase();
      if (command && editable && !e.task && (key === 'z' || key === 'y')) {
        event.preventDefault();
        if (key === 'y' || event.shiftKey) history.redo();
        else history.undo();
        return;
      }
      if (command) return;
      if (event.key === '?') {
        help();
      } else if (event.key === 'Escape' && e.task && !(e.tool.kind === 'hold')) {
        e.cancel();
      } else if (event.key === 'Enter' && e.tool.kind === 'draw' && !isMapCanvas(event.target)) {
        event.preventDefault();
        e.controlsRef.current?.finish();
      } else if (editable && !e.task && (event.key === 'f' || event.key === 'F')) {
        e.startDrawing('fence');
      } else if (editable && !e.task && (event.key === 'p' || event.key === 'P')) {
        e.startDrawing('paddock');
      }
    };
    window.addEventListener('keydown', onKeyDown);
    return () => window.removeEventListener('keydown', onKeyDown);
  }, []);
}

/** The list of shortcuts, opened with "?" or the help button. */
export function ShortcutsHelp({ canEdit, onClose }: { canEdit: boolean; onClose: () => void }) {
  return (
    <section className="card flex flex-col gap-2 p-4" aria-labelledby="shortcuts-heading" data-testid="shortcuts-help">
      <div className="flex items-center justify-between gap-2">
        <h2 id="shortcuts-heading" className="font-bold">
          Keyboard shortcuts
        </h2>
        <button type="button" className="btn-quiet min-h-11 px-3" onClick={onClose}>
          Close
        </button>
      </div>
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
        {SHORTCUTS.filter((shortcut) => canEdit || !shortcut.editorsOnly).map((shortcut) => (
          <div key={shortcut.does} className="contents">
            <dt className="whitespace-nowrap">
              {shortcut.keys.map((key, i) => (
                <span key={key}>
                  {i > 0 && ' + '}
                  <kbd className="rounded border border-sand-300 bg-sand-50 px-1.5 py-0.5 font-mono text-xs">{key}</kbd>
                </span>
              ))}
            </dt>
            <dd>{shortcut.does}</dd>
          </div>
        ))}
      </dl>
      <p className="text-xs text-bark-700">On a Mac, Cmd works wherever Ctrl is listed.</p>
    </section>
  );
}
