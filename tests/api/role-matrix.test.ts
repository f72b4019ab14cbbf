// Every API route × every kind of caller → the status the route must answer.
// The route list is read from src/pages/api on disk, so a new route without an entry here (and
// so without a decided guard) fails this test, as does an entry for a route that is gone.
import { createHash, randomBytes } from 'node:crypto';
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TestClient, closeServerDb, newAccount, serverDb, signedInClient } from '../helpers/api-client';

const CALLERS = ['anonymous', 'outsider', 'viewer', 'crew', 'manager', 'owner'] as const;
type Caller = (typeof CALLERS)[number];
type Context = { propertyId: number; targetUserId: number; elevationModelId: number; runId: number; modelId?: number; fenceId?: number; trackId?: number; crossingId?: number; paddockId?: number; invitationId?: number; token?: string; orderId?: number; itemId?: number; roundId?: number; checkId?: number; photoId?: number };
type Entry = {
  expect: Record<Caller, number>;
  body?: (context: Context) => Promise<unknown> | unknown;
  /** A file body instead of JSON. */
  file?: { bytes: Uint8Array; type: string; query: string };
  /** A multipart form body instead of JSON, made per request. */
  form?: (context: Context) => Promise<FormData>;
  /** A query string for the route. */
  query?: string;
  /** Sets up what one request needs (e.g. a run that is still queued) and overrides route parameters. */
  prepare?: (context: Context) => Promise<Partial<Context>>;
};

const DEM = new Uint8Array(readFileSync('data-samples/saltbush-rise-dem.tif'));

/** A run row that waits in line (not started by the server), so it can be cancelled. */
async function queuedRun(context: Context): Promise<Partial<Context>> {
  const [row] = await serverDb()('terrain_runs')
    .insert({ property_id: context.propertyId, elevation_model_id: context.elevationModelId, status: 'queued', percent: 0, threshold_ha: 5, created_at: new Date().toISOString() })
    .returning('id');
  return { runId: row.id };
}

/** An elevation model row of its own (no file), for a delete to remove. */
async function spareModel(context: Context): Promise<Partial<Context>> {
  const [row] = await serverDb()('elevation_models')
    .insert({
      property_id: context.propertyId, name: 'spare.tif', stored_file: 'elevation-models/spare/source.tif', size_bytes: 1, crs: 'EPSG:7854',
      crs_name: 'GDA2020 / MGA zone 54', width: 1, height: 1, cell_size_m: 5, extent_west: 141, extent_south: -32, extent_east: 142, extent_north: -31,
      created_at: new Date().toISOString(),
    })
    .returning('id');
  return { modelId: row.id };
}

const FENCE = { name: 'Matrix fence', coordinates: [[141.64, -31.44], [141.65, -31.44]] };
const KML_FILE = new TextEncoder().encode(
  '<kml xmlns="http://www.opengis.net/kml/2.2"><Placemark><name>Old fence</name><LineString><coordinates>141.64,-31.44 141.65,-31.45</coordinates></LineString></Placemark></kml>',
);

// A plan file whose fence line lies off the elevation model (west of it): no crossings to design, so
// the terrain runs' re-analysis of the property stays as quick as before.
const PLAN_FILE = new TextEncoder().encode(
  JSON.stringify({
    type: 'FeatureCollection',
    features: [{ type: 'Feature', geometry: { type: 'LineString', coordinates: [[141.5, -31.5], [141.51, -31.5]] }, properties: { featureType: 'fence-line', name: 'Imported', status: 'planned' } }],
  }),
);

/** A fence line of its own for a change or a delete to act on. */
async function spareFence(context: Context): Promise<Partial<Context>> {
  const now = new Date().toISOString();
  const [row] = await serverDb()('fence_lines')
    .insert({
      property_id: context.propertyId, name: 'Spare', status: 'planned', geometry: JSON.stringify({ type: 'LineString', coordinates: FENCE.coordinates }),
      length_m: 950, wire_spec: '{}', min_lon: 141.64, min_lat: -31.44, max_lon: 141.65, max_lat: -31.44, created_at: now, updated_at: now,
    })
    .returning('id');
  return { fenceId: row.id };
}

