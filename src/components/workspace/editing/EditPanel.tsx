import { useId, useState, type SyntheticEvent } from 'react';
import { wireSpecSchema } from '../../../lib/schemas/plan';
import { FenceLineForm } from './FenceLineForm';
import { formatArea, formatLength, formatMeasures } from './format-measure';
import type { PlanEditor } from './use-plan-editor';

type Props = { editor: PlanEditor; fenceCount: number; paddockCount: number };

/** The side panel for the edit under way: details of a new shape, or the save of a reshape. */
export function EditPanel({ editor, fenceCount, paddockCount }: Props) {
  const { task, error, conflict } = editor;
  if (!task) return null;
  const measure = formatMeasures(editor.measures);

  const problem = (
    <>
      {error && (
        <p className="alert-error text-sm" role="alert" data-testid="edit-error">
          {error.message}
          {Object.entries(error.fields)
            .filter(([key]) => key === 'coordinates' || key === 'rings' || key === '_')
            .map(([, text]) => ` ${text}`)}
        </p>
      )}
      {conflict && (
        <div className="alert-error flex flex-col gap-2 text-sm" role="alert" data-testid="edit-conflict">
          <p>{conflict.message}</p>
          <p>Your shape is still on the map. Save it over their change, or drop it and see theirs.</p>
          <div className="flex flex-wrap gap-2">
            {conflict.latestVersion !== null && (
              <button type="button" className="btn-primary" onClick={() => editor.saveShape(conflict.latestVersion!)}>
                Save mine over theirs
              </button>
            )}
            <button type="button" className="btn-quiet" onClick={() => void editor.discardAndReload()}>
              Drop mine, show theirs
            </button>
          </div>
        </div>
      )}
    </>
  );

  return (
    <section className="card flex flex-col gap-3 p-4" aria-labelledby="edit-heading" data-testid="edit-panel">
      {task.kind === 'new-fence' && (
        <>
          <h2 id="edit-heading" className="font-bold">
            New fence line{measure && ` · ${measure}`}
          </h2>
          {task.stage === 'drawing' ? (
            <p className="text-sm text-bark-700">Draw it on the map; its details come next.</p>
          ) : (
            <>
              {problem}
              <FenceLineForm
                initial={{ name: `Fence line ${fenceCount + 1}`, status: 'planned', wireSpec: wireSpecSchema.parse({}) }}
                submitLabel="Save fence line"
                busy={editor.busy}
                fieldErrors={error?.fields}
                onSubmit={editor.saveNewFence}
                onCancel={editor.cancel}
              />
            </>
          )}
        </>
      )}
      {task.kind === 'new-paddock' && (
        <>
          <h2 id="edit-heading" className="font-bold">
            New paddock{measure && ` · ${measure}`}
          </h2>
          {task.stage === 'drawing' ? (
            <p className="text-sm text-bark-700">Draw its boundary on the map; its name comes next.</p>
          ) : (
            <>
              {problem}
              <PaddockNameForm initialName={`Paddock ${paddockCount + 1}`} busy={editor.busy} onSubmit={editor.saveNewPaddock} onCancel={editor.cancel} />
            </>
          )}
        </>
      )}
      {task.kind === 'reshape-fence' && (
        <>
          <h2 id="edit-heading" className="font-bold">
            Reshaping {task.fence.name}
          </h2>
          <p className="text-sm text-bark-700">
            Was {formatLength(task.fence.lengthM)}
            {measure && `, now ${measure}`}. Save to find and design its crossings again.
          </p>
          {problem}
        </>
      )}
      {task.kind === 'reshape-paddock' && (
        <>
          <h2 id="edit-heading" className="font-bold">
            Reshaping {task.paddock.name}
          </h2>
          <p className="text-sm text-bark-700">
            Was {formatArea(task.paddock.areaHa)}
            {measure && `, now ${measure}`}.
          </p>
          {problem}
        </>
      )}
    </section>
  );
}

function PaddockNameForm({ initialName, busy, onSubmit, onCancel }: { initialName: string; busy: boolean; onSubmit: (name: string) => void; onCancel: () => void }) {
  const id = useId();
  const [name, setName] = useState(initialName);
  const [missing, setMissing] = useState(false);
  const submit = (event: SyntheticEvent<HTMLFormElement>) => {
    event.preventDefault();
    setMissing(!name.trim());
    if (name.trim()) onSubmit(name.trim());
  };
  return (
    <form className="flex flex-col gap-3" onSubmit={submit} noValidate data-testid="paddock-form">
      <div className="field">
        <label htmlFor={`${id}-name`}>Name</label>
        <input id={`${id}-name`} value={name} maxLength={120} onChange={(e) => setName(e.target.value)} aria-invalid={missing} />
        {missing && <p className="field-error">Give the paddock a name.</p>}
      </div>
      <div className="flex flex-wrap gap-2">
        <button type="submit" className="btn-primary" disabled={busy}>
          {busy ? 'Saving…' : 'Save paddock'}
        </button>
        <button type="button" className="btn-quiet" onClick={onCancel} disabled={busy}>
          Cancel
        </button>
      </div>
    </form>
  );
}
