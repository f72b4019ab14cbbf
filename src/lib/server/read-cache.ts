import { promisify } from 'node:util';
import { gzip } from 'node:zlib';
import type { Knex } from 'knex';
import { db } from './db';

const gzipAsync = promisify(gzip);

/** Which counter of `read_generations` an answer depends on (see its migration). */
export type ReadGeneration = 'plan' | 'terrain';

/** Memory the kept answers may take, bytes; the least recently used go first. */
const BUDGET_BYTES = 64 * 1024 * 1024;
/** Answers smaller than this are sent as they are (as compressAnswer does). */
const GZIP_MIN_BYTES = 8 * 1024;

type Entry = { stamp: number | string; value: unknown; bytes: number };
const entries = new Map<string, Entry>();
let usedBytes = 0;

/** The property's counter now: one read of a primary key. */
export async function readGeneration(propertyId: number, which: ReadGeneration, trx: Knex = db()): Promise<number> {
  const row = (await trx('read_generations').where({ property_id: propertyId }).first(which)) as Record<ReadGeneration, number> | undefined;
  return row?.[which] ?? 0;
}

function remember(key: string, entry: Entry): void {
  const old = entries.get(key);
  if (old) usedBytes -= old.bytes;
  entries.delete(key);
  entries.set(key, entry);
  usedBytes += entry.bytes;
  for (const [oldest, dropped] of entries) {
    if (usedBytes <= BUDGET_BYTES) break;
    entries.delete(oldest);
    usedBytes -= dropped.bytes;
  }
}

function recall(key: string, stamp: number | string): Entry | undefined {
  const entry = entries.get(key);
  if (!entry || entry.stamp !== stamp) return undefined;
  // Most recently used last, so eviction takes the oldest first.
  entries.delete(key);
  entries.set(key, entry);
  return entry;
}

/**
 * `compute()`'s value for the property, kept until the counter moves. The counter is read before
 * computing: an answer that saw a later change is kept under the older count and never served again.
 * The value is shared between requests: callers must not change it.
 */
export async function keptValue<T>(key: string, propertyId: number, which: ReadGeneration, compute: () => Promise<T>, sizeOf: (value: T) => number = () => 1024): Promise<T> {
  return keptAt(`${key}:${propertyId}`, await readGeneration(propertyId, which), compute, sizeOf);
}

/** `compute()`'s value kept under `key` while the stamp stays the one given. */
async function keptAt<T>(key: string, stamp: number | string, compute: () => Promise<T>, sizeOf: (value: T) => number): Promise<T> {
  const kept = recall(key, stamp);
  if (kept) return kept.value as T;
  const value = await compute();
  remember(key, { stamp, value, bytes: sizeOf(value) });
  return value;
}

/**
 * A JSON answer kept as its bytes (and their gzip, made once, for clients that take it) until the
 * property's counter moves: the busiest reads of the workspace cost a lookup instead of queries,
 * JSON and compression on every call.
 */
export async function keptJsonAnswer(request: Request, key: string, propertyId: number, which: ReadGeneration, contentType: string, compute: () => Promise<unknown>): Promise<Response> {
  const kept = await keptValue(`json:${key}`, propertyId, which, async () => keptJsonOf(await compute()), keptJsonBytes);
  return answerWith(request, kept, contentType);
}

/**
 * A JSON answer kept as `keptJsonAnswer` keeps one, but checked against a stamp the caller read
 * (say, the versions of the rows it is made of) instead of a property's counter. Read the stamp
 * before computing, for the same reason as there.
 */
export async function keptJsonAnswerAt(request: Request, key: string, stamp: string, contentType: string, compute: () => Promise<unknown>): Promise<Response> {
  const kept = await keptAt(`json:${key}`, stamp, async () => keptJsonOf(await compute()), keptJsonBytes);
  return answerWith(request, kept, contentType);
}

const keptJsonOf = (value: unknown): KeptJson => ({ body: Buffer.from(JSON.stringify(value)) as Buffer<ArrayBuffer> });
// The gzip made later is about a third of the body or less: count it now.
const keptJsonBytes = ({ body }: KeptJson) => Math.ceil(body.byteLength * 1.35);

async function answerWith(request: Request, kept: KeptJson, contentType: string): Promise<Response> {
  const headers = new Headers({ 'Content-Type': contentType, Vary: 'Accept-Encoding' });
  if (kept.body.byteLength < GZIP_MIN_BYTES || !/\bgzip\b/i.test(request.headers.get('Accept-Encoding') ?? '')) return new Response(kept.body, { headers });
  kept.gzipped ??= gzipAsync(kept.body, { level: 6 }) as Promise<Buffer<ArrayBuffer>>;
  headers.set('Content-Encoding', 'gzip');
  return new Response(await kept.gzipped, { headers });
}

/** A kept JSON answer: its bytes, and their gzip once a client has taken it. */
type KeptJson = { body: Buffer<ArrayBuffer>; gzipped?: Promise<Buffer<ArrayBuffer>> };

/** Forgets every kept answer (tests start each case from nothing). */
export function forgetKeptAnswers(): void {
  entries.clear();
  usedBytes = 0;
}
