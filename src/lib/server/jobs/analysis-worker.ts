// Finds and designs crossings off the request thread. The main thread sends { id, propertyId,
// fenceLineIds }; this thread reads the plan and terrain itself (its own SQLite connection, its
// own raster cache) and posts back the rows to store, which the main thread writes.
import { parentPort } from 'node:worker_threads';
import { computeCrossingRows, type ComputedCrossings } from '../crossings/compute-crossing-rows';

export type AnalysisRequest = { id: number; propertyId: number; fenceLineIds?: number[] };
export type AnalysisReply = { id: number; ok: true; result: ComputedCrossings } | { id: number; ok: false; message: string };

const port = parentPort!;
port.on('message', (request: AnalysisRequest) => {
  computeCrossingRows(request.propertyId, request.fenceLineIds)
    .then((result) => port.postMessage({ id: request.id, ok: true, result } satisfies AnalysisReply))
    .catch((error: unknown) => port.postMessage({ id: request.id, ok: false, message: String((error as Error)?.stack ?? error) } satisfies AnalysisReply));
});
