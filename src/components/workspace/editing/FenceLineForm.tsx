import { useId, useState, type SyntheticEvent } from 'react';
import { WIRE_TYPES } from '../../../lib/crossings/wire/wire-types';
import { FENCE_STATUSES, wireSpecSchema, type FenceStatus, type WireSpec } from '../../../lib/schemas/plan';
import { FENCE_STATUS_STYLES } from '../../map/plan-layers';

export type FenceLineDetails = { name: string; status: FenceStatus; wireSpec: WireSpec };

type Props = {
  initial: FenceLineDetails;
  submitLabel: string;
  busy: boolean;
  /** The server's problems per field (`name`, `wireSpec.postSpacingM`, …) and its message. */
  fieldErrors?: Record<string, string>;
  onSubmit: (details: FenceLineDetails) => void;
  onCancel: () => void;
};

type WireRow = { heightM: string; kind: 'plain' | 'barbed' };

const plainTypes = WIRE_TYPES.filter((wire) => !wire.barbed);
const barbedTypes = WIRE_TYPES.filter((wire) => wire.barbed);

/** Name, status and wires of a fence line; checked here with the server's own schema before sending. */
export function FenceLineForm({ initial, submitLabel, busy, fieldErrors = {}, onSubmit, onCancel }: Props) {
  const id = useId();
  const [name, setName] = useState(initial.name);
  const [status, setStatus] = useState<FenceStatus>(initial.status);
  const [wires, setWires] = useState<WireRow[]>(() =>
    initial.wireSpec.wireHeightsM.map((height, i) => ({ heightM: String(height), kind: initial.wireSpec.wireKinds[i] ?? 'plain' })),
  );
  const [plainWireTypeId, setPlain] = useState(initial.wireSpec.plainWireTypeId);
  const [barbedWireTypeId, setBarbed] = useState(initial.wireSpec.barbedWireTypeId);
  const [postSpacing, setPostSpacing] = useState(String(initial.wireSpec.postSpacingM));
  const [dropperSpacing, setDropperSpacing] = useState(String(initial.wireSpec.dropperSpacingM));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const shown = { ...fieldErrors, ...errors };

  const submit = (event: SyntheticEvent<HTMLFormElement>) => {
    event.preventDefault();
    const found: Record<string, string> = {};
    if (!name.trim()) found.name = 'Give the fence line a name.';
    // Lowest wire first, as the design engine and the crew read them.
    const ordered = [...wires].sort((a, b) => Number(a.heightM) - Number(b.heightM));
    const parsed = wireSpecSchema.safeParse({
      wireHeightsM: ordered.map((wire) => Number(wire.heightM)),
      wireKinds: ordered.map((wire) => wire.kind),
      plainWireTypeId,
      barbedWireTypeId,
      postSpacingM: Number(postSpacing),
      dropperSpacingM: Number(dropperSpacing),
    });
    if (!parsed.success) {
      for (const issue of parsed.error.issues) {
        const key = issue.path[0] === 'wireHeightsM' || issue.path[0] === 'wireKinds' ? 'wires' : String(issue.path[0]);
        found[key] ??= key === 'wires' ? `Wire heights lie between 0.02 and 2.5 m (${issue.message})` : issue.message;
      }
    }
    setErrors(found);
    if (Object.keys(found).length || !parsed.success) return;
    onSubmit({ name: name.trim(), status, wireSpec: parsed.data });
  };

  const error = (key: string) =>
    shown[key] ? (
      <p id={`${id}-${key}-error`} className="field-error">
        {shown[key]}
      </p>
    ) : null;
  const describedBy = (key: string) => (shown[key] ? `${id}-${key}-error` : undefined);

  return (
    <form className="flex flex-col gap-3" onSubmit={submit} noValidate data-testid="fence-line-form">
      <div className="field">
        <label htmlFor={`${id}-name`}>Name</label>
        <input id={`${id}-name`} value={name} maxLength={120} onChange={(e) => setName(e.target.value)} aria-invalid={Boolean(shown.name)} aria-describedby={describedBy('name')} />
        {error('name')}
      </div>
      <div className="field">
        <label htmlFor={`${id}-status`}>Status</label>
        <select id={`${id}-status`} value={status} onChange={(e) => setStatus(e.target.value as FenceStatus)}>
          {FENCE_STATUSES.map((s) => (
            <option key={s} value={s}>
              {FENCE_STATUS_STYLES[s].label}
            </option>
          ))}
        </select>
      </div>
      <fieldset className="flex flex-col gap-2">
        <legend className="text-sm font-semibold text-bark-700">Wires, lowest first (height above ground, m)</legend>
        {wires.map((wire, index) => (
          <div key={index} className="flex items-center gap-2">
            <input
              aria-label={`Wire ${index + 1} height, m`}
              className="min-h-11 w-24 rounded-lg border border-sand-300 bg-white px-3 tabular-nums"
              inputMode="decimal"
              value={wire.heightM}
              aria-invalid={Boolean(shown.wires)}
              onChange={(e) => setWires((rows) => rows.map((row, i) => (i === index ? { ...row, heightM: e.target.value } : row)))}
            />
            <select
              aria-label={`Wire ${index + 1} kind`}
              className="min-h-11 rounded-lg border border-sand-300 bg-white px-2"
              value={wire.kind}
              onChange={(e) => setWires((rows) => rows.map((row, i) => (i === index ? { ...row, kind: e.target.value as WireRow['kind'] } : row)))}
            >
              <option value="plain">plain</option>
              <option value="barbed">barbed</option>
            </select>
            <button type="button" className="btn-quiet min-h-11 px-3" aria-label={`Remove wire ${index + 1}`} disabled={wires.length <= 1} onClick={() => setWires((rows) => rows.filter((_, i) => i !== index))}>
              Remove
            </button>
          </div>
        ))}
        <button
          type="button"
          className="btn-quiet self-start"
          disabled={wires.length >= 12}
          onClick={() => setWires((rows) => [...rows, { heightM: String(Math.min(2.5, Number(rows.at(-1)?.heightM ?? 0) + 0.2).toFixed(2)), kind: 'plain' }])}
        >
          Add a wire
        </button>
        {error('wires')}
      </fieldset>
      <div className="grid grid-cols-2 gap-2">
        <div className="field col-span-2">
          <label htmlFor={`${id}-plain`}>Plain wire</label>
          <select id={`${id}-plain`} value={plainWireTypeId} onChange={(e) => setPlain(e.target.value)}>
            {plainTypes.map((wire) => (
              <option key={wire.id} value={wire.id}>
                {wire.name}
              </option>
            ))}
          </select>
        </div>
        <div className="field col-span-2">
          <label htmlFor={`${id}-barbed`}>Barbed wire</label>
          <select id={`${id}-barbed`} value={barbedWireTypeId} onChange={(e) => setBarbed(e.target.value)}>
            {barbedTypes.map((wire) => (
              <option key={wire.id} value={wire.id}>
                {wire.name}
              </option>
            ))}
          </select>
        </div>
        <div className="field">
          <label htmlFor={`${id}-posts`}>Post spacing, m</label>
          <input id={`${id}-posts`} inputMode="decimal" value={postSpacing} onChange={(e) => setPostSpacing(e.target.value)} aria-invalid={Boolean(shown.postSpacingM)} aria-describedby={describedBy('postSpacingM')} />
          {error('postSpacingM')}
        </div>
        <div className="field">
          <label htmlFor={`${id}-droppers`}>Dropper spacing, m</label>
          <input id={`${id}-droppers`} inputMode="decimal" value={dropperSpacing} onChange={(e) => setDropperSpacing(e.target.value)} aria-invalid={Boolean(shown.dropperSpacingM)} aria-describedby={describedBy('dropperSpacingM')} />
          {error('dropperSpacingM')}
        </div>
      </div>
      <div className="flex flex-wrap gap-2">
        <button type="submit" className="btn-primary" disabled={busy}>
          {busy ? 'Saving…' : submitLabel}
        </button>
        <button type="button" className="btn-quiet" onClick={onCancel} disabled={busy}>
          Cancel
        </button>
      </div>
    </form>
  );
}
