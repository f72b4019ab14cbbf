// Low limits for this file only: the configuration is read on first use, after these lines.
process.env.MAX_FENCE_LINES_PER_PROPERTY = '3';
process.env.MAX_FENCE_VERTICES = '10';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fenceLineInputSchema } from '../../../src/lib/schemas/plan';
import { parseConfig } from '../../../src/lib/server/config';
import { closeDb, db, ensureMigrated } from '../../../src/lib/server/db';
import { ConflictError, DomainError, parseWith, ValidationError } from '../../../src/lib/server/http';
import { importPlanFile } from '../../../src/lib/server/plan-import';
import { createFenceLine, listFenceLines, serverFenceLineSchemas, updateFenceLine } from '../../../src/lib/server/repos/fence-lines';
import { createProperty } from '../../../src/lib/server/repos/properties';
import { createUser } from '../../../src/lib/server/repos/users';

const line = (n: number, lat = -37.1): [number, number][] => Array.from({ length: n }, (_, i) => [141.9 + i * 0.001, lat] as [number, number]);
const SECRET = { AUTH_SECRET: 'x'.repeat(32) };

let userId = 0;
beforeAll(async () => {
  await ensureMigrated();
  userId = (await createUser({ email: 'limits@test.example', name: 'Limits', passwordHash: 'hash' })).id;
});
afterAll(closeDb);

describe('limit settings', () => {
  it('have sane defaults', () => {
    const config = parseConfig(SECRET);
    expect(config.maxFenceVertices).toBe(5000);
    expect(config.maxFenceLinesPerProperty).toBe(5000);
    expect(config.expensiveRequestsPerMinute).toBe(30);
  });

  it('are read from the environment', () => {
    const config = parseConfig({ ...SECRET, MAX_FENCE_VERTICES: '20000', MAX_FENCE_LINES_PER_PROPERTY: '12', EXPENSIVE_REQUESTS_PER_MINUTE: '5' });
    expect([config.maxFenceVertices, config.maxFenceLinesPerProperty, config.expensiveRequestsPerMinute]).toEqual([20000, 12, 5]);
  });

  it('refuse a value that is not a positive whole number, naming the setting', () => {
    expect(() => parseConfig({ ...SECRET, EXPENSIVE_REQUESTS_PER_MINUTE: 'lots' })).toThrow(/EXPENSIVE_REQUESTS_PER_MINUTE: Expected number/);
    expect(() => parseConfig({ ...SECRET, MAX_FENCE_LINES_PER_PROPERTY: '0' })).toThrow(/MAX_FENCE_LINES_PER_PROPERTY: Number must be greater than 0/);
    expect(() => parseConfig({ ...SECRET, MAX_FENCE_VERTICES: '1.5' })).toThrow(/MAX_FENCE_VERTICES: Expected integer/);
  });
});

describe('vertices per fence line', () => {
  it('follow MAX_FENCE_VERTICES with the schema message', () => {
    const schema = serverFenceLineSchemas().input;
    expect(parseWith(schema, { name: 'Ten', coordinates: line(10) }).coordinates).toHaveLength(10);
    expect(() => parseWith(schema, { name: 'Eleven', coordinates: line(11) })).toThrow(ValidationError);
    try {
      parseWith(schema, { name: 'Eleven', coordinates: line(11) });
    } catch (error) {
      expect((error as ValidationError).fields).toEqual({ coordinates: 'Keep a fence line under 10 points.' });
    }
  });

  it('are checked when a fence line is changed', async () => {
    const property = await createProperty({ name: 'Vertex limit', region: '', crs: 'EPSG:7854' }, userId);
    const fence = await createFenceLine(property.id, fenceLineInputSchema.parse({ name: 'Short', coordinates: line(3) }), userId);
    await expect(updateFenceLine(property.id, fence.id, { coordinates: line(11), version: fence.version }, userId)).rejects.toThrow(/Keep a fence line under 10 points/);
    expect((await listFenceLines(property.id))[0]!.coordinates).toHaveLength(3);
  });
});

describe('fence lines per property', () => {
  it('refuses one more past MAX_FENCE_LINES_PER_PROPERTY with 409, storing nothing', async () => {
    const property = await createProperty({ name: 'Full', region: '', crs: 'EPSG:7854' }, userId);
    for (let i = 0; i < 3; i += 1) await createFenceLine(property.id, fenceLineInputSchema.parse({ name: `F${i}`, coordinates: line(2, -37.1 - i * 0.01) }), userId);
    const refused = createFenceLine(property.id, fenceLineInputSchema.parse({ name: 'One too many', coordinates: line(2, -37.2) }), userId);
    await expect(refused).rejects.toBeInstanceOf(ConflictError);
    await expect(refused).rejects.toThrow('This property has 3 fence lines and holds at most 3, so another fence line cannot be added. Delete fence lines that are no longer needed (retired ones, for example) and try again.');
    expect(await listFenceLines(property.id)).toHaveLength(3);
  });

  it('refuses a plan import that would pass the limit, importing nothing', async () => {
    const property = await createProperty({ name: 'Nearly full', region: '', crs: 'EPSG:7854' }, userId);
    await createFenceLine(property.id, fenceLineInputSchema.parse({ name: 'Existing', coordinates: line(2) }), userId);
    const plan = {
      type: 'FeatureCollection',
      features: [0, 1, 2].map((i) => ({
        type: 'Feature',
        geometry: { type: 'LineString', coordinates: line(2, -37.3 - i * 0.01) },
        properties: { featureType: 'fence-line', name: `Imported ${i}` },
      })),
    };
    const request = new Request('http://localhost/import', { method: 'POST', body: JSON.stringify(plan) });
    const auditBefore = await db()('audit_log').where({ property_id: property.id }).count<{ n: number }[]>({ n: '*' });
    const refused = importPlanFile(property.id, userId, 'plan.geojson', request);
    await expect(refused).rejects.toBeInstanceOf(DomainError);
    await expect(refused).rejects.toMatchObject({ status: 422, message: expect.stringMatching(/^Nothing was imported: This property has 1 fence line and holds at most 3, so 3 fence lines cannot be added/) });
    expect(await listFenceLines(property.id)).toHaveLength(1);
    const auditAfter = await db()('audit_log').where({ property_id: property.id }).count<{ n: number }[]>({ n: '*' });
    expect(auditAfter).toEqual(auditBefore);
  });
});
