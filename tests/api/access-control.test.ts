// Access beyond roles: an object id of another property, sessions past their age, signed out,
// tampered with or signed by another secret, and invitation links guessed or used twice.
import { createHash, randomBytes } from 'node:crypto';
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { encode } from '@auth/core/jwt';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TestClient, closeServerDb, newAccount, serverDb, signedInClient } from '../helpers/api-client';

// The test server's secret (tests/helpers/global-server.ts) and Auth.js's cookie name over http,
// which is also the salt of the cookie's encryption key (@auth/core/jwt).
const SECRET = 'test-secret-that-is-long-enough-for-authjs-0123456789';
const COOKIE = 'authjs.session-token';

/** Every "METHOD /api/route" under src/pages/api whose path takes an object id besides the property's. */
function routesWithObjectIds(): { method: string; route: string; params: string[] }[] {
  const root = path.resolve('src/pages');
  const found: { method: string; route: string; params: string[] }[] = [];
  const walk = (dir: string) => {
    for (const entry of readdirSync(dir, { withFileTypes: true })) {
      const full = path.join(dir, entry.name);
      if (entry.isDirectory()) walk(full);
      else if (/\.(ts|js)$/.test(entry.name)) {
        const route = '/' + path.relative(root, full).replace(/\.(ts|js)$/, '').replace(/\/index$/, '').split(path.sep).join('/');
        // Not object ids: the property itself, an EPSG code, tile coordinates, and a contractor's
        // link token (a capability: whoever holds it reads that one order, by design).
        const params = [...route.matchAll(/\[([^\]]+)\]/g)].map((m) => m[1]!).filter((p) => !['id', 'code', 'z', 'x', 'y', 'token'].includes(p) && !p.startsWith('...'));
        if (params.length === 0) continue;
        const source = readFileSync(full, 'utf8');
        for (const match of source.matchAll(/export\s+(?:const|async\s+function|function)\s+(GET|POST|PUT|PATCH|DELETE|ALL)\b/g)) found.push({ method: match[1]!, route, params });
      }
    }
  };
  walk(path.join(root, 'api'));
  return found.sort((a, b) => `${a.route} ${a.method}`.localeCompare(`${b.route} ${b.method}`));
}

/** A body each change would accept if the object were the caller's, so only ownership decides. */
const BODIES: Record<string, unknown> = {
  'PATCH /api/properties/[id]/fence-lines/[fenceId]': { name: 'Taken over', version: 1 },
  'PATCH /api/properties/[id]/paddocks/[paddockId]': { name: 'Taken over', version: 1 },
  'PATCH /api/properties/[id]/crossings/[crossingId]': { floodMarkM: 1.1 },
  'POST /api/properties/[id]/crossings/[crossingId]/realignment': { version: 1 },
  'PATCH /api/properties/[id]/members/[userId]': { role: 'viewer' },
  'PATCH /api/properties/[id]/work-orders/[orderId]': { title: 'Taken over', version: 1 },
  'POST /api/properties/[id]/work-orders/[orderId]/send': { version: 1 },
  'PATCH /api/properties/[id]/work-orders/[orderId]/items/[itemId]': { state: 'done', note: '' },
  'PATCH /api/properties/[id]/inspection-rounds/[roundId]': { status: 'closed', version: 1 },
  'PATCH /api/properties/[id]/inspection-rounds/[roundId]/checks/[checkId]': { status: 'intact', note: '', version: 1 },
};

const now = () => new Date().toISOString();
/** Ids of one object of each kind in the victim's property, by the route parameter that names it. */
const victimIds: Record<string, number> = {};
let victimProperty = 0;
let attacker: TestClient;
let attackerProperty = 0;

async function insert(table: string, row: Record<string, unknown>): Promise<number> {
  const [inserted] = await serverDb()(table).insert(row).returning('id');
  return inserted.id as number;
}

