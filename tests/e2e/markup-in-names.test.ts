// Names are shown as text: a <script> or an <img onerror> typed into a property, fence line,
// paddock or member name, or carried in a KML placemark's name and description, appears as those
// characters and never runs (no dialog opens, the page's flag stays unset).
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TestClient, closeServerDb, newAccount, serverDb } from '../helpers/api-client';
import { appContext, launchBrowser, screenshot, signInThroughPage, waitForMap } from '../helpers/browser';

/** Markup that would set `window.__ran` and open an alert if it were ever run (under the 120 characters a name may have). */
const markup = (label: string) => `${label} <img src=x onerror="__ran='${label}';alert(1)"><script>__ran='${label}';alert(2)</script>`;
const NAMES = { property: markup('Property'), fence: markup('Fence'), paddock: markup('Paddock'), member: markup('Member'), track: markup('Track'), description: markup('Description') };

let browser: Browser;
let propertyId = 0;
const owner = newAccount('markup-owner');

beforeAll(async () => {
  browser = await launchBrowser();
  const client = new TestClient();
  await client.signUp(owner);
  await client.signIn(owner.email, owner.password);
  const created = await client.json<{ property: { id: number } }>('POST', '/api/properties', { name: NAMES.property, crs: 'EPSG:7854' });
  expect(created.status).toBe(201);
  propertyId = created.body.property.id;
  const fence = await client.json('POST', `/api/properties/${propertyId}/fence-lines`, { name: NAMES.fence, coordinates: [[141.64, -31.44], [141.65, -31.44]] });
  expect(fence.status).toBe(201);
  const paddock = await client.json('POST', `/api/properties/${propertyId}/paddocks`, { name: NAMES.paddock, rings: [[[141.64, -31.445], [141.65, -31.445], [141.65, -31.45]]] });
  expect(paddock.status).toBe(201);
  const escape = (text: string) => text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
  const kml = `<kml xmlns="http://www.opengis.net/kml/2.2"><Placemark><name>${escape(NAMES.track)}</name><description><![CDATA[${NAMES.description}]]></description><LineString><coordinates>141.64,-31.446 141.65,-31.447</coordinates></LineString></Placemark></kml>`;
  const track = await client.request('POST', `/api/properties/${propertyId}/tracks?name=markup.kml`, kml, { 'Content-Type': 'application/vnd.google-earth.kml+xml' });
  expect(track.status).toBe(201);
  const member = new TestClient();
  const memberId = await member.signUp({ ...newAccount('markup-member'), name: NAMES.member });
  await serverDb()('memberships').insert({ property_id: propertyId, user_id: memberId, role: 'crew', created_at: new Date().toISOString() });
}, 120_000);

afterAll(async () => {
  await closeServerDb();
  await browser?.close();
});

/** Opens a page watching for dialogs; `check` asserts nothing ran so far. */
async function watchedPage() {
  const { context, outsideRequests } = await appContext(browser);
  const page = await context.newPage();
  const dialogs: string[] = [];
  page.on('dialog', (dialog) => {
    dialogs.push(dialog.message());
    void dialog.dismiss();
  });
  const check = async (where: string) => {
    // Give an <img onerror> time to fire.
    await page.waitForTimeout(300);
    expect(await page.evaluate(() => (window as unknown as { __ran?: string }).__ran ?? null), where).toBeNull();
    expect(dialogs, where).toEqual([]);
    expect(await page.locator('img[src="x"]').count(), where).toBe(0);
    expect(outsideRequests, where).toEqual([]);
  };
  // The watch itself works: a dialog opened on purpose is caught, and the list starts empty again.
  await page.goto('/');
  await page.evaluate(() => alert('probe'));
  expect(dialogs).toEqual(['probe']);
  dialogs.length = 0;
  return { page, check, close: () => context.close() };
}

const shown = (page: Page, text: string) => page.getByText(text, { exact: false }).first();

describe('markup in names', () => {
  it('is shown as text on the property list, the workspace, the Files tab and the People page, and never runs', async () => {
    const { page, check, close } = await watchedPage();
    await signInThroughPage(page, owner.email, owner.password);
    await page.waitForURL('**/app');
    await shown(page, NAMES.property).waitFor();
    await check('property list');

    await page.goto(`/app/properties/${propertyId}`);
    await waitForMap(page);
    await shown(page, NAMES.property).waitFor();
    await page.getByTestId('sheet-tab-plan').click();
    await shown(page, NAMES.fence).waitFor();
    await shown(page, NAMES.paddock).waitFor();
    await check('workspace, Plan');
    await page.getByTestId('sheet-tab-files').click();
    // The KML name's markup was removed at import, leaving its text.
    await page.getByText('Track', { exact: true }).first().waitFor();
    await check('workspace, Files');
    await screenshot(page, 'markup-in-names-workspace');

    await page.goto(`/app/properties/${propertyId}/members`);
    await shown(page, NAMES.member).waitFor();
    await check('People page');
    await close();
  }, 180_000);

  it('keeps a KML description as plain text: its markup is removed before it is stored', async () => {
    const client = new TestClient();
    await client.signIn(owner.email, owner.password);
    const { body } = await client.json<{ tracks: { name: string; description: string }[] }>('GET', `/api/properties/${propertyId}/tracks`);
    const track = body.tracks.find((t) => t.name.startsWith('Track'))!;
    expect(track.description).toBe('Description');
    expect(track.name).toBe('Track');
  });
});
