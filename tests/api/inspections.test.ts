import { readFileSync, readdirSync } from 'node:fs';
import path from 'node:path';
import exifr from 'exifr';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import { listCaughtMail } from '../../src/lib/server/mail/caught-mail';
import type { CheckView, RoundView } from '../../src/lib/schemas/inspection';
import { TestClient, closeServerDb, rowCounts, serverDb, signedInClient } from '../helpers/api-client';

type Person = { client: TestClient; userId: number; email: string };
const people = {} as Record<'owner' | 'manager' | 'crew' | 'crew2' | 'viewer' | 'outsider', Person>;
let propertyId = 0;
let otherPropertyId = 0;
const crossing = { small: 0, large: 0, middle: 0 };

// Two paddocks side by side (north and south of lat -31.44); no elevation model, so every
// crossing is placed in the rain by its point.
const NORTH = [[[141.64, -31.44], [141.66, -31.44], [141.66, -31.43], [141.64, -31.43]]];
const SOUTH = [[[141.64, -31.45], [141.66, -31.45], [141.66, -31.44], [141.64, -31.44]]];

/** A crossing row with the figures a round reads: position, catchment area, design style. */
async function insertCrossing(fenceLineId: number, lonLat: [number, number], areaHa: number, style: string | null, chainageM: number): Promise<number> {
  const design = style ? JSON.stringify({ layout: { style, floodgate: { lengthM: 20 } }, floods: { levelM: 1 } }) : null;
  const [row] = await serverDb()('crossings')
    .insert({
      property_id: propertyId, fence_line_id: fenceLineId, kind: 'crossing', lon: lonLat[0], lat: lonLat[1], chainage_m: chainageM, angle_deg: 85, angle_class: 'good',
      upstream_area_m2: areaHa * 10_000, design, design_status: style ? 'designed' : 'pending',
      // The list figures the analysis copies beside the design (crossing-row.ts).
      design_style: style, design_flood_level_m: style ? 1 : null, design_floodgate_length_m: style ? 20 : null,
    })
    .returning('id');
  return row.id;
}