/** Everything stored about the victim's property, to show a refused request changed none of it. */
async function victimState(): Promise<string> {
  const tables = [
    'fence_lines', 'crossings', 'paddocks', 'tracks', 'elevation_models', 'terrain_runs', 'invitations', 'memberships', 'audit_log', 'property_settings',
    'work_orders', 'rain_events', 'inspection_rounds', 'inspection_checks', 'inspection_photos',
  ];
  const state: Record<string, unknown> = {};
  for (const table of tables) state[table] = await serverDb()(table).where({ property_id: victimProperty }).orderBy(table === 'memberships' || table === 'property_settings' ? 'property_id' : 'id');
  return JSON.stringify(state);
}

beforeAll(async () => {
  const victim = await signedInClient('victim');
  victimProperty = (await victim.client.json<{ property: { id: number } }>('POST', '/api/properties', { name: 'Victim Downs', crs: 'EPSG:7854' })).body.property.id;
  const line = JSON.stringify({ type: 'LineString', coordinates: [[141.64, -31.44], [141.65, -31.44]] });
  const box = { min_lon: 141.64, min_lat: -31.44, max_lon: 141.65, max_lat: -31.43 };
  victimIds.fenceId = await insert('fence_lines', { property_id: victimProperty, name: 'Victim fence', status: 'planned', geometry: line, length_m: 950, wire_spec: '{}', ...box, created_at: now(), updated_at: now() });
  victimIds.crossingId = await insert('crossings', { property_id: victimProperty, fence_line_id: victimIds.fenceId, kind: 'crossing', lon: 141.645, lat: -31.44, chainage_m: 475 });
  victimIds.paddockId = await insert('paddocks', {
    property_id: victimProperty, name: 'Victim paddock', geometry: JSON.stringify({ type: 'Polygon', coordinates: [[[141.64, -31.44], [141.65, -31.44], [141.65, -31.43], [141.64, -31.44]]] }),
    area_ha: 48, ...box, version: 1, created_at: now(), updated_at: now(),
  });
  victimIds.trackId = await insert('tracks', { property_id: victimProperty, name: 'Victim track', kind: 'track', source_file: 'v.gpx', geometry: line, length_m: 950, ...box, created_at: now() });
  victimIds.modelId = await insert('elevation_models', {
    property_id: victimProperty, name: 'victim.tif', stored_file: 'elevation-models/victim/source.tif', size_bytes: 1, crs: 'EPSG:7854', crs_name: 'GDA2020 / MGA zone 54',
    width: 1, height: 1, cell_size_m: 5, extent_west: 141, extent_south: -32, extent_east: 142, extent_north: -31, created_at: now(),
  });
  victimIds.runId = await insert('terrain_runs', { property_id: victimProperty, elevation_model_id: victimIds.modelId, status: 'succeeded', percent: 100, threshold_ha: 5, created_at: now() });
  victimIds.invitationId = await insert('invitations', {
    property_id: victimProperty, email: newAccount('victim-invitee').email, role: 'crew', token_hash: createHash('sha256').update(randomBytes(24)).digest('hex'),
    expires_at: new Date(Date.now() + 86_400_000).toISOString(), created_at: now(),
  });
  victimIds.orderId = await insert('work_orders', { property_id: victimProperty, title: 'Victim order', status: 'sent', version: 1, created_at: now(), updated_at: now() });
  victimIds.itemId = await insert('work_order_items', { work_order_id: victimIds.orderId, fence_line_id: victimIds.fenceId, position: 1 });
  const rainEventId = await insert('rain_events', { property_id: victimProperty, fell_on: '2026-11-20', rainfall_mm: 40, scope: 'property', created_at: now() });
  victimIds.roundId = await insert('inspection_rounds', { property_id: victimProperty, rain_event_id: rainEventId, status: 'open', version: 1, created_at: now() });
  victimIds.checkId = await insert('inspection_checks', {
    property_id: victimProperty, round_id: victimIds.roundId, crossing_id: victimIds.crossingId, position: 1, crossing_label: 'Victim fence at 475 m', selected_by: 'property',
  });
  victimIds.photoId = await insert('inspection_photos', {
    property_id: victimProperty, check_id: victimIds.checkId, storage_key: `victim/${randomBytes(6).toString('hex')}.jpg`, thumbnail_key: `victim/${randomBytes(6).toString('hex')}-t.jpg`,
    content_type: 'image/jpeg', size_bytes: 1, width: 1, height: 1, created_at: now(),
  });
  const member = await signedInClient('victim-member');
  await serverDb()('memberships').insert({ property_id: victimProperty, user_id: member.userId, role: 'crew', created_at: now() });
  victimIds.userId = member.userId;

  // The attacker owns a property of their own and asks for the victim's objects under it.
  const other = await signedInClient('attacker');
  attacker = other.client;
  attackerProperty = (await attacker.json<{ property: { id: number } }>('POST', '/api/properties', { name: 'Attacker Station', crs: 'EPSG:7854' })).body.property.id;
}, 60_000);

