import { randomUUID } from 'node:crypto';
import { createWriteStream } from 'node:fs';
import { mkdir, rename, rm } from 'node:fs/promises';
import path from 'node:path';
import { Readable, Transform } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { getConfig } from './config';
import { BadRequestError, PayloadTooLargeError } from './http';

/**
 * Files on local disk under DATA_DIR. Paths stored in the database are relative to it, so a
 * data folder can be backed up and restored elsewhere.
 */
export function dataPath(relative: string): string {
  const root = getConfig().dataDir;
  const full = path.resolve(root, relative);
  if (!full.startsWith(root + path.sep)) throw new Error(`refusing a path outside the data folder: ${relative}`);
  return full;
}

/**
 * Streams a request body into a temporary file, stopping at the upload limit.
 * @returns the temporary file (absolute) and its size
 * @throws PayloadTooLargeError over the limit, BadRequestError for an empty body; nothing is left behind
 */
export async function receiveUpload(body: ReadableStream<Uint8Array> | null, declaredBytes: number): Promise<{ tempFile: string; sizeBytes: number }> {
  const limit = getConfig().maxUploadBytes;
  if (declaredBytes > limit) throw new PayloadTooLargeError(limit);
  if (!body) throw new BadRequestError('The upload is empty: choose a file and send it again.');
  const tempFile = dataPath(`uploads/incoming/${randomUUID()}.part`);
  await mkdir(path.dirname(tempFile), { recursive: true });
  let sizeBytes = 0;
  const counter = new Transform({
    transform(chunk: Buffer, _encoding, done) {
      sizeBytes += chunk.length;
      done(sizeBytes > limit ? new PayloadTooLargeError(limit) : null, chunk);
    },
  });
  try {
    await pipeline(Readable.fromWeb(body as import('node:stream/web').ReadableStream<Uint8Array>), counter, createWriteStream(tempFile));
  } catch (error) {
    await removeQuietly(tempFile);
    throw error;
  }
  if (sizeBytes === 0) {
    await removeQuietly(tempFile);
    throw new BadRequestError('The upload is empty: choose a file and send it again.');
  }
  return { tempFile, sizeBytes };
}

/** Moves a file into its place under DATA_DIR (creating folders). */
export async function moveInto(file: string, relativeTarget: string): Promise<void> {
  const target = dataPath(relativeTarget);
  await mkdir(path.dirname(target), { recursive: true });
  await rename(file, target);
}

export async function removeQuietly(target: string): Promise<void> {
  await rm(target, { recursive: true, force: true }).catch(() => undefined);
}

/** Where a terrain run keeps its derived files (hillshade image, contours, drainage GeoJSON). */
export function terrainRunFolder(runId: number): string {
  return `terrain-runs/${runId}`;
}
