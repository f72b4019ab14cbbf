import { useQuery } from '@tanstack/react-query';
import { CHECK_STATUS_LABELS, FAILURE_STATUSES } from '../../../lib/crossings/inspection-statuses';
import { styleInWords } from '../../../lib/crossings/inspection-history';
import { api } from '../../../lib/client/api';
import { Section } from './Section';

/** The crossing's inspection rounds, newest rain first, and the redesign suggestion when it keeps failing. */
export function InspectionHistory({ propertyId, crossingId }: { propertyId: number; crossingId: number }) {
  const query = useQuery({
    queryKey: ['crossing-inspections', propertyId, crossingId],
    queryFn: () => api.crossingInspections(propertyId, crossingId).then((answer) => answer.inspections),
  });
  const data = query.data;
  return (
    <Section title="Inspections">
      {query.isPending ? (
        <p className="mt-2 text-sm text-bark-700">Loading the inspection history…</p>
      ) : query.error ? (
        <p className="alert-error mt-2 text-sm" role="alert">The inspection history could not be loaded: {query.error.message}</p>
      ) : data ? (
        <div data-testid="inspection-history">
          {data.redesign && (
            <div className="mt-2 rounded-lg border-2 border-[#7a1f6a] bg-white p-3" data-testid="redesign-suggestion">
              <p className="font-semibold text-[#7a1f6a]">
                {data.redesign.suggestedStyle ? `Reconsider its style: ${styleInWords(data.redesign.suggestedStyle)}` : 'Reconsider this crossing'}
              </p>
              <p className="mt-1 text-sm text-bark-700">{data.redesign.reason}</p>
            </div>
          )}
          {data.history.length === 0 ? (
            <p className="mt-2 text-sm text-bark-700">Not inspected after rain yet.</p>
          ) : (
            <ul className="mt-2 flex flex-col gap-2">
              {data.history.map((entry) => (
                <li key={entry.checkId} className="rounded-lg border border-sand-300 p-2" data-testid="inspection-history-row">
                  <p className="flex flex-wrap justify-between gap-x-3 text-sm">
                    <span>
                      <a href={`/app/properties/${propertyId}/inspections/${entry.roundId}`}>{entry.fellOn}</a> · <span className="tabular-nums">{entry.rainfallMm} mm</span>
                    </span>
                    <span className={FAILURE_STATUSES.includes(entry.status) ? 'font-semibold text-[#7a1f6a]' : 'font-semibold text-bark-900'}>{CHECK_STATUS_LABELS[entry.status]}</span>
                  </p>
                  {entry.note && <p className="mt-1 text-sm text-bark-700">{entry.note}</p>}
                  {entry.photos.length > 0 && (
                    <p className="mt-2 flex flex-wrap gap-2">
                      {entry.photos.map((photo) => (
                        <a key={photo.id} href={photo.url} target="_blank" rel="noreferrer">
                          <img src={photo.thumbnailUrl} alt={`Photo from the inspection after the rain of ${entry.fellOn}`} className="h-16 w-16 rounded object-cover" loading="lazy" />
                        </a>
                      ))}
                    </p>
                  )}
                </li>
              ))}
            </ul>
          )}
        </div>
      ) : null}
    </Section>
  );
}