afterAll(closeServerDb);

describe('an object id of another property', () => {
  const routes = routesWithObjectIds();

  it('covers every kind of object id the routes take (a new kind needs an object here)', () => {
    expect(routes.length).toBeGreaterThanOrEqual(19);
    const kinds = [...new Set(routes.flatMap((r) => r.params))].sort();
    expect(kinds).toEqual(['checkId', 'crossingId', 'fenceId', 'invitationId', 'itemId', 'modelId', 'orderId', 'paddockId', 'photoId', 'roundId', 'runId', 'trackId', 'userId']);
  });

  it.each(routes.map((r) => [`${r.method} ${r.route}`, r] as const))('%s answers 404 and changes nothing', async (key, { method, route, params }) => {
    const url = params.reduce((u, param) => {
      expect(victimIds[param], `no object of the victim's for [${param}]`).toBeDefined();
      return u.replace(`[${param}]`, String(victimIds[param]));
    }, route.replace('[id]', String(attackerProperty)).replace('[z]/[x]/[y]', '14/14638/9737'));
    const before = await victimState();
    const response = await attacker.request(method === 'ALL' ? 'GET' : method, url, BODIES[key]);
    expect(response.status, key).toBe(404);
    expect(((await response.json()) as { error: string }).error).toMatch(/\w{3,} .*\w{3,}/);
    expect(await victimState()).toBe(before);
  });

  it('the same reads by a manager of the victim\'s property reach the objects (so the 404s above are not typos)', async () => {
    const manager = await signedInClient('victim-manager');
    await serverDb()('memberships').insert({ property_id: victimProperty, user_id: manager.userId, role: 'manager', created_at: now() });
    const reads = [['fence-lines', 'fenceId'], ['paddocks', 'paddockId'], ['crossings', 'crossingId'], ['terrain-runs', 'runId'], ['work-orders', 'orderId'], ['inspection-rounds', 'roundId']] as const;
    for (const [route, param] of reads) {
      const response = await manager.client.request('GET', `/api/properties/${victimProperty}/${route}/${victimIds[param]}`);
      expect(response.status, route).toBe(200);
    }
    await serverDb()('memberships').where({ property_id: victimProperty, user_id: manager.userId }).delete();
  });
});

/** A session cookie as Auth.js writes it, for a user, signed with `secret`, expiring in `maxAge` seconds. */
async function forgedCookie(user: { id: number; email: string; name: string }, options: { secret?: string; maxAge?: number; sid?: string | null } = {}): Promise<string> {
  const token: Record<string, unknown> = { sub: String(user.id), email: user.email, name: user.name };
  if (options.sid !== null) token.sid = options.sid ?? `forged-${randomBytes(8).toString('hex')}`;
  return encode({ token, secret: options.secret ?? SECRET, salt: COOKIE, maxAge: options.maxAge ?? 3600 });
}

async function meWith(cookie: string): Promise<number> {
  const response = await fetch(`${new TestClient().baseUrl}/api/me`, { headers: { Cookie: `${COOKIE}=${cookie}` } });
  await response.text();
  return response.status;
}

/** The session cookie a client holds. */
function cookieOf(client: TestClient): string {
  const jar = (client as unknown as { cookies: Map<string, string> }).cookies;
  return jar.get(COOKIE)!;
}

