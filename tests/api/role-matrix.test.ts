// Every API route × every kind of caller → the status the route must answer.
// The route list is read from src/pages/api on disk, so a new route without an entry here (and
// so without a decided guard) fails this test, as does an entry for a route that is gone.
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TestClient, closeServerDb, newAccount, serverDb, signedInClient } from '../helpers/api-client';

const CALLERS = ['anonymous', 'outsider', 'viewer', 'crew', 'manager', 'owner'] as const;
type Caller = (typeof CALLERS)[number];
type Context = { propertyId: number; targetUserId: number };
type Entry = { expect: Record<Caller, number>; body?: (context: Context) => Promise<unknown> | unknown };

const everyone = (status: number, anonymous = 401): Record<Caller, number> => ({
  anonymous, outsider: status, viewer: status, crew: status, manager: status, owner: status,
});
const atLeast = (minimum: Exclude<Caller, 'anonymous' | 'outsider'>, ok: number): Record<Caller, number> => {
  const order = ['viewer', 'crew', 'manager', 'owner'] as const;
  const rank = order.indexOf(minimum);
  return {
    anonymous: 401,
    outsider: 404, // not a member: the property is not revealed
    viewer: rank <= 0 ? ok : 403,
    crew: rank <= 1 ? ok : 403,
    manager: rank <= 2 ? ok : 403,
    owner: ok,
  };
};

const MATRIX: Record<string, Entry> = {
  'ALL /api/[...path]': { expect: everyone(404) },
  'POST /api/accounts': { expect: everyone(201, 201), body: () => newAccount('matrix') },
  'GET /api/crs/[code]': { expect: everyone(200) },
  'GET /api/health': { expect: everyone(200, 200) },
  'GET /api/me': { expect: everyone(200) },
  'GET /api/properties': { expect: everyone(200) },
  'POST /api/properties': { expect: everyone(201), body: () => ({ name: 'Matrix block', crs: 'EPSG:7854' }) },
  'GET /api/properties/[id]': { expect: atLeast('viewer', 200) },
  'PATCH /api/properties/[id]': {
    expect: atLeast('manager', 200),
    body: async ({ propertyId }) => {
      const row = await serverDb()('properties').where({ id: propertyId }).first('version');
      return { region: 'Matrix region', version: row.version };
    },
  },
  'GET /api/properties/[id]/audit': { expect: atLeast('manager', 200) },
  'GET /api/properties/[id]/members': { expect: atLeast('viewer', 200) },
  'PATCH /api/properties/[id]/members/[userId]': { expect: atLeast('owner', 200), body: () => ({ role: 'viewer' }) },
  'DELETE /api/properties/[id]/members/[userId]': { expect: atLeast('owner', 204) },
};

/** Every "METHOD /api/route" exported by a file under src/pages/api. */
function routesOnDisk(): string[] {
  const root = path.resolve('src/pages');
  const found: string[] = [];
  const walk = (dir: string) => {
    for (const entry of readdirSync(dir, { withFileTypes: true })) {
      const full = path.join(dir, entry.name);
      if (entry.isDirectory()) walk(full);
      else if (/\.(ts|js)$/.test(entry.name)) {
        const route = '/' + path.relative(root, full).replace(/\.(ts|js)$/, '').replace(/\/index$/, '').split(path.sep).join('/');
        const source = readFileSync(full, 'utf8');
        for (const match of source.matchAll(/export\s+(?:const|async\s+function|function)\s+(GET|POST|PUT|PATCH|DELETE|ALL)\b/g)) {
          found.push(`${match[1]} ${route}`);
        }
      }
    }
  };
  walk(path.join(root, 'api'));
  return found.sort();
}

function fill(route: string, context: Context): string {
  return route
    .replace('[...path]', 'no-such-route')
    .replace('[code]', 'EPSG:7854')
    .replace('[id]', String(context.propertyId))
    .replace('[userId]', String(context.targetUserId));
}

const clients = {} as Record<Caller, TestClient>;
const context: Context = { propertyId: 0, targetUserId: 0 };

beforeAll(async () => {
  clients.anonymous = new TestClient();
  const owner = await signedInClient('owner');
  clients.owner = owner.client;
  const created = await owner.client.json<{ property: { id: number } }>('POST', '/api/properties', { name: 'Matrix Downs', crs: 'EPSG:7854' });
  context.propertyId = created.body.property.id;
  for (const role of ['viewer', 'crew', 'manager'] as const) {
    const member = await signedInClient(role);
    clients[role] = member.client;
    await serverDb()('memberships').insert({ property_id: context.propertyId, user_id: member.userId, role, created_at: new Date().toISOString() });
  }
  const outsider = await signedInClient('outsider');
  clients.outsider = outsider.client;
  await outsider.client.json('POST', '/api/properties', { name: 'Elsewhere Station', crs: 'EPSG:7855' });
  const target = await signedInClient('target');
  context.targetUserId = target.userId;
});

afterAll(closeServerDb);

/** The member that role changes and removals act on is put back before every request. */
async function resetTarget() {
  await serverDb()('memberships')
    .insert({ property_id: context.propertyId, user_id: context.targetUserId, role: 'crew', created_at: new Date().toISOString() })
    .onConflict(['property_id', 'user_id'])
    .merge({ role: 'crew' });
}

describe('role matrix', () => {
  it('has an entry for every API route on disk, and none for routes that are gone', () => {
    expect(Object.keys(MATRIX).sort()).toEqual(routesOnDisk());
  });

  for (const [key, entry] of Object.entries(MATRIX)) {
    const [method, route] = key.split(' ') as [string, string];
    it.each(CALLERS.map((caller) => [caller, entry.expect[caller]] as const))(`${key} as %s → %i`, async (caller, expected) => {
      await resetTarget();
      const body = entry.body ? await entry.body(context) : undefined;
      const requestMethod = method === 'ALL' ? 'GET' : method;
      const response = await clients[caller].request(requestMethod, fill(route, context), body);
      expect(response.status).toBe(expected);
      if (response.status >= 400) {
        const answer = (await response.json()) as { error?: string };
        expect(answer.error, 'every refusal explains itself').toMatch(/\w{3,}/);
      }
    });
  }
});
