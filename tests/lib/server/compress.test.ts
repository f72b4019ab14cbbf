import { gunzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { compressAnswer } from '../../../src/lib/server/compress';

const asking = (encoding?: string) => new Request('http://localhost/api/x', { headers: encoding ? { 'Accept-Encoding': encoding } : {} });
const big = { type: 'FeatureCollection', features: Array.from({ length: 2000 }, (_, i) => ({ type: 'Feature', id: i, properties: { i }, geometry: null })) };

describe('compressAnswer', () => {
  it('gzips a big JSON answer for a client that takes gzip, and it inflates back to the same text (RFC 1952 through node:zlib)', async () => {
    const answer = await compressAnswer(asking('gzip, deflate, br'), Response.json(big, { headers: { 'Content-Type': 'application/geo+json' } }));
    expect(answer.headers.get('Content-Encoding')).toBe('gzip');
    expect(answer.headers.get('Vary')).toContain('Accept-Encoding');
    const raw = Buffer.from(await answer.arrayBuffer());
    expect(JSON.parse(gunzipSync(raw).toString('utf8'))).toEqual(big);
    expect(raw.byteLength).toBeLessThan(JSON.stringify(big).length / 4);
  });

  it('leaves small answers, images and clients without gzip alone', async () => {
    const small = await compressAnswer(asking('gzip'), Response.json({ ok: true }));
    expect(small.headers.get('Content-Encoding')).toBeNull();
    expect(await small.json()).toEqual({ ok: true });

    const image = await compressAnswer(asking('gzip'), new Response(new Uint8Array(20_000), { headers: { 'Content-Type': 'image/png' } }));
    expect(image.headers.get('Content-Encoding')).toBeNull();

    const plain = await compressAnswer(asking(), Response.json(big));
    expect(plain.headers.get('Content-Encoding')).toBeNull();
    expect(await plain.json()).toEqual(big);
  });

  it('keeps the status and other headers', async () => {
    const answer = await compressAnswer(asking('gzip'), new Response(JSON.stringify(big), { status: 201, headers: { 'Content-Type': 'application/json', 'X-Extra': 'kept' } }));
    expect(answer.status).toBe(201);
    expect(answer.headers.get('X-Extra')).toBe('kept');
  });
});