async function mailsTo(to: string, atLeast: number) {
  const folder = path.join(inject('dataDir'), 'mail');
  for (let i = 0; i < 150; i++) {
    const found = (await listCaughtMail(folder, 500)).filter((mail) => mail.to === to);
    if (found.length >= atLeast) return found;
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  throw new Error(`fewer than ${atLeast} e-mails to ${to} arrived`);
}

const rainOnProperty = (fellOn: string, rainfallMm = 48) => ({ fellOn, rainfallMm, scope: 'property', note: 'Creek ran a banker overnight.' });

async function recordRain(client: TestClient, body: unknown) {
  return client.json<{ round: RoundView; error?: string; fields?: Record<string, string> }>('POST', `/api/properties/${propertyId}/rain-events`, body);
}

/** A multipart body as a phone's form sends it. */
async function form(parts: { checkId?: number | string; keepLocation?: boolean; file?: { bytes: Uint8Array; name: string; type: string } }) {
  const data = new FormData();
  if (parts.checkId !== undefined) data.set('checkId', String(parts.checkId));
  if (parts.keepLocation !== undefined) data.set('keepLocation', String(parts.keepLocation));
  if (parts.file) data.set('photo', new File([new Uint8Array(parts.file.bytes)], parts.file.name, { type: parts.file.type }));
  const encoded = new Response(data);
  return { bytes: new Uint8Array(await encoded.arrayBuffer()), type: encoded.headers.get('content-type')! };
}

async function upload(client: TestClient, parts: Parameters<typeof form>[0], property = propertyId) {
  const body = await form(parts);
  const response = await client.request('POST', `/api/properties/${property}/photos`, body.bytes, { 'Content-Type': body.type });
  return { status: response.status, body: (await response.json()) as { photo?: { id: number; url: string; thumbnailUrl: string; locationKept: boolean }; error?: string } };
}

/** A 1600 × 1200 JPEG with a GPS position in its EXIF (made here with sharp). */
const gpsJpeg = () =>
  sharp({ create: { width: 1600, height: 1200, channels: 3, background: { r: 150, g: 110, b: 70 } } })
    .jpeg()
    .withExif({ IFD3: { GPSLatitudeRef: 'S', GPSLatitude: '31/1 26/1 24/1', GPSLongitudeRef: 'E', GPSLongitude: '141/1 38/1 50/1' } })
    .toBuffer();

const photoFiles = () => {
  const folder = path.join(inject('dataDir'), 'photos');
  try {
    return readdirSync(folder, { recursive: true }).length;
  } catch {
    return 0;
  }
};

beforeAll(async () => {
  people.owner = await signedInClient('insp-owner');
  const created = await people.owner.client.json<{ property: { id: number } }>('POST', '/api/properties', { name: 'Bluebush Plain', crs: 'EPSG:7854' });
  propertyId = created.body.property.id;
  for (const role of ['manager', 'crew', 'crew2', 'viewer'] as const) {
    people[role] = await signedInClient(`insp-${role}`);
    await serverDb()('memberships').insert({ property_id: propertyId, user_id: people[role].userId, role: role === 'crew2' ? 'crew' : role, created_at: new Date().toISOString() });
  }
  people.outsider = await signedInClient('insp-outsider');
  otherPropertyId = (await people.outsider.client.json<{ property: { id: number } }>('POST', '/api/properties', { name: 'Mulga Downs', crs: 'EPSG:7854' })).body.property.id;

  const fence = await people.owner.client.json<{ fenceLine: { id: number } }>('POST', `/api/properties/${propertyId}/fence-lines`, { name: 'Boundary', coordinates: [[141.65, -31.445], [141.65, -31.435]] });
  for (const [name, rings] of [['North', NORTH], ['South', SOUTH]] as const) {
    const made = await people.owner.client.json('POST', `/api/properties/${propertyId}/paddocks`, { name, rings });
    expect(made.status).toBe(201);
  }
  // The fence line lies off any elevation model: its analysis finds no crossings, so these rows stay.
  crossing.small = await insertCrossing(fence.body.fenceLine.id, [141.65, -31.436], 35, 'continuous-floodgate', 100);
  crossing.large = await insertCrossing(fence.body.fenceLine.id, [141.651, -31.438], 240, 'drop-down-section', 300);
  crossing.middle = await insertCrossing(fence.body.fenceLine.id, [141.649, -31.443], 120, null, 700);
}, 60_000);
afterAll(closeServerDb);

describe('rain events and inspection rounds', () => {
  let round: RoundView;

  it('a manager records rain on the whole property: a round of every crossing, largest catchment first, and the crew is e-mailed the link', async () => {
    const answer = await recordRain(people.manager.client, rainOnProperty('2026-11-28', 64));
    expect(answer.status).toBe(201);
    round = answer.body.round;
    expect(round.checks.map((check) => check.crossingId)).toEqual([crossing.large, crossing.middle, crossing.small]);
    expect(round.checks.map((check) => check.position)).toEqual([1, 2, 3]);
    expect(round.status).toBe('open');
    const [large, middle, small] = round.checks as [CheckView, CheckView, CheckView];
    expect(large.statuses).toEqual(['intact', 'section-rehung', 'section-lost', 'damaged', 'washed-out']);
    expect(large.guide.join(' ')).toMatch(/drop-down section.*re-hang/i);
    expect(small.statuses).toEqual(['intact', 'tie-reset', 'damaged', 'washed-out']);
    expect(small.guide.join(' ')).toMatch(/breakaway tie/);
    expect(middle.style).toBeNull();

    const link = `${inject('baseUrl')}/app/properties/${propertyId}/inspections/${round.id}`;
    for (const crew of [people.crew, people.crew2]) {
      const [mail] = await mailsTo(crew.email, 1);
      expect(mail!.subject).toMatch(/Inspect 3 crossings on Bluebush Plain after 64 mm/);
      expect(mail!.text).toContain(link);
      expect(mail!.html).toContain(`href="${link}"`);
    }
    // Only the crew is e-mailed.
    const recipients = (await serverDb()('outbox').where('subject', 'like', '%Bluebush Plain%').pluck('to')) as string[];
    expect(recipients.sort()).toEqual([people.crew.email, people.crew2.email].sort());
    const audit = await serverDb()('audit_log').where({ property_id: propertyId, action: 'rain_event.create' }).first();
    expect(JSON.parse(audit.detail)).toMatchObject({ rainfallMm: 64, roundId: round.id });
  });

  it('rain on chosen paddocks: only the crossings lying in them (no catchment outline without a terrain run)', async () => {
    const paddocks = (await people.viewer.client.json<{ paddocks: { id: number; name: string }[] }>('GET', `/api/properties/${propertyId}/paddocks`)).body.paddocks;
    const north = paddocks.find((paddock) => paddock.name === 'North')!;
    const answer = await recordRain(people.owner.client, { fellOn: '2026-11-29', rainfallMm: 20, scope: 'paddocks', paddockIds: [north.id] });
    expect(answer.status).toBe(201);
    expect(answer.body.round.checks.map((check) => [check.crossingId, check.selectedBy])).toEqual([
      [crossing.large, 'point'],
      [crossing.small, 'point'],
    ]);
    expect(answer.body.round.rainEvent.paddockNames).toEqual(['North']);
  });

  it('refuses bad rain events with a message per field, storing nothing', async () => {
    const before = await rowCounts('rain_events', 'inspection_rounds', 'inspection_checks');
    const cases: [unknown, string][] = [
      [{ fellOn: '2026-02-30', rainfallMm: 10, scope: 'property' }, 'fellOn'],
      [{ fellOn: '2026-11-01', rainfallMm: -3, scope: 'property' }, 'rainfallMm'],
      [{ fellOn: '2026-11-01', rainfallMm: 10, scope: 'paddocks', paddockIds: [] }, 'paddockIds'],
      [{ fellOn: '2026-11-01', rainfallMm: 10, scope: 'paddocks', paddockIds: [999_999] }, 'paddockIds'],
    ];
    for (const [body, field] of cases) {
      const answer = await recordRain(people.manager.client, body);
      expect(answer.status, JSON.stringify(body)).toBe(422);
      expect(answer.body.fields?.[field], JSON.stringify(body)).toMatch(/\w{4,}/);
    }
    expect(await rowCounts('rain_events', 'inspection_rounds', 'inspection_checks')).toEqual(before);
  });

  it('a viewer and a crew member cannot record rain; crew can record a check, a viewer cannot; a stale edit is refused with 409', async () => {
    const before = await rowCounts('rain_events');
    expect((await recordRain(people.viewer.client, rainOnProperty('2026-11-30'))).status).toBe(403);
    expect((await recordRain(people.crew.client, rainOnProperty('2026-11-30'))).status).toBe(403);
    expect(await rowCounts('rain_events')).toEqual(before);

    const small = round.checks.find((check) => check.crossingId === crossing.small)!;
    const route = `/api/properties/${propertyId}/inspection-rounds/${round.id}/checks/${small.id}`;
    const refused = await people.viewer.client.json('PATCH', route, { status: 'intact', version: small.version });
    expect(refused.status).toBe(403);
    const saved = await people.crew.client.json<{ check: CheckView }>('PATCH', route, { status: 'tie-reset', note: 'Tie let go, re-set it.', version: small.version });
    expect(saved.status).toBe(200);
    expect(saved.body.check).toMatchObject({ status: 'tie-reset', note: 'Tie let go, re-set it.', version: small.version + 1 });
    // crew2 read the check before crew saved it.
    const stale = await people.crew2.client.json<{ error: string }>('PATCH', route, { status: 'damaged', version: small.version });
    expect(stale.status).toBe(409);
    expect(stale.body.error).toMatch(/Someone recorded this crossing/);
    const wrongStyle = await people.crew2.client.json<{ error: string }>('PATCH', route, { status: 'section-rehung', version: small.version + 1 });
    expect(wrongStyle.status).toBe(409);
    expect(await serverDb()('inspection_checks').where({ id: small.id }).first('status', 'version')).toEqual({ status: 'tie-reset', version: small.version + 1 });
    expect(await serverDb()('audit_log').where({ property_id: propertyId, action: 'inspection_check.update', entity_id: String(small.id) }).count<{ n: number }[]>({ n: '*' })).toEqual([{ n: 1 }]);
  });

  it('refuses bad photo uploads with a message, storing no row and no file', async () => {
    const checkId = round.checks[0]!.id;
    const before = { ...(await rowCounts('inspection_photos')), files: photoFiles() };
    const jpeg = await gpsJpeg();
    const cases: [string, Parameters<typeof form>[0], number, RegExp][] = [
      ['renamed non-image', { checkId, file: { bytes: new TextEncoder().encode('these are field notes, not a photo'), name: 'IMG_0001.jpg', type: 'image/jpeg' } }, 415, /not a photo.*JPEG/],
      ['zero bytes', { checkId, file: { bytes: new Uint8Array(0), name: 'IMG_0002.jpg', type: 'image/jpeg' } }, 400, /empty/],
      ['path-like name', { checkId, file: { bytes: jpeg, name: '../../x.jpg', type: 'image/jpeg' } }, 400, /folders or "\.\."/],
      ['no file', { checkId }, 400, /No photo/],
      ['no check', { file: { bytes: jpeg, name: 'IMG_0003.jpg', type: 'image/jpeg' } }, 400, /which crossing/],
      ['another property’s check', { checkId: 999_999, file: { bytes: jpeg, name: 'IMG_0004.jpg', type: 'image/jpeg' } }, 404, /check/],
      // Over the 20 MB default of MAX_PHOTO_BYTES.
      ['oversized', { checkId, file: { bytes: new Uint8Array(21 * 1024 * 1024), name: 'IMG_0005.jpg', type: 'image/jpeg' } }, 413, /too large.*20 MB/],
    ];
    for (const [name, parts, status, message] of cases) {
      const answer = await upload(people.crew.client, parts);
      expect(answer.status, name).toBe(status);
      expect(answer.body.error, name).toMatch(message);
    }
    const notForm = await people.crew.client.request('POST', `/api/properties/${propertyId}/photos`, new Uint8Array(jpeg), { 'Content-Type': 'image/jpeg' });
    expect(notForm.status).toBe(415);
    expect({ ...(await rowCounts('inspection_photos')), files: photoFiles() }).toEqual(before);
  });

  it('a GPS-tagged photo: another member downloads it without the location; kept when the uploader asks', async () => {
    const checkId = round.checks[0]!.id;
    const jpeg = await gpsJpeg();
    expect((await exifr.gps(jpeg)).latitude).toBeCloseTo(-31.44, 2);

    const stripped = await upload(people.crew.client, { checkId, keepLocation: false, file: { bytes: jpeg, name: 'IMG_0100.jpg', type: 'image/jpeg' } });
    expect(stripped.status).toBe(201);
    const download = await people.viewer.client.request('GET', stripped.body.photo!.url);
    expect(download.status).toBe(200);
    expect(download.headers.get('content-type')).toBe('image/jpeg');
    const bytes = new Uint8Array(await download.arrayBuffer());
    expect(await exifr.gps(bytes)).toBeUndefined();
    expect((await sharp(bytes).metadata()).width).toBe(1600);
    const thumbnail = await people.viewer.client.request('GET', stripped.body.photo!.thumbnailUrl);
    const thumbMeta = await sharp(new Uint8Array(await thumbnail.arrayBuffer())).metadata();
    expect([thumbMeta.width, thumbMeta.height]).toEqual([320, 240]);

    const kept = await upload(people.crew.client, { checkId, keepLocation: true, file: { bytes: jpeg, name: 'IMG_0101.jpg', type: 'image/jpeg' } });
    expect(kept.body.photo!.locationKept).toBe(true);
    const keptBytes = new Uint8Array(await (await people.manager.client.request('GET', kept.body.photo!.url)).arrayBuffer());
    expect((await exifr.gps(keptBytes)).longitude).toBeCloseTo(141.647, 2);

    // The round shows both photos on the check.
    const again = await people.viewer.client.json<{ round: RoundView }>('GET', `/api/properties/${propertyId}/inspection-rounds/${round.id}`);
    expect(again.body.round.checks[0]!.photos.map((photo) => photo.id)).toEqual([stripped.body.photo!.id, kept.body.photo!.id]);
  });

  it("another property's photo id is 404, as is a photo for someone outside the property", async () => {
    const photo = (await serverDb()('inspection_photos').where({ property_id: propertyId }).first('id')) as { id: number };
    const crossProperty = await people.outsider.client.json<{ error: string }>('GET', `/api/properties/${otherPropertyId}/photos/${photo.id}`);
    expect(crossProperty.status).toBe(404);
    expect(crossProperty.body.error).toMatch(/photo/);
    expect((await people.outsider.client.request('GET', `/api/properties/${propertyId}/photos/${photo.id}`)).status).toBe(404);
    expect((await new TestClient().request('GET', `/api/properties/${propertyId}/photos/${photo.id}`)).status).toBe(401);
  });

  it('a photo is removed by whoever sent it or a manager, not by other crew: row, audit entry and both files', async () => {
    const checkId = round.checks[0]!.id;
    const jpeg = await gpsJpeg();
    const sent = await upload(people.crew.client, { checkId, file: { bytes: jpeg, name: 'IMG_0200.jpg', type: 'image/jpeg' } });
    const other = await upload(people.crew.client, { checkId, file: { bytes: jpeg, name: 'IMG_0201.jpg', type: 'image/jpeg' } });
    const filesBefore = photoFiles();
    const route = (id: number) => `/api/properties/${propertyId}/photos/${id}`;

    const refused = await people.crew2.client.json<{ error: string }>('DELETE', route(sent.body.photo!.id));
    expect(refused.status).toBe(403);
    expect(refused.body.error).toMatch(/Only whoever sent a photo, an owner or a manager/);
    expect((await people.viewer.client.request('DELETE', route(sent.body.photo!.id))).status).toBe(403);
    expect(photoFiles()).toBe(filesBefore);

    expect((await people.crew.client.request('DELETE', route(sent.body.photo!.id))).status).toBe(204);
    expect((await people.manager.client.request('DELETE', route(other.body.photo!.id))).status).toBe(204);
    expect(await serverDb()('inspection_photos').whereIn('id', [sent.body.photo!.id, other.body.photo!.id])).toEqual([]);
    // Each photo is stored with its thumbnail: four files fewer.
    expect(photoFiles()).toBe(filesBefore - 4);
    expect((await people.viewer.client.request('GET', route(sent.body.photo!.id))).status).toBe(404);
    expect((await people.crew.client.request('DELETE', route(sent.body.photo!.id))).status).toBe(404);
    const removals = await serverDb()('audit_log').where({ property_id: propertyId, action: 'inspection_photo.delete' }).pluck('entity_id');
    expect(removals.sort()).toEqual([String(sent.body.photo!.id), String(other.body.photo!.id)].sort());
  });

  it('a crossing damaged in two rounds is flagged for redesign on the list and has both rounds in its history', async () => {
    const second = (await recordRain(people.manager.client, rainOnProperty('2026-12-01', 80))).body.round;
    for (const [r, status] of [[round, 'damaged'], [second, 'washed-out']] as const) {
      const check = r.checks.find((c) => c.crossingId === crossing.large)!;
      const current = (await people.crew.client.json<{ round: RoundView }>('GET', `/api/properties/${propertyId}/inspection-rounds/${r.id}`)).body.round.checks.find((c) => c.id === check.id)!;
      const saved = await people.crew.client.json('PATCH', `/api/properties/${propertyId}/inspection-rounds/${r.id}/checks/${check.id}`, { status, note: `${status} after the rain`, version: current.version });
      expect(saved.status).toBe(200);
    }
    const list = await people.viewer.client.json<{ features: { properties: { id: number; redesign: boolean } }[] }>('GET', `/api/properties/${propertyId}/crossings`);
    const flagged = list.body.features.filter((feature) => feature.properties.redesign).map((feature) => feature.properties.id);
    expect(flagged).toEqual([crossing.large]);
    const history = await people.viewer.client.json<{ inspections: { history: { roundId: number; status: string }[]; redesign: { suggestedStyle: string; reason: string } } }>(
      'GET',
      `/api/properties/${propertyId}/crossings/${crossing.large}/inspections`,
    );
    expect(history.body.inspections.history.filter((entry) => entry.status !== 'not-checked').map((entry) => [entry.roundId, entry.status])).toEqual([
      [second.id, 'washed-out'],
      [round.id, 'damaged'],
    ]);
    expect(history.body.inspections.redesign.suggestedStyle).toBe('continuous-floodgate');
    expect(history.body.inspections.redesign.reason).toMatch(/2026-11-28.*2026-12-01/);
  });

  it('a closed round refuses changes with 409 until reopened; a stale close is refused', async () => {
    const current = (await people.manager.client.json<{ round: RoundView }>('GET', `/api/properties/${propertyId}/inspection-rounds/${round.id}`)).body.round;
    const closed = await people.manager.client.json<{ round: RoundView }>('PATCH', `/api/properties/${propertyId}/inspection-rounds/${round.id}`, { status: 'closed', version: current.version });
    expect(closed.status).toBe(200);
    expect((await people.manager.client.json('PATCH', `/api/properties/${propertyId}/inspection-rounds/${round.id}`, { status: 'open', version: current.version })).status).toBe(409);
    const check = closed.body.round.checks[1]!;
    const refused = await people.crew.client.json<{ error: string }>('PATCH', `/api/properties/${propertyId}/inspection-rounds/${round.id}/checks/${check.id}`, { status: 'intact', version: check.version });
    expect(refused.status).toBe(409);
    expect(refused.body.error).toMatch(/closed/);
    expect((await people.crew.client.json('PATCH', `/api/properties/${propertyId}/inspection-rounds/${round.id}`, { status: 'open', version: closed.body.round.version })).status).toBe(403);
  });
});

describe('rain on chosen paddocks, with catchments traced from the terrain', () => {
  const DEM = new Uint8Array(readFileSync('data-samples/saltbush-rise-dem.tif'));
  const MANIFEST = JSON.parse(readFileSync('data-samples/saltbush-rise.json', 'utf8')) as { fenceLines: { name: string; pointsLonLat: [number, number][] }[] };
  let terrainPropertyId = 0;

  /** A square paddock `halfDeg` either side of a point. */
  const squareAround = ([lon, lat]: [number, number], halfDeg: number) => [[[lon - halfDeg, lat - halfDeg], [lon + halfDeg, lat - halfDeg], [lon + halfDeg, lat + halfDeg], [lon - halfDeg, lat + halfDeg]]];

  beforeAll(async () => {
    const owner = people.owner.client;
    terrainPropertyId = (await owner.json<{ property: { id: number } }>('POST', '/api/properties', { name: 'Saltbush Copy', crs: 'EPSG:7854' })).body.property.id;
    await serverDb()('memberships').insert({ property_id: terrainPropertyId, user_id: people.crew.userId, role: 'crew', created_at: new Date().toISOString() });
    const upload = await owner.request('POST', `/api/properties/${terrainPropertyId}/elevation-models?name=dem.tif`, DEM, { 'Content-Type': 'image/tiff' });
    expect(upload.status).toBe(201);
    // The terrain run is queued behind any other: on a busy two-core machine it takes a while.
    for (let i = 0; ; i++) {
      const run = await serverDb()('terrain_runs').where({ property_id: terrainPropertyId }).orderBy('id', 'desc').first('status');
      if (run?.status === 'succeeded') break;
      if (run?.status === 'failed' || i > 2400) throw new Error(`terrain run ended ${run?.status}`);
      await new Promise((resolve) => setTimeout(resolve, 100));
    }
    const fence = MANIFEST.fenceLines.find((line) => line.name === 'South cross fence')!.pointsLonLat;
    expect((await owner.json('POST', `/api/properties/${terrainPropertyId}/fence-lines`, { name: 'South cross fence', coordinates: fence })).status).toBe(201);
  }, 300_000);

  it('takes a crossing whose catchment reaches into a chosen paddock, though the crossing lies outside it', async () => {
    const [crossingRow] = (await serverDb()('crossings').where({ property_id: terrainPropertyId, kind: 'crossing' }).orderBy('upstream_area_m2', 'desc').select('id', 'lon', 'lat')) as { id: number; lon: number; lat: number }[];
    expect(crossingRow).toBeDefined();
    const at: [number, number] = [crossingRow!.lon, crossingRow!.lat];
    const catchment = await people.owner.client.json<{ catchment: { polygon: { coordinates: [number, number][][][] } } }>('GET', `/api/properties/${terrainPropertyId}/catchment?lon=${at[0]}&lat=${at[1]}&snapM=30`);
    expect(catchment.status).toBe(200);
    // The outline's corner farthest from the crossing: a small paddock there meets the catchment but not the crossing.
    const corners = catchment.body.catchment.polygon.coordinates.flat(2);
    const far = corners.reduce((best, corner) => (Math.hypot(corner[0] - at[0], corner[1] - at[1]) > Math.hypot(best[0] - at[0], best[1] - at[1]) ? corner : best));
    expect(Math.hypot(far[0] - at[0], far[1] - at[1])).toBeGreaterThan(0.005);
    const upstream = await people.owner.client.json<{ paddock: { id: number } }>('POST', `/api/properties/${terrainPropertyId}/paddocks`, { name: 'Upstream corner', rings: squareAround(far, 0.001) });
    expect(upstream.status).toBe(201);
    const answer = await people.owner.client.json<{ round: RoundView }>('POST', `/api/properties/${terrainPropertyId}/rain-events`, { fellOn: '2026-11-26', rainfallMm: 35, scope: 'paddocks', paddockIds: [upstream.body.paddock.id] });
    expect(answer.status).toBe(201);
    expect(answer.body.round.checks.find((check) => check.crossingId === crossingRow!.id)).toMatchObject({ selectedBy: 'catchment', position: 1 });

    // A paddock off the elevation model, far from every catchment: nothing to check.
    const away = await people.owner.client.json<{ paddock: { id: number } }>('POST', `/api/properties/${terrainPropertyId}/paddocks`, { name: 'Far away', rings: squareAround([141.3, -31.2], 0.002) });
    const none = await people.owner.client.json<{ round: RoundView }>('POST', `/api/properties/${terrainPropertyId}/rain-events`, { fellOn: '2026-11-27', rainfallMm: 12, scope: 'paddocks', paddockIds: [away.body.paddock.id] });
    expect(none.status).toBe(201);
    expect(none.body.round.checks).toEqual([]);
  }, 180_000);
});
