// Files a person might pick by mistake, sent through the workspace's own upload controls: each
// gets a message naming what is wrong, and the property keeps exactly what it had.
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../scripts/demo-accounts';
import { appContext, launchBrowser, screenshot, seedDemoIntoTestServer, signInThroughPage, waitForMap } from '../helpers/browser';

let browser: Browser;
beforeAll(async () => {
  seedDemoIntoTestServer();
  browser = await launchBrowser();
});
afterAll(() => browser?.close());

/** Counts of what the property holds, read through the API as the signed-in manager. */
async function holdings(page: Page, propertyId: number) {
  return page.evaluate(async (id) => {
    const get = async (path: string) => (await fetch(`/api/properties/${id}/${path}`)).json();
    const [models, tracks, paddocks, fences] = await Promise.all([get('elevation-models'), get('tracks'), get('paddocks'), get('fence-lines')]);
    return { models: models.elevationModels.length, tracks: tracks.tracks.length, paddocks: paddocks.paddocks.length, fences: fences.fenceLines.length };
  }, propertyId);
}

describe('bad files through the workspace', () => {
  it('refuses a renamed non-GeoTIFF, an empty GPX and a KML with no lines, each with its reason, changing nothing', async () => {
    const account = DEMO_ACCOUNTS.find((a) => a.role === 'manager')!;
    const { context } = await appContext(browser);
    const page = await context.newPage();
    await signInThroughPage(page, account.email, DEMO_PASSWORD);
    await page.waitForURL('**/app');
    await page.getByRole('link', { name: /Saltbush Rise/ }).first().click();
    await waitForMap(page);
    const propertyId = Number(new URL(page.url()).pathname.split('/').at(-1));
    const before = await holdings(page, propertyId);

    // A PNG renamed .tif.
    await page.getByTestId('sheet-tab-terrain').click();
    const png = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c489', 'hex');
    await page.locator('#elevation-file').setInputFiles({ name: 'paddock-photo.tif', mimeType: 'image/tiff', buffer: png });
    await page.getByRole('button', { name: /Upload and find drainage lines/ }).click();
    const terrainAlert = page.getByTestId('terrain-panel').getByRole('alert');
    await terrainAlert.waitFor();
    expect(await terrainAlert.textContent()).toMatch(/GeoTIFF/i);

    // An empty GPX file.
    await page.getByTestId('sheet-tab-files').click();
    await page.getByTestId('track-file').setInputFiles({ name: 'walk.gpx', mimeType: 'application/gpx+xml', buffer: Buffer.from('') });
    const tracksAlert = page.getByTestId('tracks-error');
    await tracksAlert.waitFor();
    expect(await tracksAlert.textContent()).toMatch(/empty/i);

    // A KML with a placemark point and no lines.
    const kml = '<kml xmlns="http://www.opengis.net/kml/2.2"><Placemark><name>Gate</name><Point><coordinates>141.64,-31.44</coordinates></Point></Placemark></kml>';
    await page.getByTestId('track-file').setInputFiles({ name: 'gate.kml', mimeType: 'application/vnd.google-earth.kml+xml', buffer: Buffer.from(kml) });
    await expect.poll(async () => (await tracksAlert.textContent()) ?? '').toMatch(/no lines or polygons/i);
    await screenshot(page, 'bad-files');

    expect(await holdings(page, propertyId)).toEqual(before);
    await context.close();
  }, 120_000);
});
