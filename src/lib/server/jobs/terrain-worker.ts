// Runs one terrain run off the request thread. The main thread sends the job, this thread posts
// progress and the result; a cancel is a terminate() from the main thread.
import { parentPort, workerData } from 'node:worker_threads';
import { DomainError } from '../http';
import { runTerrain, type TerrainRunInput } from '../terrain/run-terrain';

export type WorkerMessage =
  | { type: 'progress'; stage: string; percent: number }
  | { type: 'done'; summary: Awaited<ReturnType<typeof runTerrain>> }
  | { type: 'failed'; message: string; expected: boolean };

const port = parentPort!;
const input = workerData as TerrainRunInput;

let lastSent = 0;
runTerrain(input, (stage, percent) => {
  // Progress at most every 200 ms, and always at a stage's start.
  const now = Date.now();
  if (now - lastSent < 200 && percent % 5 !== 0) return;
  lastSent = now;
  port.postMessage({ type: 'progress', stage, percent } satisfies WorkerMessage);
})
  .then((summary) => port.postMessage({ type: 'done', summary } satisfies WorkerMessage))
  .catch((error: unknown) => {
    const expected = error instanceof DomainError;
    const message = expected ? (error as Error).message : String((error as Error)?.stack ?? error);
    port.postMessage({ type: 'failed', message, expected } satisfies WorkerMessage);
  });