async function spareTrack(context: Context): Promise<Partial<Context>> {
  const [row] = await serverDb()('tracks')
    .insert({
      property_id: context.propertyId, name: 'Spare track', kind: 'track', source_file: 'spare.gpx', geometry: JSON.stringify({ type: 'LineString', coordinates: FENCE.coordinates }),
      length_m: 950, min_lon: 141.64, min_lat: -31.44, max_lon: 141.65, max_lat: -31.44, created_at: new Date().toISOString(),
    })
    .returning('id');
  return { trackId: row.id };
}

const PADDOCK = { name: 'Matrix paddock', rings: [[[141.64, -31.44], [141.65, -31.44], [141.65, -31.43]]] };

/** A paddock of its own for a read, a change or a delete to act on. */
async function sparePaddock(context: Context): Promise<Partial<Context>> {
  const now = new Date().toISOString();
  const ring = [...PADDOCK.rings[0]!, PADDOCK.rings[0]![0]!];
  const [row] = await serverDb()('paddocks')
    .insert({
      property_id: context.propertyId, name: 'Spare paddock', geometry: JSON.stringify({ type: 'Polygon', coordinates: [ring] }), area_ha: 48,
      min_lon: 141.64, min_lat: -31.44, max_lon: 141.65, max_lat: -31.43, version: 1, created_at: now, updated_at: now,
    })
    .returning('id');
  return { paddockId: row.id };
}

/** A pending invitation of its own (for an address none of the callers has), for a revoke or an accept. */
async function spareInvitation(context: Context): Promise<Partial<Context>> {
  const token = `matrix-${randomBytes(24).toString('base64url')}`;
  const [row] = await serverDb()('invitations')
    .insert({
      property_id: context.propertyId, email: newAccount('invitee').email, role: 'crew', token_hash: createHash('sha256').update(token).digest('hex'),
      expires_at: new Date(Date.now() + 86_400_000).toISOString(), created_at: new Date().toISOString(),
    })
    .returning('id');
  return { invitationId: row.id, token };
}

/**
 * A work order of its own (one of the property's crossings) for a read, a change, a send or a
 * delete; `sent` puts it out for work, `link` gives it a contractor's link whose token the context carries.
 */
async function spareOrder(context: Context, options: { sent?: boolean; link?: boolean } = {}): Promise<Partial<Context>> {
  const crossing = await serverDb()('crossings').where({ property_id: context.propertyId }).orderBy('id').first('id');
  const now = new Date().toISOString();
  const token = `matrix-${randomBytes(24).toString('base64url')}`;
  const [order] = await serverDb()('work_orders')
    .insert({
      property_id: context.propertyId, title: 'Matrix order', status: options.sent ? 'sent' : 'draft', version: 1, contractor_email: 'matrix-fencer@contract.example',
      ...(options.link ? { link_token_hash: createHash('sha256').update(token).digest('hex'), link_expires_at: new Date(Date.now() + 86_400_000).toISOString() } : {}),
      created_at: now, updated_at: now,
    })
    .returning('id');
  const [item] = await serverDb()('work_order_items').insert({ work_order_id: order.id, crossing_id: crossing.id, position: 0 }).returning('id');
  return { orderId: order.id, itemId: item.id, token };
}

const MANIFEST = JSON.parse(readFileSync('data-samples/saltbush-rise.json', 'utf8')) as { fenceLines: { name: string; pointsLonLat: [number, number][] }[] };
const fenceNamed = (name: string) => MANIFEST.fenceLines.find((fence) => fence.name === name)!.pointsLonLat;

/** A fence across the main creek at 35° (data-samples), drawn anew, and its main-creek crossing. */
async function obliqueCrossing(context: Context): Promise<Partial<Context>> {
  const { body } = await clients.owner.json<{ fenceLine: { id: number } }>('POST', `/api/properties/${context.propertyId}/fence-lines`, {
    name: 'Oblique',
    coordinates: fenceNamed('South cross fence'),
  });
  const crossings = await serverDb()('crossings').where({ fence_line_id: body.fenceLine.id, kind: 'crossing' }).orderBy('upstream_area_m2', 'desc');
  return { crossingId: crossings[0].id };
}

