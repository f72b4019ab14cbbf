import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { BadRequestError, PayloadTooLargeError, UnsupportedMediaTypeError, ValidationError, parseId, readJson } from '../../../src/lib/server/http';

const schema = z.object({ name: z.string().min(1, 'Enter a name.'), count: z.number().int() });
const post = (body: string, type = 'application/json') => new Request('http://localhost/x', { method: 'POST', body, headers: { 'Content-Type': type } });

describe('readJson', () => {
  it('returns the parsed, checked body', async () => {
    await expect(readJson(post('{"name":"a","count":2}'), schema)).resolves.toEqual({ name: 'a', count: 2 });
  });

  it('names each field that is wrong', async () => {
    const error = await readJson(post('{"name":"","count":1.5}'), schema).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ValidationError);
    expect((error as ValidationError).fields).toEqual({ name: 'Enter a name.', count: expect.stringMatching(/integer/) });
  });

  it('refuses broken JSON, other content types and bodies over the limit', async () => {
    await expect(readJson(post('{'), schema)).rejects.toBeInstanceOf(BadRequestError);
    await expect(readJson(post('name=a', 'application/x-www-form-urlencoded'), schema)).rejects.toBeInstanceOf(UnsupportedMediaTypeError);
    await expect(readJson(post(JSON.stringify({ name: 'x'.repeat(300 * 1024), count: 1 })), schema)).rejects.toBeInstanceOf(PayloadTooLargeError);
  });
});

describe('parseId', () => {
  it('accepts positive integers only', () => {
    expect(parseId('42', 'thing')).toBe(42);
    for (const bad of ['0', '-1', '1.5', '1e3', 'abc', '', undefined, '99999999999999999']) {
      expect(() => parseId(bad, 'thing'), String(bad)).toThrow(/No thing/);
    }
  });
});
