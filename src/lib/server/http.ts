import { randomUUID } from 'node:crypto';
import type { ZodType, ZodTypeDef } from 'zod';
import { getConfig } from './config';

/** Field name → what is wrong with it, in words a person can act on. */
export type FieldErrors = Record<string, string>;

/** A failure the caller can fix or must be told about; mapped to a status code in one place. */
export class DomainError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly fields?: FieldErrors,
    readonly headers?: Record<string, string>,
  ) {
    super(message);
    this.name = new.target.name;
  }
}

export class BadRequestError extends DomainError {
  constructor(message: string) {
    super(400, message);
  }
}
export class UnauthorizedError extends DomainError {
  constructor(message = 'Sign in to continue.') {
    super(401, message);
  }
}
export class ForbiddenError extends DomainError {
  constructor(message: string) {
    super(403, message);
  }
}
/** Also used for objects the caller may not see, so that their existence is not revealed. */
export class NotFoundError extends DomainError {
  constructor(what: string, message = `No ${what} with that id was found.`) {
    super(404, message);
  }
}
export class ConflictError extends DomainError {
  constructor(message: string, fields?: FieldErrors) {
    super(409, message, fields);
  }
}
export class PayloadTooLargeError extends DomainError {
  constructor(limitBytes: number) {
    super(413, `The request is too large: the limit is ${Math.round(limitBytes / 1024)} KB.`);
  }
}
export class UnsupportedMediaTypeError extends DomainError {
  constructor(expected: string) {
    super(415, `Send the request body as ${expected}.`);
  }
}
export class ValidationError extends DomainError {
  constructor(fields: FieldErrors, message = 'Some fields need attention.') {
    super(422, message, fields);
  }
}
export class TooManyRequestsError extends DomainError {
  constructor(message: string, retryAfterS: number) {
    super(429, message, undefined, { 'Retry-After': String(Math.max(1, Math.ceil(retryAfterS))) });
  }
}

/** The JSON body of every error answer. */
export type ErrorBody = { error: string; fields?: FieldErrors; errorId?: string };

export function errorResponse(error: DomainError): Response {
  const body: ErrorBody = { error: error.message, ...(error.fields ? { fields: error.fields } : {}) };
  return Response.json(body, { status: error.status, headers: error.headers });
}

/** An unexpected failure: logged with an id the person can quote; no detail leaves the server. */
export function internalErrorResponse(error: unknown): Response {
  const errorId = randomUUID().slice(0, 8);
  console.error(`[gullyline] error ${errorId}:`, error);
  const body: ErrorBody = {
    error: `Something went wrong on our side. If it keeps happening, quote error id ${errorId}.`,
    errorId,
  };
  return Response.json(body, { status: 500 });
}

/**
 * Reads a JSON body, bounded in size, and checks it against a schema.
 * @throws UnsupportedMediaTypeError, PayloadTooLargeError, BadRequestError, ValidationError
 */
export async function readJson<T>(request: Request, schema: ZodType<T, ZodTypeDef, unknown>): Promise<T> {
  const type = request.headers.get('content-type') ?? '';
  if (!/^application\/json\b/i.test(type)) throw new UnsupportedMediaTypeError('JSON (Content-Type: application/json)');
  const text = await readTextWithin(request, getConfig().maxJsonBodyBytes);
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch {
    throw new BadRequestError('The request body is not valid JSON.');
  }
  return parseWith(schema, value);
}

/** {@link readJson} for a body that may be left out: no body is checked as `{}`. */
export async function readOptionalJson<T>(request: Request, schema: ZodType<T, ZodTypeDef, unknown>): Promise<T> {
  if (request.body === null || request.headers.get('content-length') === '0') return parseWith(schema, {});
  return readJson(request, schema);
}

/** Checks a value against a schema, turning zod issues into per-field messages. */
export function parseWith<T>(schema: ZodType<T, ZodTypeDef, unknown>, value: unknown): T {
  const parsed = schema.safeParse(value);
  if (parsed.success) return parsed.data;
  const fields: FieldErrors = {};
  for (const issue of parsed.error.issues) {
    const key = issue.path.join('.') || '_';
    fields[key] ??= issue.message;
  }
  throw new ValidationError(fields);
}

/** Reads a request body as UTF-8 text, refusing it past `limitBytes` (413). */
export async function readTextWithin(request: Request, limitBytes: number): Promise<string> {
  if (!request.body && !(Number(request.headers.get('content-length') ?? 'NaN') > limitBytes)) return '';
  return (await readBytesWithin(request, limitBytes, () => new PayloadTooLargeError(limitBytes))).toString('utf8');
}

/**
 * Reads a request body into memory, stopping as soon as it passes `limitBytes` (declared or
 * counted) with the error `tooLarge` makes. An absent body reads as no bytes.
 */
export async function readBytesWithin(request: Request, limitBytes: number, tooLarge: () => Error): Promise<Buffer> {
  const declared = Number(request.headers.get('content-length') ?? 'NaN');
  if (declared > limitBytes) throw tooLarge();
  if (!request.body) return Buffer.alloc(0);
  const chunks: Uint8Array[] = [];
  let total = 0;
  const reader = request.body.getReader();
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > limitBytes) {
      await reader.cancel();
      throw tooLarge();
    }
    chunks.push(value);
  }
  return Buffer.concat(chunks);
}

/** Parses a numeric route parameter; anything else is an unknown object (404). */
export function parseId(value: string | undefined, what: string): number {
  const id = Number(value);
  if (!value || !/^\d{1,12}$/.test(value) || !Number.isSafeInteger(id) || id < 1) throw new NotFoundError(what);
  return id;
}
/** Something that existed and is used up or withdrawn for good (an invitation link). */
export class GoneError extends DomainError {
  constructor(message: string) {
    super(410, message);
  }
}