/**
 * Waits until no run over the model is queued or running, so a new one may start. Each run also
 * designs the property's crossings again: on a busy two-core machine that takes tens of seconds.
 */
async function idleModel(context: Context): Promise<Partial<Context>> {
  for (let i = 0; i < 900; i++) {
    const busy = await serverDb()('terrain_runs').where({ elevation_model_id: context.elevationModelId }).whereIn('status', ['queued', 'running']).first('id');
    if (!busy) return {};
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  throw new Error('terrain runs did not finish');
}

/** A crossing the property has now: a terrain run redraws the crossings, so an id read earlier may be gone. */
async function currentCrossing(context: Context): Promise<Partial<Context>> {
  const row = await serverDb()('crossings').where({ property_id: context.propertyId }).orderBy('id', 'desc').first('id');
  return { crossingId: row.id };
}

/** A round of its own (a rain event on the whole property, recorded by the owner) with its first check. */
async function spareRound(context: Context): Promise<Partial<Context>> {
  const { body } = await clients.owner.json<{ round: { id: number; checks: { id: number }[] } }>('POST', `/api/properties/${context.propertyId}/rain-events`, { fellOn: '2026-11-20', rainfallMm: 30, scope: 'property' });
  return { roundId: body.round.id, checkId: body.round.checks[0]?.id ?? 0 };
}

const MATRIX_PHOTO = await sharp({ create: { width: 32, height: 24, channels: 3, background: '#8a6a4a' } }).jpeg().toBuffer();

function photoForm(checkId: number | undefined): FormData {
  const form = new FormData();
  form.set('checkId', String(checkId ?? 0));
  form.set('photo', new File([new Uint8Array(MATRIX_PHOTO)], 'photo.jpg', { type: 'image/jpeg' }));
  return form;
}

/** A photo of its own, uploaded by the owner to a spare round's first check. */
async function sparePhoto(context: Context): Promise<Partial<Context>> {
  const round = await spareRound(context);
  const encoded = new Response(photoForm(round.checkId));
  const response = await clients.owner.request('POST', `/api/properties/${context.propertyId}/photos`, new Uint8Array(await encoded.arrayBuffer()), { 'Content-Type': encoded.headers.get('content-type')! });
  const body = (await response.json()) as { photo: { id: number } };
  return { ...round, photoId: body.photo.id };
}

/**
 * The model's newest finished run: the runs started above replace the first run's drainage lines,
 * so its tiles are empty (204) by now.
 */
async function currentRun(context: Context): Promise<Partial<Context>> {
  await idleModel(context);
  const row = await serverDb()('terrain_runs').where({ elevation_model_id: context.elevationModelId, status: 'succeeded' }).orderBy('id', 'desc').first('id');
  return { runId: row.id };
}

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
  'GET /api/properties/[id]/invitations': { expect: atLeast('manager', 200) },
  'POST /api/properties/[id]/invitations': { expect: atLeast('manager', 201), body: () => ({ email: newAccount('invited').email, role: 'crew' }) },
  'DELETE /api/properties/[id]/invitations/[invitationId]': { expect: atLeast('manager', 204), prepare: spareInvitation },
  // Every signed-in caller holds a link meant for someone else's address: refused, whatever their role.
  'POST /api/invitations/accept': { expect: everyone(403), prepare: spareInvitation, body: ({ token }) => ({ token }) },
  'GET /api/properties/[id]/drainage-lines': { expect: atLeast('viewer', 200) },
  'GET /api/properties/[id]/catchment': { expect: atLeast('viewer', 200), query: '?lon=141.6455&lat=-31.4395&snapM=40' },
  'POST /api/properties/[id]/profile': { expect: atLeast('viewer', 200), body: () => ({ line: [[141.64, -31.44], [141.65, -31.44]] }) },
  'GET /api/properties/[id]/elevation-models': { expect: atLeast('viewer', 200) },
  'GET /api/properties/[id]/costs': { expect: atLeast('viewer', 200) },
  'GET /api/properties/[id]/materials.csv': { expect: atLeast('viewer', 200) },
  'GET /api/properties/[id]/exports/plan.geojson': { expect: atLeast('viewer', 200) },
  'GET /api/properties/[id]/exports/plan.kml': { expect: atLeast('viewer', 200) },
  'GET /api/properties/[id]/exports/waypoints.gpx': { expect: atLeast('viewer', 200) },
  'POST /api/properties/[id]/plan-import': { expect: atLeast('manager', 201), file: { bytes: PLAN_FILE, type: 'application/geo+json', query: '?name=plan.geojson' } },
  'GET /api/properties/[id]/crossings': { expect: atLeast('viewer', 200) },
  'POST /api/properties/[id]/crossings/analyse': { expect: atLeast('manager', 200) },
  'GET /api/properties/[id]/crossings/[crossingId]': { expect: atLeast('viewer', 200) },
  'PATCH /api/properties/[id]/crossings/[crossingId]': { expect: atLeast('manager', 200), body: () => ({ floodMarkM: 1.1 }) },
  'GET /api/properties/[id]/crossings/[crossingId]/realignment': { expect: atLeast('viewer', 200) },
  'POST /api/properties/[id]/crossings/[crossingId]/realignment': { expect: atLeast('manager', 200), prepare: obliqueCrossing, body: () => ({ version: 1 }) },
  'GET /api/properties/[id]/settings': { expect: atLeast('viewer', 200) },
  'PATCH /api/properties/[id]/settings': {
    expect: atLeast('manager', 200),
    body: async ({ propertyId }) => {
      const row = await serverDb()('property_settings').where({ property_id: propertyId }).first('version');
      return { version: row?.version ?? 0, designSettings: { freeboardM: 0.35 } };
    },
  },
  'GET /api/properties/[id]/fence-lines': { expect: atLeast('viewer', 200) },
  'POST /api/properties/[id]/fence-lines': { expect: atLeast('manager', 201), body: () => FENCE },
  'GET /api/properties/[id]/fence-lines/[fenceId]': { expect: atLeast('viewer', 200), prepare: spareFence },
  'PATCH /api/properties/[id]/fence-lines/[fenceId]': { expect: atLeast('manager', 200), prepare: spareFence, body: () => ({ name: 'Renamed', version: 1 }) },
  'DELETE /api/properties/[id]/fence-lines/[fenceId]': { expect: atLeast('manager', 204), prepare: spareFence },
  'GET /api/properties/[id]/paddocks': { expect: atLeast('viewer', 200) },
  'POST /api/properties/[id]/paddocks': { expect: atLeast('manager', 201), body: () => PADDOCK },
  'POST /api/properties/[id]/paddocks/from-fences': { expect: atLeast('manager', 201) },
  'GET /api/properties/[id]/paddocks/[paddockId]': { expect: atLeast('viewer', 200), prepare: sparePaddock },
  'PATCH /api/properties/[id]/paddocks/[paddockId]': { expect: atLeast('manager', 200), prepare: sparePaddock, body: () => ({ name: 'Renamed', version: 1 }) },
  'DELETE /api/properties/[id]/paddocks/[paddockId]': { expect: atLeast('manager', 204), prepare: sparePaddock },
  'GET /api/properties/[id]/elevation': { expect: atLeast('viewer', 200), query: '?lon=141.6455&lat=-31.4395' },
  'GET /api/properties/[id]/tracks': { expect: atLeast('viewer', 200) },
  'DELETE /api/properties/[id]/tracks/[trackId]': { expect: atLeast('manager', 204), prepare: spareTrack },
  'POST /api/properties/[id]/tracks': { expect: atLeast('manager', 201), file: { bytes: KML_FILE, type: 'application/vnd.google-earth.kml+xml', query: '?name=old.kml' } },
  'POST /api/properties/[id]/tracks/[trackId]/fence-line': { expect: atLeast('manager', 201), prepare: spareTrack },
  'POST /api/properties/[id]/elevation-models': {
    expect: atLeast('manager', 201),
    file: { bytes: DEM, type: 'image/tiff', query: '?name=saltbush-rise-dem.tif' },
  },
  'DELETE /api/properties/[id]/elevation-models/[modelId]': { expect: atLeast('manager', 204), prepare: spareModel },
  'POST /api/properties/[id]/terrain-runs': {
    expect: atLeast('manager', 201),
    prepare: idleModel,
    body: ({ elevationModelId }) => ({ elevationModelId, thresholdHa: 20 }),
  },
  'GET /api/properties/[id]/work-orders': { expect: atLeast('viewer', 200) },
  'POST /api/properties/[id]/work-orders': { expect: atLeast('manager', 201), prepare: spareFence, body: ({ fenceId }) => ({ title: 'Matrix order', fenceLineIds: [fenceId] }) },
  'GET /api/properties/[id]/work-orders/progress': { expect: atLeast('viewer', 200) },
  'GET /api/properties/[id]/work-orders/[orderId]': { expect: atLeast('viewer', 200), prepare: (c) => spareOrder(c) },
  'PATCH /api/properties/[id]/work-orders/[orderId]': { expect: atLeast('manager', 200), prepare: (c) => spareOrder(c), body: () => ({ version: 1, title: 'Renamed' }) },
  'DELETE /api/properties/[id]/work-orders/[orderId]': { expect: atLeast('manager', 204), prepare: (c) => spareOrder(c) },
  'POST /api/properties/[id]/work-orders/[orderId]/send': { expect: atLeast('manager', 200), prepare: (c) => spareOrder(c), body: () => ({ version: 1 }) },
  'GET /api/properties/[id]/work-orders/[orderId]/progress': { expect: atLeast('viewer', 200), prepare: (c) => spareOrder(c) },
  // Any crew member of the property marks work on a sent order, not only its assignee.
  'PATCH /api/properties/[id]/work-orders/[orderId]/items/[itemId]': { expect: atLeast('crew', 200), prepare: (c) => spareOrder(c, { sent: true }), body: () => ({ state: 'started', note: '' }) },
  // A contractor's read-only link: the token is the key, signed in or not.
  'GET /api/work-order-links/[token]': { expect: everyone(200, 200), prepare: (c) => spareOrder(c, { sent: true, link: true }) },
  'GET /api/properties/[id]/terrain-runs/[runId]': { expect: atLeast('viewer', 200) },
  'POST /api/properties/[id]/terrain-runs/[runId]/cancel': { expect: atLeast('manager', 200), prepare: queuedRun },
  'GET /api/properties/[id]/terrain-runs/[runId]/contours.geojson': { expect: atLeast('viewer', 200) },
  'GET /api/properties/[id]/terrain-runs/[runId]/hillshade.png': { expect: atLeast('viewer', 200) },
  'GET /api/properties/[id]/rain-events': { expect: atLeast('viewer', 200) },
  'POST /api/properties/[id]/rain-events': { expect: atLeast('manager', 201), body: () => ({ fellOn: '2026-11-21', rainfallMm: 25, scope: 'property' }) },
  'GET /api/properties/[id]/inspection-rounds/[roundId]': { expect: atLeast('viewer', 200), prepare: spareRound },
  'PATCH /api/properties/[id]/inspection-rounds/[roundId]': { expect: atLeast('manager', 200), prepare: spareRound, body: () => ({ status: 'closed', version: 1 }) },
  'PATCH /api/properties/[id]/inspection-rounds/[roundId]/checks/[checkId]': { expect: atLeast('crew', 200), prepare: spareRound, body: () => ({ status: 'intact', version: 1 }) },
  'POST /api/properties/[id]/photos': { expect: atLeast('crew', 201), prepare: spareRound, form: async ({ checkId }) => photoForm(checkId) },
  'GET /api/properties/[id]/photos/[photoId]': { expect: atLeast('viewer', 200), prepare: sparePhoto },
  // Sent by the owner: crew who did not send it may not remove it.
  'DELETE /api/properties/[id]/photos/[photoId]': { expect: atLeast('manager', 204), prepare: sparePhoto },
  'GET /api/properties/[id]/crossings/[crossingId]/inspections': { expect: atLeast('viewer', 200), prepare: currentCrossing },
  'GET /api/properties/[id]/crossings/redesign-flags': { expect: atLeast('viewer', 200) },
  'GET /api/properties/[id]/terrain-runs/[runId]/drainage/[z]/[x]/[y]': { expect: atLeast('viewer', 200), prepare: currentRun },
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
    .replace('[userId]', String(context.targetUserId))
    .replace('[runId]', String(context.runId))
    .replace('[modelId]', String(context.modelId ?? context.elevationModelId))
    .replace('[fenceId]', String(context.fenceId ?? 0))
    .replace('[trackId]', String(context.trackId ?? 0))
    .replace('[crossingId]', String(context.crossingId ?? 0))
    .replace('[paddockId]', String(context.paddockId ?? 0))
    .replace('[invitationId]', String(context.invitationId ?? 0))
    .replace('[orderId]', String(context.orderId ?? 0))
    .replace('[itemId]', String(context.itemId ?? 0))
    .replace('[token]', context.token ?? 'none')
    .replace('[roundId]', String(context.roundId ?? 0))
    .replace('[checkId]', String(context.checkId ?? 0))
    .replace('[photoId]', String(context.photoId ?? 0))
    .replace('[z]/[x]/[y]', `${CREEK_TILE.z}/${CREEK_TILE.x}/${CREEK_TILE.y}`);
}

