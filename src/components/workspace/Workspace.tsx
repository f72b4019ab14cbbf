import { useQuery } from '@tanstack/react-query';
import { useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { api } from '../../lib/client/api';
import PropertyMap from '../map/PropertyMap';
import TerrainOverlay, { type TerrainRunLayer, type TerrainVisibility } from '../map/TerrainOverlay';
import { withQueryClient } from '../QueryRoot';
import LayerToggles from './LayerToggles';
import TerrainPanel from './TerrainPanel';

type Props = {
  propertyId: number;
  propertyName: string;
  extentWgs84: [number, number, number, number] | null;
  canEdit: boolean;
  /** Static panels rendered by the page (the safety note). */
  children?: ReactNode;
};

/** The property workspace: the map with its terrain layers, and the side panels. */
function Workspace({ propertyId, propertyName, extentWgs84, canEdit, children }: Props) {
  const models = useQuery({
    queryKey: ['elevation-models', propertyId],
    queryFn: () => api.listElevationModels(propertyId).then((r) => r.elevationModels),
    // Poll while a run is queued or running, so the progress bar moves.
    refetchInterval: (query) =>
      query.state.data?.some((m) => m.latestRun?.status === 'queued' || m.latestRun?.status === 'running') ? 600 : false,
  });
  const currentRunIds = (models.data ?? []).map((m) => m.currentRun?.id ?? 0).join(',');
  const drainage = useQuery({ queryKey: ['drainage-lines', propertyId, currentRunIds], queryFn: () => api.drainageLines(propertyId) });
  const [visible, setVisible] = useState<TerrainVisibility>({ hillshade: true, contours: true, drainage: true });

  const runs = useMemo<TerrainRunLayer[]>(
    () =>
      (models.data ?? [])
        .flatMap((m) => (m.currentRun?.summary ? [{ id: m.currentRun.id, ...m.currentRun.summary }] : []))
        // Oldest first, so a newer model draws over an older one.
        .reverse()
        .map(({ id, cornersWgs84, contourIntervalM }) => ({ id, cornersWgs84, contourIntervalM })),
    [models.data],
  );
  // A property without an extent takes its first model's when the run finishes.
  const firstBounds = models.data?.find((m) => m.currentRun?.summary)?.currentRun?.summary?.boundsWgs84 ?? null;
  const extent = extentWgs84 ?? firstBounds;

  // Announce finished runs to browser tests and assistive technology alike.
  const announced = useRef(currentRunIds);
  const [announcement, setAnnouncement] = useState('');
  useEffect(() => {
    if (announced.current !== currentRunIds && currentRunIds.replace(/[0,]/g, '')) setAnnouncement('Terrain run finished: drainage lines updated.');
    announced.current = currentRunIds;
  }, [currentRunIds]);

  return (
    <div className="flex min-h-0 flex-1 flex-col md:flex-row">
      <section className="relative min-h-[55vh] flex-1 md:min-h-0" aria-label="Map of the property">
        <PropertyMap propertyName={propertyName} extentWgs84={extent}>
          <TerrainOverlay propertyId={propertyId} runs={runs} drainage={drainage.data ?? null} visible={visible} underExtent={extent !== null} />
        </PropertyMap>
        {runs.length > 0 && <LayerToggles visible={visible} onChange={setVisible} />}
      </section>
      <aside
        className="flex w-full flex-col gap-4 overflow-y-auto border-t border-sand-200 bg-sand-50 p-4 md:w-96 md:border-l md:border-t-0"
        aria-label="Property panels"
        data-testid="workspace-panels"
      >
        <p className="sr-only" role="status">{announcement}</p>
        <TerrainPanel propertyId={propertyId} canEdit={canEdit} models={models.data ?? []} loading={models.isPending} />
        <section className="card p-4" aria-labelledby="fences-heading">
          <h2 id="fences-heading" className="font-bold">Fence lines</h2>
          <p className="mt-1 text-sm text-bark-700">No fence lines yet.</p>
        </section>
        <section className="card p-4" aria-labelledby="crossings-heading">
          <h2 id="crossings-heading" className="font-bold">Crossings</h2>
          <p className="mt-1 text-sm text-bark-700">
            Every place a fence line meets a drainage line will be listed here with its crossing angle and design.
          </p>
        </section>
        {children}
      </aside>
    </div>
  );
}

export default withQueryClient(Workspace);
