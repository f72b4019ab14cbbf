import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useId, useState, type ChangeEvent } from 'react';
import { exportUrl, importPlan } from '../../lib/client/api';
import { refreshPlanQueries } from '../../lib/client/plan-queries';

type Props = { propertyId: number; canEdit: boolean };

const DOWNLOADS = [
  { kind: 'geojson', label: 'Plan as GeoJSON', note: 'fence lines, paddocks, crossings, strainers, posts and ties, for GIS' },
  { kind: 'kml', label: 'Plan as KML', note: 'the same, for desktop globes' },
  { kind: 'gpx', label: 'Waypoints as GPX', note: 'strainers, stayed posts and breakaway ties, for a handheld GPS' },
] as const;

/** Downloads of the plan in open formats, and (for editors) bringing a Gullyline plan file back in. */
export function ExportPanel({ propertyId, canEdit }: Props) {
  const queryClient = useQueryClient();
  const inputId = useId();
  const [message, setMessage] = useState<string | null>(null);
  const load = useMutation({
    mutationFn: (file: File) => importPlan(propertyId, file),
    onSuccess: async ({ imported }, file) => {
      await refreshPlanQueries(queryClient, propertyId);
      setMessage(
        `${file.name}: ${imported.fenceLines} ${imported.fenceLines === 1 ? 'fence line' : 'fence lines'} and ${imported.paddocks} ${imported.paddocks === 1 ? 'paddock' : 'paddocks'} added; their crossings were found and designed.`,
      );
    },
    onError: () => setMessage(null),
  });
  const choose = (event: ChangeEvent<HTMLInputElement>) => {
    const file = event.target.files?.[0];
    event.target.value = '';
    if (file) load.mutate(file);
  };

  return (
    <section className="card flex flex-col gap-3 p-4" aria-labelledby="export-heading" data-testid="export-panel">
      <h2 id="export-heading" className="font-bold">
        Plan files
      </h2>
      <ul className="flex flex-col gap-2 text-sm">
        {DOWNLOADS.map((download) => (
          <li key={download.kind}>
            <a className="font-semibold" href={exportUrl(propertyId, download.kind)} download data-testid={`export-${download.kind}`}>
              {download.label}
            </a>
            <span className="text-bark-700"> — {download.note}</span>
          </li>
        ))}
        <li>
          <a className="font-semibold" href={`/api/properties/${propertyId}/materials.csv`} download data-testid="export-materials">
            Materials list as CSV
          </a>
          <span className="text-bark-700"> — every fence line's wire, posts, strainers and droppers, priced</span>
        </li>
      </ul>
      {canEdit && (
        <div className="flex flex-col gap-2 border-t border-sand-200 pt-3">
          <p className="text-sm text-bark-700">A plan exported from Gullyline (GeoJSON or KML) can be brought into this property: its fence lines and paddocks are added.</p>
          <label htmlFor={inputId} className="btn-quiet cursor-pointer self-start">
            {load.isPending ? 'Reading the plan…' : 'Bring in a plan file…'}
          </label>
          <input id={inputId} type="file" accept=".geojson,.json,.kml" className="sr-only" onChange={choose} disabled={load.isPending} data-testid="plan-import-file" />
        </div>
      )}
      {message && (
        <p className="text-sm text-saltbush-700" role="status">
          {message}
        </p>
      )}
      {load.error && (
        <p className="alert-error text-sm" role="alert">
          {load.error.message}
        </p>
      )}
    </section>
  );
}
