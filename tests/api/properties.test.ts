import { readdirSync } from 'node:fs';
import { get } from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TestClient, closeServerDb, rowCounts, serverDb, signedInClient } from '../helpers/api-client';

type Property = { id: number; name: string; region: string; crs: string; version: number; role: string };

let owner: Awaited<ReturnType<typeof signedInClient>>;
beforeAll(async () => {
  owner = await signedInClient('prop-owner');
});
afterAll(closeServerDb);

describe('properties', () => {
  it('creates a property with its creator as owner, listed for them and audited', async () => {
    const created = await owner.client.json<{ property: Property }>('POST', '/api/properties', {
      name: '  Mulga Creek  ',
      region: 'Western Division, NSW',
      crs: 'epsg:7855',
    });
    expect(created.status).toBe(201);
    expect(created.body.property).toMatchObject({ name: 'Mulga Creek', crs: 'EPSG:7855', role: 'owner', version: 1 });
    const list = await owner.client.json<{ properties: Property[] }>('GET', '/api/properties');
    expect(list.body.properties.map((p) => p.id)).toContain(created.body.property.id);
    const audit = await owner.client.json<{ entries: { action: string }[] }>('GET', `/api/properties/${created.body.property.id}/audit`);
    expect(audit.body.entries.map((e) => e.action)).toContain('property.create');
  });

  const bad: [string, Record<string, unknown>, string, RegExp][] = [
    ['an empty name', { name: '   ', crs: 'EPSG:7854' }, 'name', /Give the property a name/],
    ['a CRS that is not an EPSG code', { name: 'X', crs: 'MGA54' }, 'crs', /EPSG code/],
    ['an unknown EPSG code', { name: 'X', crs: 'EPSG:99999' }, 'crs', /not in the EPSG registry/],
    ['a geographic CRS', { name: 'X', crs: 'EPSG:4283' }, 'crs', /not a projected coordinate system/],
  ];
  it.each(bad)('refuses %s with 422 naming the field, and stores nothing', async (_label, input, field, message) => {
    const before = await rowCounts('properties', 'memberships', 'audit_log');
    const { status, body } = await owner.client.json<{ fields: Record<string, string> }>('POST', '/api/properties', input);
    expect(status).toBe(422);
    expect(body.fields[field]).toMatch(message);
    expect(await rowCounts('properties', 'memberships', 'audit_log')).toEqual(before);
  });

  it('refuses an edit made on stale data with 409 and keeps the newer change', async () => {
    const { body } = await owner.client.json<{ property: Property }>('POST', '/api/properties', { name: 'Gidgee Flat', crs: 'EPSG:7854' });
    const id = body.property.id;
    const first = await owner.client.json<{ property: Property }>('PATCH', `/api/properties/${id}`, { name: 'Gidgee Flat North', version: 1 });
    expect(first.status).toBe(200);
    expect(first.body.property.version).toBe(2);
    const stale = await owner.client.json<{ error: string }>('PATCH', `/api/properties/${id}`, { name: 'Gidgee Flat South', version: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.error).toMatch(/Reload/);
    const now = await owner.client.json<{ property: Property }>('GET', `/api/properties/${id}`);
    expect(now.body.property.name).toBe('Gidgee Flat North');
  });
});

describe('members', () => {
  it('keeps at least one owner, and lets an owner hand over', async () => {
    const { body } = await owner.client.json<{ property: Property }>('POST', '/api/properties', { name: 'Bluebush Hill', crs: 'EPSG:7854' });
    const id = body.property.id;
    const demote = await owner.client.json<{ error: string }>('PATCH', `/api/properties/${id}/members/${owner.userId}`, { role: 'manager' });
    expect(demote.status).toBe(409);
    expect(demote.body.error).toMatch(/at least one owner/);
    const leave = await owner.client.json<{ error: string }>('DELETE', `/api/properties/${id}/members/${owner.userId}`);
    expect(leave.status).toBe(409);

    const heir = await signedInClient('heir');
    await serverDb()('memberships').insert({ property_id: id, user_id: heir.userId, role: 'manager', created_at: new Date().toISOString() });
    const promote = await owner.client.json<{ member: { role: string } }>('PATCH', `/api/properties/${id}/members/${heir.userId}`, { role: 'owner' });
    expect(promote.body.member.role).toBe('owner');
    const step = await owner.client.json('PATCH', `/api/properties/${id}/members/${owner.userId}`, { role: 'viewer' });
    expect(step.status).toBe(200);
    const members = await heir.client.json<{ members: { userId: number; role: string }[] }>('GET', `/api/properties/${id}/members`);
    expect(members.body.members.find((m) => m.userId === owner.userId)?.role).toBe('viewer');
  });

  it('refuses an unknown role with 422', async () => {
    const { body } = await owner.client.json<{ property: Property }>('POST', '/api/properties', { name: 'Emu Swamp', crs: 'EPSG:7854' });
    const answer = await owner.client.json<{ fields: Record<string, string> }>('PATCH', `/api/properties/${body.property.id}/members/${owner.userId}`, { role: 'boss' });
    expect(answer.status).toBe(422);
    expect(answer.body.fields.role).toBeTruthy();
  });
});

describe('errors', () => {
  it('answers an unknown API route with 404 JSON and an unknown page with the 404 page', async () => {
    const api = await owner.client.json<{ error: string }>('GET', '/api/no/such/thing');
    expect(api.status).toBe(404);
    expect(api.body.error).toMatch(/no API route/i);
    const page = await owner.client.request('GET', '/no-such-page');
    expect(page.status).toBe(404);
    expect(await page.text()).toContain('Nothing here');
  });

  it('answers a non-member opening a property page with the 404 page', async () => {
    const stranger = await signedInClient('stranger');
    const { body } = await owner.client.json<{ property: Property }>('POST', '/api/properties', { name: 'Private Downs', crs: 'EPSG:7854' });
    const page = await stranger.client.request('GET', `/app/properties/${body.property.id}`);
    expect(page.status).toBe(404);
    expect(await page.text()).not.toContain('Private Downs');
  });

  it('sends an anonymous visitor of /app to sign-in and back', async () => {
    const response = await new TestClient().request('GET', '/app/properties/1');
    expect(response.status).toBe(303);
    expect(response.headers.get('location')).toMatch(/\/sign-in\?callbackUrl=%2Fapp%2Fproperties%2F1$/);
  });

  it('sends the built client\'s files: bundles cached for a year and answered 304 to their ETag; a missing one gets the 404 page, a bad address 400', async () => {
    const bundle = readdirSync('dist/client/_astro').find((name) => name.endsWith('.js'))!;
    const first = await new TestClient().request('GET', `/_astro/${bundle}`);
    expect(first.status).toBe(200);
    expect(first.headers.get('content-type')).toMatch(/javascript/);
    expect(first.headers.get('cache-control')).toBe('public, max-age=31536000, immutable');
    // node:http, as a browser revalidating its cache does (fetch adds Cache-Control: no-cache to a conditional request).
    const again = await new Promise<number>((resolve, reject) =>
      get(new URL(`/_astro/${bundle}`, first.url), { headers: { 'If-None-Match': first.headers.get('etag')! } }, (answer) => resolve(answer.resume().statusCode!)).on('error', reject),
    );
    expect(again).toBe(304);
    const missing = await new TestClient().request('GET', '/_astro/no-such-file.js');
    expect(missing.status).toBe(404);
    expect(missing.headers.get('content-type')).toMatch(/text\/html/);
    expect((await new TestClient().request('GET', '/%E0%A4%A')).status).toBe(400);
    // A path climbing out of the client folder gets no file (send refuses it).
    for (const climb of ['/_astro/%2e%2e/%2e%2e/package.json', '/glyphs/%2e%2e%2f%2e%2e%2fserver%2fentry.mjs', '/_astro/%252e%252e/%252e%252e/package.json']) {
      const answer = await new TestClient().request('GET', climb);
      expect(answer.status, climb).not.toBe(200);
      expect(await answer.text(), climb).not.toMatch(/"name": "gullyline"|serverEntrypointModule|pageMap/);
    }
  });

  it('sets the security headers on every answer: pages, API answers, the client\'s files, a refused address', async () => {
    const bundle = readdirSync('dist/client/_astro').find((name) => name.endsWith('.js'))!;
    for (const route of ['/', '/api/health', '/sign-in', '/favicon.svg', `/_astro/${bundle}`, '/_astro/no-such-file.js', '/%E0%A4%A']) {
      const response = await new TestClient().request('GET', route);
      expect(response.headers.get('x-content-type-options')).toBe('nosniff');
      expect(response.headers.get('content-security-policy')).toMatch(/frame-ancestors 'none'/);
      expect(response.headers.get('content-security-policy')).toMatch(/default-src 'self'/);
    }
  });
});
