import type { Worker } from 'node:worker_threads';
import type { ComputedCrossings } from '../crossings/compute-crossing-rows';
import type { AnalysisReply, AnalysisRequest } from './analysis-worker';
import { startWorker } from './start-worker';

type Pending = { resolve: (result: ComputedCrossings) => void; reject: (error: Error) => void };

let worker: Worker | undefined;
let nextId = 1;
const pending = new Map<number, Pending>();

/**
 * Finds and designs a property's crossings in the analysis worker thread: a fence edit's design
 * work (profiles, catchments, floods, layouts) then never holds up other people's requests. One
 * long-lived worker serves every property; it is started on first use and again after a crash.
 */
export function computeInWorker(propertyId: number, fenceLineIds?: number[]): Promise<ComputedCrossings> {
  const id = nextId++;
  const running = analysisWorker();
  return new Promise<ComputedCrossings>((resolve, reject) => {
    pending.set(id, { resolve, reject });
    // Only while work is waiting does the worker keep the process alive (a CLI exits when done).
    running.ref();
    running.postMessage({ id, propertyId, fenceLineIds } satisfies AnalysisRequest);
  });
}

function analysisWorker(): Worker {
  if (worker) return worker;
  const started = startWorker('analysis-worker');
  started.unref();
  started.on('message', (reply: AnalysisReply) => {
    const waiting = pending.get(reply.id);
    if (!waiting) return;
    pending.delete(reply.id);
    if (pending.size === 0) started.unref();
    if (reply.ok) waiting.resolve(reply.result);
    else waiting.reject(new Error(`crossing analysis failed: ${reply.message}`));
  });
  const lost = (reason: string) => {
    if (worker === started) worker = undefined;
    for (const [id, waiting] of pending) {
      pending.delete(id);
      waiting.reject(new Error(reason));
    }
  };
  started.on('error', (error) => lost(`the analysis worker stopped: ${error.message}`));
  started.on('exit', (code) => lost(`the analysis worker exited (code ${code})`));
  worker = started;
  return started;
}

/** Stops the worker (tests and scripts that must exit promptly). */
export async function stopAnalysisWorker(): Promise<void> {
  const running = worker;
  worker = undefined;
  await running?.terminate();
}
