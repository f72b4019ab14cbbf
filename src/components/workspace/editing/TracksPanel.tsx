import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useId, useRef, useState, type ChangeEvent } from 'react';
import { api } from '../../../lib/client/api';
import type { FenceLine } from '../../../lib/schemas/plan';
import type { Track } from '../../../lib/schemas/tracks';
import { formatLength } from './format-measure';

type Props = {
  propertyId: number;
  tracks: Track[];
  loading: boolean;
  canEdit: boolean;
  /** A fence line made from a track (recorded in the saved history by the workspace). */
  onFenceMade: (fenceLine: FenceLine) => void;
};

/** GPS tracks: upload GPX or KML, see what came in, turn a track into a fence line in one step. */
export function TracksPanel({ propertyId, tracks, loading, canEdit, onFenceMade }: Props) {
  const queryClient = useQueryClient();
  const inputId = useId();
  const fileRef = useRef<HTMLInputElement>(null);
  const [message, setMessage] = useState<string | null>(null);
  const refresh = (keys: string[]) => Promise.all(keys.map((key) => queryClient.invalidateQueries({ queryKey: [key, propertyId] })));

  const upload = useMutation({
    mutationFn: (file: File) => api.importTrackFile(propertyId, file),
    onSuccess: async ({ imported }, file) => {
      await refresh(['tracks', 'paddocks']);
      const parts = [`${imported.tracks} ${imported.tracks === 1 ? 'track' : 'tracks'}`];
      if (imported.paddocks) parts.push(`${imported.paddocks} ${imported.paddocks === 1 ? 'paddock' : 'paddocks'}`);
      setMessage(`${file.name}: ${parts.join(' and ')} added.${imported.skipped.length ? ` Skipped: ${imported.skipped.join('; ')}.` : ''}`);
    },
    onError: () => setMessage(null),
  });
  const makeFence = useMutation({
    mutationFn: (track: Track) => api.trackToFenceLine(propertyId, track.id),
    onSuccess: async ({ fenceLine }) => {
      await refresh(['fence-lines', 'crossings', 'costs']);
      setMessage(`${fenceLine.name} is now a planned fence line.`);
      onFenceMade(fenceLine);
    },
  });
  const remove = useMutation({
    mutationFn: (track: Track) => api.deleteTrack(propertyId, track.id),
    onSuccess: () => refresh(['tracks']),
  });

  const choose = (event: ChangeEvent<HTMLInputElement>) => {
    const file = event.target.files?.[0];
    event.target.value = '';
    if (file) upload.mutate(file);
  };
  const failure = upload.error ?? makeFence.error ?? remove.error;

  return (
    <section className="card flex flex-col gap-2 p-4" aria-labelledby="tracks-heading" data-testid="tracks-panel">
      <h2 id="tracks-heading" className="font-bold">
        GPS tracks
      </h2>
      {canEdit && (
        <div>
          <label htmlFor={inputId} className="btn-quiet cursor-pointer">
            {upload.isPending ? 'Reading the file…' : 'Add GPX or KML…'}
          </label>
          <input
            ref={fileRef}
            id={inputId}
            type="file"
            accept=".gpx,.kml,application/gpx+xml,application/vnd.google-earth.kml+xml"
            className="sr-only"
            onChange={choose}
            disabled={upload.isPending}
            data-testid="track-file"
          />
        </div>
      )}
      {message && (
        <p className="text-sm text-saltbush-700" role="status">
          {message}
        </p>
      )}
      {failure && (
        <p className="alert-error text-sm" role="alert" data-testid="tracks-error">
          {failure.message}
        </p>
      )}
      {loading ? (
        <p className="text-sm text-bark-700">Loading…</p>
      ) : tracks.length === 0 ? (
        <p className="text-sm text-bark-700">No tracks yet. Tracks walked or driven with a GPS show where a fence can go.</p>
      ) : (
        <ul className="flex flex-col divide-y divide-sand-200 text-sm">
          {tracks.map((track) => (
            <li key={track.id} className="flex flex-wrap items-center justify-between gap-2 py-1.5">
              <span className="min-w-0">
                <span className="block truncate font-semibold">{track.name}</span>
                <span className="text-bark-700">
                  {formatLength(track.lengthM)} · from {track.sourceFile}
                </span>
              </span>
              {canEdit && (
                <span className="flex gap-2">
                  <button type="button" className="btn-quiet min-h-11 px-3" disabled={makeFence.isPending} onClick={() => makeFence.mutate(track)}>
                    Make fence line
                  </button>
                  <button type="button" className="btn-quiet min-h-11 px-3" aria-label={`Remove track ${track.name}`} disabled={remove.isPending} onClick={() => remove.mutate(track)}>
                    Remove
                  </button>
                </span>
              )}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