async function signOut(client: TestClient): Promise<void> {
  const csrf = await client.json<{ csrfToken: string }>('GET', '/api/auth/csrf');
  await client.request('POST', '/api/auth/signout', new URLSearchParams({ csrfToken: csrf.body.csrfToken }).toString(), {
    'Content-Type': 'application/x-www-form-urlencoded',
    'X-Auth-Return-Redirect': '1',
  });
}

describe('sessions', () => {
  let user: { id: number; email: string; name: string };
  beforeAll(async () => {
    const account = newAccount('session');
    const id = await new TestClient().signUp(account);
    user = { id, email: account.email, name: account.name };
  });

  it('takes a well-made cookie within its age (the forged cookies below differ in one thing only)', async () => {
    expect(await meWith(await forgedCookie(user))).toBe(200);
  });

  it('refuses a cookie past its max age as signed out', async () => {
    expect(await meWith(await forgedCookie(user, { maxAge: -60 }))).toBe(401);
  });

  it('refuses a cookie signed with another secret, and one with a flipped byte, as signed out (not 500)', async () => {
    expect(await meWith(await forgedCookie(user, { secret: 'another-secret-that-is-long-enough-for-authjs-9876543210' }))).toBe(401);
    const good = await forgedCookie(user);
    for (const at of [0, Math.floor(good.length / 3), Math.floor(good.length / 2), good.length - 2]) {
      const flipped = good.slice(0, at) + (good[at] === 'A' ? 'B' : 'A') + good.slice(at + 1);
      expect(await meWith(flipped), `byte ${at}`).toBe(401);
    }
    expect(await meWith('not-a-token')).toBe(401);
  });

  it('refuses a cookie without a session id (signed before sign-out could revoke it)', async () => {
    expect(await meWith(await forgedCookie(user, { sid: null }))).toBe(401);
  });

  it('signing out revokes the session on the server: a copy of the cookie taken before no longer works', async () => {
    const account = newAccount('copied');
    const client = new TestClient();
    await client.signUp(account);
    await client.signIn(account.email, account.password);
    const copy = cookieOf(client);
    expect(await meWith(copy)).toBe(200);
    // Another device of the same person keeps its own session.
    const phone = new TestClient();
    await phone.signIn(account.email, account.password);

    // A revoked session past its expiry is no longer needed: the next sign-out removes it.
    const stale = `stale-${randomBytes(8).toString('hex')}`;
    await serverDb()('revoked_sessions').insert({ session_id: stale, user_id: null, expires_at: new Date(Date.now() - 60_000).toISOString(), revoked_at: now() });

    await signOut(client);
    expect(client.signedIn).toBe(false);
    expect(await serverDb()('revoked_sessions').where({ session_id: stale }).first()).toBeUndefined();
    expect(await meWith(copy)).toBe(401);
    expect((await phone.request('GET', '/api/me')).status).toBe(200);
    const revoked = await serverDb()('revoked_sessions').where('expires_at', '>', now()).count<{ n: number }[]>({ n: '*' });
    expect(Number(revoked[0]!.n)).toBeGreaterThanOrEqual(1);
  });
});

describe('invitation links', () => {
  it('a guessed token answers 404 with the reason, a used one 410', async () => {
    const { client, email } = await signedInClient('guesser');
    for (let i = 0; i < 5; i++) {
      const guessed = await client.json<{ error: string }>('POST', '/api/invitations/accept', { token: randomBytes(32).toString('base64url') });
      expect(guessed.status).toBe(404);
      expect(guessed.body.error).toMatch(/not valid/);
    }
    const token = randomBytes(32).toString('base64url');
    const [property] = await serverDb()('properties').where({ id: victimProperty }).select('id');
    await serverDb()('invitations').insert({
      property_id: property.id, email, role: 'viewer', token_hash: createHash('sha256').update(token).digest('hex'), expires_at: new Date(Date.now() + 86_400_000).toISOString(), created_at: now(),
    });
    expect((await client.json('POST', '/api/invitations/accept', { token })).status).toBe(200);
    const again = await client.json<{ error: string }>('POST', '/api/invitations/accept', { token });
    expect(again.status).toBe(410);
    expect(again.body.error).toMatch(/already been used/);
  });
});
