import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { ApiError, api } from '../../lib/client/api';
import { withQueryClient } from '../QueryRoot';

type Props = { propertyId: number; paddocks: { id: number; name: string }[]; canRecord: boolean };

const today = () => new Date().toISOString().slice(0, 10);

/** Rain events and their inspection rounds, newest first, and (owners and managers) the form to record one. */
function InspectionsPage({ propertyId, paddocks, canRecord }: Props) {
  const queryClient = useQueryClient();
  const events = useQuery({ queryKey: ['rain-events', propertyId], queryFn: () => api.listRainEvents(propertyId).then((answer) => answer.rainEvents) });
  const [fellOn, setFellOn] = useState(today);
  const [rainfallMm, setRainfallMm] = useState('');
  const [scope, setScope] = useState<'property' | 'paddocks'>('property');
  const [paddockIds, setPaddockIds] = useState<number[]>([]);
  const [note, setNote] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<{ kind: 'error' | 'saved'; text: string; roundId?: number } | null>(null);

  const record = useMutation({
    mutationFn: () => api.recordRainEvent(propertyId, { fellOn, rainfallMm: rainfallMm.trim() === '' ? Number.NaN : Number(rainfallMm), scope, paddockIds, note }),
    onSuccess: ({ round }) => {
      setErrors({});
      setMessage({ kind: 'saved', text: `Rain event recorded: ${round.checks.length} crossing${round.checks.length === 1 ? '' : 's'} to check. The crew has been e-mailed the round.`, roundId: round.id });
      setRainfallMm('');
      setNote('');
      void queryClient.invalidateQueries({ queryKey: ['rain-events', propertyId] });
    },
    onError: (error) => {
      setErrors(error instanceof ApiError ? error.fields : {});
      setMessage({ kind: 'error', text: error.message });
    },
  });

  const submit = (event: { preventDefault(): void }) => {
    event.preventDefault();
    if (rainfallMm.trim() === '' || !Number.isFinite(Number(rainfallMm))) {
      setErrors({ rainfallMm: 'Give the rainfall as a number of millimetres.' });
      return;
    }
    record.mutate();
  };

  const togglePaddock = (id: number) => setPaddockIds((current) => (current.includes(id) ? current.filter((other) => other !== id) : [...current, id]));

  return (
    <>
      <section className="card" aria-labelledby="rain-heading">
        <h2 id="rain-heading" className="text-xl font-bold">Rain events and inspection rounds</h2>
        <p className="mt-1 text-sm text-bark-700">
          After heavy rain, every crossing whose catchment had the rain is checked. Recording a rain event opens a round listing them, largest catchment first, and e-mails the crew a link.
        </p>
        {events.isPending ? (
          <p className="mt-4 text-sm">Loading…</p>
        ) : events.error ? (
          <p className="alert-error mt-4" role="alert">The rain events could not be loaded: {events.error.message}</p>
        ) : events.data.length === 0 ? (
          <p className="mt-4 text-sm text-bark-700">No rain event recorded yet.</p>
        ) : (
          <ul className="mt-4 flex flex-col gap-2" data-testid="rain-events">
            {events.data.map((event) => (
              <li key={event.id} className="rounded-lg border border-sand-300 p-3" data-testid="rain-event">
                <p className="flex flex-wrap items-baseline justify-between gap-x-3">
                  <a className="font-semibold" href={`/app/properties/${propertyId}/inspections/${event.round.id}`}>
                    {event.fellOn}: {event.rainfallMm} mm
                  </a>
                  <span className="text-sm text-bark-700">
                    {event.round.status === 'closed' ? 'Closed · ' : ''}
                    {event.round.progress.checked} of {event.round.progress.total} checked
                    {event.round.progress.failed > 0 ? ` · ${event.round.progress.failed} failed` : ''}
                  </span>
                </p>
                <p className="text-sm text-bark-700">
                  {event.scope === 'property' ? 'Whole property' : `Paddocks: ${event.paddockNames.join(', ')}`}
                  {event.recordedByName ? ` · recorded by ${event.recordedByName}` : ''}
                </p>
                {event.note && <p className="mt-1 text-sm">{event.note}</p>}
                <progress className="mt-2 h-2 w-full" max={Math.max(1, event.round.progress.total)} value={event.round.progress.checked} aria-label="Crossings checked" />
              </li>
            ))}
          </ul>
        )}
      </section>

      {canRecord && (
        <form className="card flex flex-col gap-4" onSubmit={submit} aria-labelledby="record-heading" noValidate>
          <h2 id="record-heading" className="text-lg font-bold">Record a rain event</h2>
          <div className="grid gap-4 sm:grid-cols-2">
            <div className="field">
              <label htmlFor="rain-date">Day the rain fell</label>
              <input id="rain-date" type="date" value={fellOn} onChange={(e) => setFellOn(e.target.value)} aria-invalid={Boolean(errors.fellOn)} />
              {errors.fellOn && <p className="field-error">{errors.fellOn}</p>}
            </div>
            <div className="field">
              <label htmlFor="rain-mm">Rainfall (mm)</label>
              <input id="rain-mm" type="number" inputMode="decimal" min={0} step="any" value={rainfallMm} onChange={(e) => setRainfallMm(e.target.value)} aria-invalid={Boolean(errors.rainfallMm)} />
              {errors.rainfallMm && <p className="field-error">{errors.rainfallMm}</p>}
            </div>
          </div>
          <fieldset className="flex flex-col gap-2">
            <legend className="text-sm font-semibold text-bark-700">Where it fell</legend>
            <label className="flex min-h-11 items-center gap-2">
              <input type="radio" name="scope" checked={scope === 'property'} onChange={() => setScope('property')} /> The whole property
            </label>
            <label className="flex min-h-11 items-center gap-2">
              <input type="radio" name="scope" checked={scope === 'paddocks'} onChange={() => setScope('paddocks')} disabled={paddocks.length === 0} /> Some paddocks
              {paddocks.length === 0 && <span className="text-sm text-bark-500">(no paddocks drawn yet)</span>}
            </label>
            {scope === 'paddocks' && (
              <div className="ml-6 flex flex-wrap gap-x-4">
                {paddocks.map((paddock) => (
                  <label key={paddock.id} className="flex min-h-11 items-center gap-2">
                    <input type="checkbox" checked={paddockIds.includes(paddock.id)} onChange={() => togglePaddock(paddock.id)} /> {paddock.name}
                  </label>
                ))}
              </div>
            )}
            {errors.paddockIds && <p className="field-error">{errors.paddockIds}</p>}
            <p className="text-sm text-bark-500">
              With paddocks chosen, a crossing is checked when its catchment (traced from the terrain) reaches into one of them; where no catchment can be traced, when the crossing lies in one.
            </p>
          </fieldset>
          <div className="field">
            <label htmlFor="rain-note">Note (optional)</label>
            <input id="rain-note" value={note} onChange={(e) => setNote(e.target.value)} maxLength={2000} />
          </div>
          <div className="flex flex-wrap items-center gap-3">
            <button type="submit" className="btn-primary" disabled={record.isPending}>
              {record.isPending ? 'Recording…' : 'Record rain and open a round'}
            </button>
            {message && (
              <p role={message.kind === 'error' ? 'alert' : 'status'} className={message.kind === 'error' ? 'alert-error' : 'text-saltbush-700'}>
                {message.text}{' '}
                {message.roundId && <a href={`/app/properties/${propertyId}/inspections/${message.roundId}`}>Open the round</a>}
              </p>
            )}
          </div>
        </form>
      )}
    </>
  );
}

export default withQueryClient(InspectionsPage);