/**
 * The zoom-14 tile over a point of the demo's main creek (data-samples manifest), which holds
 * drainage lines; slippy-map tile numbers from OpenStreetMap wiki, "Slippy map tilenames".
 */
const CREEK_TILE = (() => {
  const creeks = (JSON.parse(readFileSync('data-samples/saltbush-rise.json', 'utf8')) as { creeks: { name: string; centrelineLonLat: [number, number][] }[] }).creeks;
  const line = creeks.find((creek) => /main/i.test(creek.name))!.centrelineLonLat;
  const [lon, lat] = line[Math.floor(line.length / 2)]!;
  const n = 2 ** 14;
  return { z: 14, x: Math.floor(((lon + 180) / 360) * n), y: Math.floor(((1 - Math.asinh(Math.tan((lat * Math.PI) / 180)) / Math.PI) / 2) * n) };
})();

const clients = {} as Record<Caller, TestClient>;
const context: Context = { propertyId: 0, targetUserId: 0, elevationModelId: 0, runId: 0 };

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
  // One finished terrain run, for the routes that read a run and its map files.
  const upload = await owner.client.request('POST', `/api/properties/${context.propertyId}/elevation-models?name=dem.tif`, DEM, { 'Content-Type': 'image/tiff' });
  const uploaded = (await upload.json()) as { elevationModel: { id: number }; run: { id: number } };
  context.elevationModelId = uploaded.elevationModel.id;
  context.runId = uploaded.run.id;
  await idleModel(context);
  // A fence square across the main creek (data-samples), for the routes that read a crossing.
  Object.assign(context, await obliqueCrossing(context));
}, 60_000);

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
      const here = { ...context, ...(entry.prepare ? await entry.prepare(context) : {}) };
      const requestMethod = method === 'ALL' ? 'GET' : method;
      const form = entry.form ? new Response(await entry.form(here)) : undefined;
      const response = form
        ? await clients[caller].request(requestMethod, fill(route, here), new Uint8Array(await form.arrayBuffer()), { 'Content-Type': form.headers.get('content-type')! })
        : entry.file
        ? await clients[caller].request(requestMethod, fill(route, here) + entry.file.query, entry.file.bytes, { 'Content-Type': entry.file.type })
        : await clients[caller].request(requestMethod, fill(route, here) + (entry.query ?? ''), entry.body ? await entry.body(here) : undefined);
      expect(response.status).toBe(expected);
      if (response.status >= 400) {
        const answer = (await response.json()) as { error?: string };
        expect(answer.error, 'every refusal explains itself').toMatch(/\w{3,}/);
      }
    }, 120_000);
  }
});
