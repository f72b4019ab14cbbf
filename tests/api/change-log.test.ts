import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeServerDb, serverDb, signedInClient } from '../helpers/api-client';

type Entry = { id: number; action: string; userName: string | null };

let owner: Awaited<ReturnType<typeof signedInClient>>;
let crew: Awaited<ReturnType<typeof signedInClient>>;
let propertyId = 0;

beforeAll(async () => {
  owner = await signedInClient('log-owner');
  crew = await signedInClient('log-crew');
  const created = await owner.client.json<{ property: { id: number } }>('POST', '/api/properties', { name: 'Change Log Downs', crs: 'EPSG:7854' });
  propertyId = created.body.property.id;
  // Added directly: this file is about reading the log, not about invitations.
  await serverDb()('memberships').insert({ property_id: propertyId, user_id: crew.userId, role: 'crew', created_at: new Date().toISOString() });
  const fence = await owner.client.json('POST', `/api/properties/${propertyId}/fence-lines`, {
    name: '<b>Creek</b> paddock north',
    coordinates: [[141.5, -31.5], [141.51, -31.5]],
  });
  expect(fence.status).toBe(201);
});
afterAll(closeServerDb);

describe('the change log', () => {
  it('answers owners and managers with the entries, filtered by group', async () => {
    const all = await owner.client.json<{ entries: Entry[]; older: number | null }>('GET', `/api/properties/${propertyId}/audit`);
    expect(all.body.entries.map((e) => e.action)).toEqual(['fence_line.create', 'property.create']);
    expect(all.body.older).toBeNull();
    const plan = await owner.client.json<{ entries: Entry[] }>('GET', `/api/properties/${propertyId}/audit?what=plan`);
    expect(plan.body.entries.map((e) => e.action)).toEqual(['fence_line.create']);
    const bad = await owner.client.json<{ fields: Record<string, string> }>('GET', `/api/properties/${propertyId}/audit?what=everything`);
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.body.fields)).toEqual(['what']);
  });

  it('shows the page to an owner, names in it as text, and tells crew the page is not for their role', async () => {
    const page = await owner.client.request('GET', `/app/properties/${propertyId}/changes?what=plan`);
    expect(page.status).toBe(200);
    const html = await page.text();
    expect(html).toContain('Change log');
    expect(html).toContain('Drew fence line “&lt;b&gt;Creek&lt;/b&gt; paddock north”');
    expect(html).not.toContain('<b>Creek</b>');
    const refused = await crew.client.request('GET', `/app/properties/${propertyId}/changes`);
    expect(refused.status).toBe(403);
    const refusal = await refused.text();
    expect(refusal).toContain('Not for your role');
    expect(refusal).toMatch(/needs the manager role or higher on this property; you are a crew/);
    // The crew's own tabs do not offer the page.
    expect(await (await crew.client.request('GET', `/app/properties/${propertyId}/costs`)).text()).not.toContain('/changes"');
  });
});
