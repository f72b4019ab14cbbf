import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useRef, useState } from 'react';
import { ApiError, api, uploadElevationModel } from '../../lib/client/api';
import type { ElevationModelView, TerrainRun } from '../../lib/schemas/terrain';
import ProgressBar from './ProgressBar';

type Props = { propertyId: number; canEdit: boolean; models: ElevationModelView[]; loading: boolean };

const isActive = (run: TerrainRun | null) => run?.status === 'queued' || run?.status === 'running';

/** Elevation models of the property: upload with progress through every stage, status, re-run and cancel. */
export default function TerrainPanel({ propertyId, canEdit, models, loading }: Props) {
  const queryClient = useQueryClient();
  const refresh = () => queryClient.invalidateQueries({ queryKey: ['elevation-models', propertyId] });
  const [file, setFile] = useState<File | null>(null);
  const [thresholdHa, setThresholdHa] = useState('5');
  const [crs, setCrs] = useState('');
  const [askCrs, setAskCrs] = useState(false);
  const [uploaded, setUploaded] = useState<number | null>(null);
  const [warnings, setWarnings] = useState<string[]>([]);
  const formRef = useRef<HTMLFormElement>(null);

  const upload = useMutation({
    mutationFn: (progress: (fraction: number) => void) =>
      uploadElevationModel(propertyId, file!, { crs: askCrs ? crs.trim() : undefined, thresholdHa: Number(thresholdHa), onProgress: progress }),
    onSuccess: (result) => {
      setWarnings(result.warnings);
      setFile(null);
      formRef.current?.reset();
      setThresholdHa(String(result.run.thresholdHa));
      setAskCrs(false);
      void refresh();
    },
    onError: (error) => {
      if (error instanceof ApiError && error.fields.crs) setAskCrs(true);
    },
  });
  const [uploadFraction, setUploadFraction] = useState(0);
  const cancel = useMutation({ mutationFn: (runId: number) => api.cancelTerrainRun(propertyId, runId), onSettled: refresh });
  const rerun = useMutation({ mutationFn: (modelId: number) => api.startTerrainRun(propertyId, modelId, Number(thresholdHa)), onSettled: refresh });

  const tracked = models.find((model) => model.id === uploaded) ?? models.find((model) => isActive(model.latestRun));
  const trackedRun = tracked?.latestRun ?? null;

  return (
    <section className="card p-4" aria-labelledby="terrain-heading" data-testid="terrain-panel">
      <h2 id="terrain-heading" className="font-bold">Terrain</h2>
      {loading ? (
        <p className="mt-1 text-sm text-bark-700">Loading…</p>
      ) : models.length === 0 ? (
        <p className="mt-1 text-sm text-bark-700">
          No elevation model on this property yet. Upload one (a GeoTIFF of ground heights) and Gullyline works out where water collects and draws the drainage lines.
        </p>
      ) : (
        <ul className="mt-2 flex flex-col gap-3">
          {models.map((model) => (
            <li key={model.id} className="border-t border-sand-200 pt-2 text-sm">
              <p className="font-semibold break-all">{model.name}</p>
              <p className="text-bark-500">
                {model.width} × {model.height} cells of {model.cellSizeM.toFixed(1)} m · {model.crs}
              </p>
              <RunStatus run={model.latestRun} current={model.currentRun} />
              {canEdit && isActive(model.latestRun) && (
                <button type="button" className="btn-quiet mt-2" onClick={() => cancel.mutate(model.latestRun!.id)} disabled={cancel.isPending}>
                  Cancel run
                </button>
              )}
              {canEdit && !isActive(model.latestRun) && (
                <button type="button" className="btn-quiet mt-2" onClick={() => rerun.mutate(model.id)} disabled={rerun.isPending}>
                  Run again ({Number(thresholdHa) || 5} ha threshold)
                </button>
              )}
            </li>
          ))}
        </ul>
      )}

      {upload.isPending && <div className="mt-3"><ProgressBar label="Uploading" percent={uploadFraction * 100} /></div>}
      {!upload.isPending && trackedRun && isActive(trackedRun) && (
        <div className="mt-3">
          <ProgressBar label={trackedRun.status === 'queued' ? 'Waiting to start' : (trackedRun.stageLabel ?? 'Working')} percent={trackedRun.percent} />
        </div>
      )}
      {warnings.map((warning) => (
        <p key={warning} className="alert-error mt-3 text-sm" role="status">{warning}</p>
      ))}
      {(upload.error ?? rerun.error ?? cancel.error) && (
        <p className="alert-error mt-3 text-sm" role="alert">{(upload.error ?? rerun.error ?? cancel.error)!.message}</p>
      )}

      {canEdit && (
        <form
          ref={formRef}
          className="mt-4 flex flex-col gap-3 border-t border-sand-200 pt-3"
          aria-label="Upload an elevation model"
          onSubmit={(event) => {
            event.preventDefault();
            if (!file) return;
            setUploadFraction(0);
            setUploaded(null);
            upload.mutate((fraction) => setUploadFraction(fraction), { onSuccess: (result) => setUploaded(result.elevationModel.id) });
          }}
        >
          <div className="field">
            <label htmlFor="elevation-file">Elevation model (GeoTIFF)</label>
            <input id="elevation-file" type="file" accept=".tif,.tiff,image/tiff" className="py-2" onChange={(e) => setFile(e.target.files?.[0] ?? null)} />
          </div>
          <div className="field">
            <label htmlFor="threshold-ha">Drainage threshold (ha drained)</label>
            <input id="threshold-ha" type="number" min="0.05" step="any" value={thresholdHa} onChange={(e) => setThresholdHa(e.target.value)} />
            <p className="text-xs text-bark-500">A channel starts where this much land drains to it. Smaller finds more gullies.</p>
          </div>
          {askCrs && (
            <div className="field">
              <label htmlFor="model-crs">Coordinate system of the file (EPSG code)</label>
              <input id="model-crs" value={crs} placeholder="EPSG:7854" onChange={(e) => setCrs(e.target.value)} />
            </div>
          )}
          <button type="submit" className="btn-primary" disabled={!file || upload.isPending}>
            Upload and find drainage lines
          </button>
        </form>
      )}
    </section>
  );
}

function RunStatus({ run, current }: { run: TerrainRun | null; current: TerrainRun | null }) {
  if (!run) return null;
  if (run.status === 'succeeded' && run.summary) {
    const seconds = Object.values(run.summary.stageTimesMs).reduce((a, b) => a + b, 0) / 1000;
    return (
      <p className="text-saltbush-700" data-testid="terrain-run-done">
        {run.summary.drainageLineCount} drainage lines ({run.thresholdHa} ha threshold), heights {run.summary.minElevationM.toFixed(1)}–
        {run.summary.maxElevationM.toFixed(1)} m, contours every {run.summary.contourIntervalM} m · {seconds.toFixed(1)} s
      </p>
    );
  }
  if (run.status === 'failed') return <p className="text-clay-600" role="alert">Terrain run failed: {run.message}</p>;
  if (run.status === 'cancelled') return <p className="text-bark-500">Run cancelled{current ? '; the earlier result is shown.' : '.'}</p>;
  return <p className="text-bark-500">{run.status === 'queued' ? 'Waiting to start…' : `${run.stageLabel ?? 'Working'}…`}</p>;
}
