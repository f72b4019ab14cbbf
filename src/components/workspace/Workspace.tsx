import { useQuery, useQueryClient } from '@tanstack/react-query';
import type { MapGeoJSONFeature } from 'maplibre-gl';
import { useCallback, useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { api } from '../../lib/client/api';
import type { CrossingSummaryView, LonLat } from '../../lib/schemas/crossing-view';
import { FENCE_STATUSES, type FenceLine } from '../../lib/schemas/plan';
import PlanOverlay, { CROSSING_INTERACTIVE_LAYER_IDS } from '../map/PlanOverlay';
import PropertyMap from '../map/PropertyMap';
import TerrainOverlay, { type TerrainRunLayer, type TerrainVisibility } from '../map/TerrainOverlay';
import { withQueryClient } from '../QueryRoot';
import CrossingDetail, { crossingDetailQuery, type RealignmentPreview } from './CrossingDetail';
import CrossingsPanel from './CrossingsPanel';
import { LAYOUT_MIN_ZOOM, LAYOUT_VIEW_ZOOM, fenceLineLayer } from '../map/plan-layers';
import TracksOverlay from '../map/TracksOverlay';
import { EditPanel } from './editing/EditPanel';
import { EditToolbar } from './editing/EditToolbar';
import { FenceLinePanel } from './editing/FenceLinePanel';
import { PaddocksPanel } from './editing/PaddocksPanel';
import PlanDrawing from './editing/PlanDrawing';
import { ShortcutsHelp, useWorkspaceShortcuts } from './editing/shortcuts';
import { TracksPanel } from './editing/TracksPanel';
import { usePlanEditor } from './editing/use-plan-editor';
import { useSavedHistory } from './editing/use-saved-history';
import type { SavedChange } from './editing/saved-history';
import { ExportPanel } from './ExportPanel';
import { FenceLinesSummary } from './FenceLinesSummary';
import LayerToggles, { type PlanVisibility } from './LayerToggles';
import { WorkspaceSheet, type SheetSection } from './WorkspaceSheet';
import TerrainPanel from './TerrainPanel';

type Props = {
  propertyId: number;
  propertyName: string;
  extentWgs84: [number, number, number, number] | null;
  canEdit: boolean;
  /** Static panels rendered by the page (the safety note). */
  children?: ReactNode;
};

const FENCE_LAYER_IDS = [fenceLineLayer.id];
const MAP_PICKABLE_LAYER_IDS = [...CROSSING_INTERACTIVE_LAYER_IDS, ...FENCE_LAYER_IDS];

/** After a terrain run, crossings are analysed again for up to this long; the list polls meanwhile. */
const ANALYSIS_WAIT_MS = 60_000;

/** Where the map goes for a crossing: close enough for a designed one's layout to show. */
const focusOn = (position: number[], crossing: CrossingSummaryView) => ({
  position: [position[0]!, position[1]!] as LonLat,
  zoom: crossing.designStatus === 'designed' ? LAYOUT_VIEW_ZOOM : LAYOUT_MIN_ZOOM,
  seq: Date.now(),
});

/** The property workspace: the map with its terrain and plan layers, and the side panels. */
function Workspace({ propertyId, propertyName, extentWgs84, canEdit, children }: Props) {
  const queryClient = useQueryClient();
  const models = useQuery({
    queryKey: ['elevation-models', propertyId],
    queryFn: () => api.listElevationModels(propertyId).then((r) => r.elevationModels),
    // Poll while a run is queued or running, so the progress bar moves.
    refetchInterval: (query) =>
      query.state.data?.some((m) => m.latestRun?.status === 'queued' || m.latestRun?.status === 'running') ? 600 : false,
  });
  const currentRunIds = (models.data ?? []).map((m) => m.currentRun?.id ?? 0).join(',');
  const [visible, setVisible] = useState<TerrainVisibility>({ hillshade: true, contours: true, drainage: true });

  // The newest finished run: the server designs the crossings again just after it.
  const lastRunFinishedAt = (models.data ?? []).reduce<string | null>((latest, m) => {
    const finished = m.currentRun?.finishedAt ?? null;
    return finished && (!latest || finished > latest) ? finished : latest;
  }, null);

  const fenceLines = useQuery({
    queryKey: ['fence-lines', propertyId],
    queryFn: () => api.listFenceLines(propertyId).then((r) => r.fenceLines),
  });
  const crossings = useQuery({
    queryKey: ['crossings', propertyId, currentRunIds],
    queryFn: () => api.listCrossings(propertyId),
    enabled: models.isSuccess,
    // Poll briefly after a run finishes, until the crossings analysed after it arrive.
    refetchInterval: (query) => {
      if (!lastRunFinishedAt || Date.now() - Date.parse(lastRunFinishedAt) > ANALYSIS_WAIT_MS) return false;
      const newest = (query.state.data?.features ?? []).reduce((latest, f) => Math.max(latest, Date.parse(f.properties.computedAt ?? '') || 0), 0);
      return newest >= Date.parse(lastRunFinishedAt) ? false : 1500;
    },
  });
  const crossingList = useMemo<CrossingSummaryView[]>(() => (crossings.data?.features ?? []).map((feature) => feature.properties), [crossings.data]);
  const tracks = useQuery({ queryKey: ['tracks', propertyId], queryFn: () => api.listTracks(propertyId).then((r) => r.tracks) });
  const paddocks = useQuery({ queryKey: ['paddocks', propertyId], queryFn: () => api.listPaddocks(propertyId).then((r) => r.paddocks) });
  const [planVisible, setPlanVisible] = useState<PlanVisibility>({ tracks: true, paddocks: true });
  const [selectedFenceId, setSelectedFenceId] = useState<number | null>(null);
  const selectedFence = (fenceLines.data ?? []).find((fence) => fence.id === selectedFenceId) ?? null;

  const [selectedId, setSelectedId] = useState<number | null>(null);
  const [revealSeq, setRevealSeq] = useState(0);
  const [focus, setFocus] = useState<{ position: LonLat; zoom: number; seq: number } | null>(null);
  const [realignment, setRealignment] = useState<RealignmentPreview | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const selected = crossingList.find((crossing) => crossing.id === selectedId) ?? null;
  const groundHeightAt = useCallback(
    (lon: number, lat: number) => api.elevationAt(propertyId, [lon, lat]).then((answer) => answer.elevationM),
    [propertyId],
  );
  // Saved changes, undone and redone from the edit toolbar; what happened shows in the notice.
  const saved = useSavedHistory({
    propertyId,
    onMessage: (message) => {
      setSelectedId(null);
      setRealignment(null);
      setNotice(message);
    },
  });
  const { record } = saved;
  const recordSaved = (change: SavedChange, message: string) => {
    record(change);
    setNotice(message);
  };
  const editor = usePlanEditor({
    propertyId,
    onSaved: ({ fenceLine, change, message }) => {
      saved.record(change);
      setNotice(message);
      if (fenceLine) {
        setSelectedId(null);
        setSelectedFenceId(fenceLine.id);
      }
    },
  });
  const [showHelp, setShowHelp] = useState(false);
  // With no terrain yet, the first thing to do is upload an elevation model.
  const [section, setSection] = useState<SheetSection>(() => (extentWgs84 ? 'crossings' : 'terrain'));
  useWorkspaceShortcuts({ editor, saved, canEdit, onHelp: () => setShowHelp((shown) => !shown) });
  // Fences join end to end and follow walked tracks: both are snap targets while drawing.
  const snapTargets = useMemo(
    () => ({
      fenceEnds: (fenceLines.data ?? []).flatMap((fence) => [fence.coordinates[0]!, fence.coordinates.at(-1)!]),
      tracks: (tracks.data ?? []).map((track) => track.coordinates),
    }),
    [fenceLines.data, tracks.data],
  );
  const selectedPosition = crossings.data?.features.find((feature) => feature.properties.id === selectedId)?.geometry.coordinates ?? null;

  // The selected crossing's design (shared with the detail panel's query) gives the layout points.
  const detail = useQuery({
    ...crossingDetailQuery(propertyId, selected?.id ?? 0, selected?.computedAt ?? null),
    enabled: selected !== null,
  });
  const layoutPoints = (detail.data?.design && 'positions' in detail.data.design ? detail.data.design.positions : null) ?? null;

  const select = useCallback(
    (crossingId: number, from: 'list' | 'map') => {
      setSelectedId(crossingId);
      setNotice(null);
      setRealignment((preview) => (preview?.crossingId === crossingId ? preview : null));
      // The panels scroll up to the detail, which sits above every section.
      setRevealSeq((seq) => seq + 1);
      if (from === 'list') {
        const feature = crossings.data?.features.find((f) => f.properties.id === crossingId);
        if (feature) setFocus(focusOn(feature.geometry.coordinates, feature.properties));
      }
    },
    [crossings.data],
  );

  const onFeatureClick = useCallback(
    (feature: MapGeoJSONFeature) => {
      const id = Number(feature.properties?.id);
      if (!Number.isInteger(id)) return;
      if (FENCE_LAYER_IDS.includes(feature.layer.id)) {
        setSelectedFenceId(id);
        setNotice(null);
      } else select(id, 'map');
    },
    [select],
  );

  const onRealigned = useCallback(
    async (fenceLine: FenceLine) => {
      const before = selected;
      const fenceBefore = fenceLines.data?.find((fence) => fence.id === fenceLine.id);
      if (fenceBefore) record({ what: 'fence-realigned', before: fenceBefore, after: fenceLine });
      await queryClient.invalidateQueries({ queryKey: ['fence-lines', propertyId] });
      const refreshed = await crossings.refetch();
      // The crossing is found again on the new line; keep it selected (nearest along the same drainage line).
      const again = (refreshed.data?.features ?? [])
        .map((feature) => feature.properties)
        .filter((c) => c.fenceLineId === fenceLine.id && before && c.drainageLineId === before.drainageLineId)
        .sort((a, b) => Math.abs(a.chainageM - (before?.chainageM ?? 0)) - Math.abs(b.chainageM - (before?.chainageM ?? 0)))[0];
      setSelectedId(again?.id ?? null);
      setNotice(
        again
          ? `${fenceLine.name} now crosses here at ${again.angleDeg === null ? 'a new angle' : `${Math.round(again.angleDeg)}°`}; the crossing was designed again.`
          : `${fenceLine.name} has its new shape; its crossings were found and designed again.`,
      );
    },
    [crossings, fenceLines.data, propertyId, queryClient, record, selected],
  );

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

  const fenceStatuses = FENCE_STATUSES.filter((status) => (fenceLines.data ?? []).some((fence) => fence.status === status));
  const showTracks = (tracks.data ?? []).length > 0;
  const showPaddocks = (paddocks.data ?? []).length > 0;
  const showKey = runs.length > 0 || fenceStatuses.length > 0 || crossingList.length > 0 || showTracks || showPaddocks;
  const editing = editor.task !== null;

  // The map takes the first plan in one go: each source arriving on its own (or mounted empty and
  // filled later) costs a full redraw, a third of a second on a big station where WebGL is drawn in
  // software. So the overlays mount once every first answer is in (the page preloads them), all in
  // one commit and in their drawing order; after that, changes go straight in.
  const planArrived = useRef(false);
  // (The crossings wait for the models, so with the models refused they never start.)
  const firstReadsIn = [models, fenceLines, tracks, paddocks].every((query) => !query.isPending) && !(models.isSuccess && crossings.isPending);
  if (firstReadsIn) planArrived.current = true;

  return (
    // On a phone the panels are a sheet under the map; side by side each keeps its own height.
    <div className="flex min-h-0 flex-1 flex-col overflow-hidden md:flex-row">
      <section className="relative min-h-0 flex-1" aria-label="Map of the property">
        <PropertyMap
          propertyName={propertyName}
          extentWgs84={extent}
          // While a shape is drawn, clicks belong to the drawing.
          interactiveLayerIds={editing ? undefined : MAP_PICKABLE_LAYER_IDS}
          onFeatureClick={editing ? undefined : onFeatureClick}
          groundHeightAt={runs.length > 0 ? groundHeightAt : undefined}
        >
          {planArrived.current && (
            <>
              <TerrainOverlay propertyId={propertyId} runs={runs} visible={visible} underExtent={extent !== null} />
              <TracksOverlay tracks={tracks.data ?? null} paddocks={paddocks.data ?? null} visible={planVisible} />
              <PlanOverlay
                fenceLines={fenceLines.data ?? null}
                crossings={crossings.data ?? null}
                selectedCrossingId={selectedId}
                layoutPoints={layoutPoints}
                realignment={realignment}
                focus={focus}
              />
            </>
          )}
          {canEdit && <PlanDrawing snapTargets={snapTargets} {...editor.drawingProps} />}
        </PropertyMap>
        {canEdit && <EditToolbar editor={editor} saved={saved} />}
        <button
          type="button"
          className="absolute right-2.5 top-[6.5rem] z-10 flex h-8 w-8 items-center justify-center rounded-md border border-sand-300 bg-white font-bold text-bark-900 shadow-sm"
          onClick={() => setShowHelp((shown) => !shown)}
          aria-label="Keyboard shortcuts"
          aria-keyshortcuts="?"
          title="Keyboard shortcuts (?)"
          data-testid="shortcuts-button"
        >
          ?
        </button>
        {showKey && (
          <LayerToggles
            visible={visible}
            onChange={setVisible}
            showTerrain={runs.length > 0}
            fenceStatuses={fenceStatuses}
            showCrossings={crossingList.length > 0}
            showRealignment={realignment !== null}
            planVisible={planVisible}
            onPlanChange={setPlanVisible}
            showTracks={showTracks}
            showPaddocks={showPaddocks}
          />
        )}
      </section>
      <WorkspaceSheet
        section={section}
        onSection={setSection}
        counts={{ crossings: crossingList.length }}
        top={
          <>
            <p className="sr-only" role="status">{announcement}</p>
            {showHelp && <ShortcutsHelp canEdit={canEdit} onClose={() => setShowHelp(false)} />}
            {canEdit && <EditPanel editor={editor} fenceCount={(fenceLines.data ?? []).length} paddockCount={(paddocks.data ?? []).length} />}
            {notice && !selected && (
              <p className="rounded-lg border border-saltbush-500 bg-saltbush-100 px-4 py-3 text-sm" role="status" data-testid="workspace-notice">
                {notice}
              </p>
            )}
            {selectedFence && !editing && (
              <FenceLinePanel
                key={selectedFence.id}
                propertyId={propertyId}
                fence={selectedFence}
                crossings={crossingList}
                canEdit={canEdit}
                onReshape={() => editor.startReshape({ fence: selectedFence })}
                onClose={() => setSelectedFenceId(null)}
                onSelectCrossing={(id) => select(id, 'list')}
                onSaved={recordSaved}
              />
            )}
            {selected && (
              <CrossingDetail
                key={selected.id}
                propertyId={propertyId}
                summary={selected}
                canEdit={canEdit}
                onClose={() => {
                  setSelectedId(null);
                  setRealignment(null);
                  setNotice(null);
                }}
                notice={notice}
                onShowOnMap={() => selectedPosition && setFocus(focusOn(selectedPosition, selected))}
                realignment={realignment?.crossingId === selected.id ? realignment : null}
                onRealignmentChange={(preview) => {
                  setRealignment(preview);
                  // Close enough to see the dog-leg beside the old line.
                  if (preview && selectedPosition) setFocus({ ...focusOn(selectedPosition, selected), zoom: LAYOUT_VIEW_ZOOM });
                }}
                onRealigned={onRealigned}
                revealSeq={revealSeq}
              />
            )}
          </>
        }
        sections={{
          crossings: (
            <CrossingsPanel
              crossings={crossingList}
              fenceLines={fenceLines.data ?? []}
              loading={crossings.isPending}
              error={crossings.error}
              hasTerrain={runs.length > 0}
              selectedId={selectedId}
              onSelect={(id) => select(id, 'list')}
            />
          ),
          plan: (
            <>
              <FenceLinesSummary
                fenceLines={fenceLines.data ?? []}
                loading={fenceLines.isPending}
                error={fenceLines.error}
                crossings={crossingList}
                onSelect={(id) => {
                  setSelectedFenceId(id);
                  setNotice(null);
                }}
              />
              <PaddocksPanel
                propertyId={propertyId}
                paddocks={paddocks.data ?? []}
                loading={paddocks.isPending}
                canEdit={canEdit}
                hasFences={(fenceLines.data ?? []).length > 0}
                onReshape={(paddock) => editor.startReshape({ paddock })}
                onSaved={recordSaved}
              />
            </>
          ),
          terrain: <TerrainPanel propertyId={propertyId} canEdit={canEdit} models={models.data ?? []} loading={models.isPending} />,
          files: (
            <>
              <ExportPanel propertyId={propertyId} canEdit={canEdit} />
              <TracksPanel
                propertyId={propertyId}
                tracks={tracks.data ?? []}
                loading={tracks.isPending}
                canEdit={canEdit}
                onFenceMade={(fenceLine) => {
                  saved.record({ what: 'fence-created', fence: fenceLine, fromTrack: true });
                  setSelectedFenceId(fenceLine.id);
                  setSection('plan');
                }}
              />
            </>
          ),
        }}
        footer={children}
      />
    </div>
  );
}

export default withQueryClient(Workspace);
