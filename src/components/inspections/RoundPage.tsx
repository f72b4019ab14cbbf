import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState, type ChangeEvent } from 'react';
import { CHECK_STATUS_LABELS, FAILURE_STATUSES, type CheckStatus } from '../../lib/crossings/inspection-statuses';
import { ApiError, api, uploadPhoto } from '../../lib/client/api';
import { crossingStyleName } from '../../lib/schemas/crossing';
import type { CheckView, RoundView } from '../../lib/schemas/inspection';
import { withQueryClient } from '../QueryRoot';

type Props = { propertyId: number; initialRound: RoundView; canRecord: boolean; canManage: boolean; userId: number };

/** One inspection round, made for a phone in the paddock: the crossings in order, what to look at, large status buttons, a note and photos. */
function RoundPage({ propertyId, initialRound, canRecord, canManage, userId }: Props) {
  const queryClient = useQueryClient();
  const key = ['round', propertyId, initialRound.id];
  const round = useQuery({ queryKey: key, queryFn: () => api.getRound(propertyId, initialRound.id).then((answer) => answer.round), initialData: initialRound }).data;
  const editable = canRecord && round.status === 'open';
  const [notice, setNotice] = useState<string | null>(null);

  const toggle = useMutation({
    mutationFn: () => api.updateRound(propertyId, round.id, { status: round.status === 'open' ? 'closed' : 'open', version: round.version }),
    onSuccess: ({ round: next }) => queryClient.setQueryData(key, next),
    onError: (error) => {
      setNotice(error.message);
      void queryClient.invalidateQueries({ queryKey: key });
    },
  });

  return (
    <section aria-labelledby="round-heading" className="flex flex-col gap-4" data-testid="inspection-round">
      <header className="card p-4">
        <h2 id="round-heading" className="text-xl font-bold">
          After {round.rainEvent.rainfallMm} mm on {round.rainEvent.fellOn}
        </h2>
        <p className="mt-1 text-bark-700">
          {round.rainEvent.scope === 'property' ? 'Whole property' : `Paddocks: ${round.rainEvent.paddockNames.join(', ')}`} · {round.progress.checked} of {round.progress.total} checked
          {round.status === 'closed' ? ' · closed' : ''}
        </p>
        {round.rainEvent.note && <p className="mt-1 text-sm">{round.rainEvent.note}</p>}
        <progress className="mt-2 h-3 w-full" max={Math.max(1, round.progress.total)} value={round.progress.checked} aria-label="Crossings checked" />
        {canManage && (
          <button type="button" className="btn-quiet mt-3" onClick={() => toggle.mutate()} disabled={toggle.isPending}>
            {round.status === 'open' ? 'Close the round' : 'Reopen the round'}
          </button>
        )}
        {notice && <p className="alert-error mt-2" role="alert">{notice}</p>}
        <p className="mt-2 text-sm">
          <a href={`/app/properties/${propertyId}/inspections`}>All rain events</a>
        </p>
      </header>
      {round.checks.length === 0 && <p className="card p-4">No crossing lies in this rain's path: nothing to check.</p>}
      <ol className="flex flex-col gap-4">
        {round.checks.map((check) => (
          <li key={check.id}>
            <CheckCard
              propertyId={propertyId}
              roundId={round.id}
              check={check}
              editable={editable}
              canRemovePhoto={(photo) => editable && (canManage || photo.uploadedById === userId)}
              onChanged={() => queryClient.invalidateQueries({ queryKey: key })}
            />
          </li>
        ))}
      </ol>
    </section>
  );
}

type CheckCardProps = {
  propertyId: number;
  roundId: number;
  check: CheckView;
  editable: boolean;
  canRemovePhoto: (photo: CheckView['photos'][number]) => boolean;
  onChanged: () => Promise<void>;
};

function CheckCard({ propertyId, roundId, check, editable, canRemovePhoto, onChanged }: CheckCardProps) {
  const [note, setNote] = useState(check.note);
  const [keepLocation, setKeepLocation] = useState(false);
  const [message, setMessage] = useState<{ kind: 'error' | 'saved'; text: string } | null>(null);
  const headingId = `check-${check.id}`;

  const save = useMutation({
    mutationFn: (status: CheckStatus) => api.updateCheck(propertyId, roundId, check.id, { status, note, version: check.version }),
    onSuccess: async ({ check: saved }) => {
      setMessage({ kind: 'saved', text: `Saved: ${CHECK_STATUS_LABELS[saved.status]}.` });
      await onChanged();
    },
    onError: async (error) => {
      setMessage({ kind: 'error', text: error.message });
      // A stale edit: show what the other person recorded.
      if (error instanceof ApiError && error.status === 409) await onChanged();
    },
  });
  const upload = useMutation({
    mutationFn: (file: File) => uploadPhoto(propertyId, check.id, file, keepLocation),
    onSuccess: async () => {
      setMessage({ kind: 'saved', text: 'Photo added.' });
      await onChanged();
    },
    onError: (error) => setMessage({ kind: 'error', text: error.message }),
  });
  const removePhoto = useMutation({
    mutationFn: (photoId: number) => api.removePhoto(propertyId, photoId),
    onSuccess: async () => {
      setMessage({ kind: 'saved', text: 'Photo removed.' });
      await onChanged();
    },
    onError: (error) => setMessage({ kind: 'error', text: error.message }),
  });
  const choose = (event: ChangeEvent<HTMLInputElement>) => {
    const file = event.target.files?.[0];
    event.target.value = '';
    if (file) upload.mutate(file);
  };

  const failed = FAILURE_STATUSES.includes(check.status);
  return (
    <article className="card p-4" aria-labelledby={headingId} data-testid="inspection-check">
      <h3 id={headingId} className="text-lg font-bold">
        {check.position}. {check.crossingLabel}
      </h3>
      <p className="text-sm text-bark-700">
        {check.style ? crossingStyleName(check.style) : 'No design yet'}
        {check.catchmentHa !== null ? ` · catchment ${check.catchmentHa.toFixed(check.catchmentHa < 10 ? 1 : 0)} ha` : ''}
        {check.lonLat ? ` · ${check.lonLat[1].toFixed(5)}, ${check.lonLat[0].toFixed(5)}` : ''}
      </p>
      <p className={`mt-1 font-semibold ${failed ? 'text-[#7a1f6a]' : 'text-bark-900'}`} data-testid="check-status">
        {CHECK_STATUS_LABELS[check.status]}
        {check.checkedByName ? ` · ${check.checkedByName}` : ''}
      </p>
      <ul className="mt-2 list-disc space-y-1 pl-5 text-sm" aria-label="What to look at">
        {check.guide.map((line) => (
          <li key={line}>{line}</li>
        ))}
      </ul>
      {editable && (
        <>
          <div className="mt-3 grid grid-cols-2 gap-2" role="group" aria-label={`Status of ${check.crossingLabel}`}>
            {check.statuses.map((status) => (
              <button
                key={status}
                type="button"
                aria-pressed={check.status === status}
                className={`btn min-h-14 border-2 text-base ${check.status === status ? 'border-bark-900 bg-bark-900 text-white' : 'border-sand-300 bg-white text-bark-900'}`}
                disabled={save.isPending}
                onClick={() => save.mutate(status)}
              >
                {CHECK_STATUS_LABELS[status]}
              </button>
            ))}
          </div>
          <div className="field mt-3">
            <label htmlFor={`note-${check.id}`}>Note</label>
            <textarea id={`note-${check.id}`} className="min-h-20 rounded-lg border border-sand-300 p-2 text-base" value={note} maxLength={2000} onChange={(e) => setNote(e.target.value)} />
          </div>
          <button type="button" className="btn-quiet mt-2 w-full" disabled={save.isPending} onClick={() => save.mutate(check.status)}>
            Save the note
          </button>
          <div className="mt-3 flex flex-col gap-2">
            <label className="btn-primary w-full cursor-pointer">
              {upload.isPending ? 'Sending the photo…' : 'Take or add a photo'}
              <input type="file" accept="image/*" capture="environment" className="sr-only" onChange={choose} disabled={upload.isPending} data-testid="photo-input" />
            </label>
            <label className="flex min-h-11 items-center gap-2 text-sm">
              <input type="checkbox" checked={keepLocation} onChange={(e) => setKeepLocation(e.target.checked)} /> Keep the photo's location (GPS) for others to see
            </label>
          </div>
        </>
      )}
      {!editable && check.note && <p className="mt-2 text-sm">{check.note}</p>}
      {check.photos.length > 0 && (
        <ul className="mt-3 flex flex-wrap gap-3" data-testid="check-photos">
          {check.photos.map((photo, i) => (
            <li key={photo.id} className="flex flex-col items-center gap-1">
              <a href={photo.url} target="_blank" rel="noreferrer">
                <img src={photo.thumbnailUrl} alt={`Photo ${i + 1} of ${check.crossingLabel}`} className="h-20 w-20 rounded object-cover" width={80} height={80} />
              </a>
              {canRemovePhoto(photo) && (
                <button
                  type="button"
                  className="btn-quiet min-h-11 px-3 text-sm"
                  disabled={removePhoto.isPending}
                  onClick={() => {
                    if (confirm('Remove this photo? Nobody will see it again.')) removePhoto.mutate(photo.id);
                  }}
                >
                  Remove
                </button>
              )}
            </li>
          ))}
        </ul>
      )}
      {message && (
        <p role={message.kind === 'error' ? 'alert' : 'status'} className={`mt-2 text-sm ${message.kind === 'error' ? 'alert-error' : 'text-saltbush-700'}`}>
          {message.text}
        </p>
      )}
    </article>
  );
}

export default withQueryClient(RoundPage);
