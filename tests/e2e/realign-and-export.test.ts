// The end of a planning session as a manager would go through it: accept a suggested square
// crossing for an oblique one, then download the plan. The download is checked with a
// general-purpose GeoJSON validator from the registry (@placemarkio/check-geojson) and for the
// RFC 7946 §3.1.6 winding order (exterior rings counterclockwise, by the shoelace sign).
import { check } from '@placemarkio/check-geojson';
import { readFileSync } from 'node:fs';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../scripts/demo-accounts';
import { appContext, launchBrowser, screenshot, seedDemoIntoTestServer, signInThroughPage, waitForMap } from '../helpers/browser';
import { drainageLines, fenceAcrossSegment, mainCreekPoint, propertyIdOf } from '../helpers/creek-fence';

let browser: Browser;
beforeAll(async () => {
  seedDemoIntoTestServer();
  browser = await launchBrowser();
});
afterAll(() => browser?.close());

/** Twice the signed area of a ring in degrees (positive when counterclockwise). */
const shoelace = (ring: number[][]) => ring.slice(1).reduce((sum, [x, y], i) => sum + (ring[i]![0]! * y! - x! * ring[i]![1]!), 0);

describe('realign and export', () => {
  it('accepts a square crossing for an oblique one, then downloads a valid GeoJSON plan with it', async () => {
    const manager = DEMO_ACCOUNTS.find((a) => a.role === 'manager')!;
    const { context, outsideRequests } = await appContext(browser);
    const page = await context.newPage();
    await signInThroughPage(page, manager.email, DEMO_PASSWORD);
    await page.waitForURL('**/app');
    await page.getByRole('link', { name: /Saltbush Rise/ }).first().click();
    await waitForMap(page);
    await page.getByTestId('crossing-row').first().waitFor({ timeout: 60_000 });

    // A fence of its own across the main creek at 35° (the demo's fences stay as other tests expect them).
    const propertyId = propertyIdOf(page);
    const { ends } = fenceAcrossSegment(await drainageLines(page, propertyId), mainCreekPoint(350), 35, 400);
    await page.evaluate(
      async ({ id, coordinates }) => {
        const response = await fetch(`/api/properties/${id}/fence-lines`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ name: 'Oblique test fence', coordinates }) });
        if (response.status !== 201) throw new Error(`fence not made: ${response.status}`);
      },
      { id: propertyId, coordinates: ends },
    );
    await page.reload();
    await waitForMap(page);
    await page.getByTestId('crossing-row').filter({ hasText: 'Oblique test fence' }).filter({ hasText: /3[3-7]°/ }).first().click();
    await page.getByTestId('crossing-detail').waitFor();
    await page.getByRole('button', { name: 'Suggest a square crossing' }).click();
    const preview = page.getByTestId('realign-preview');
    await preview.waitFor({ timeout: 30_000 });
    const suggested = Number(/crosses the channel at (\d+)°/.exec((await preview.textContent()) ?? '')?.[1]);
    expect(Math.abs(suggested - 90)).toBeLessThanOrEqual(10);
    await screenshot(page, 'realign-preview');
    await page.getByTestId('realign-accept').click();
    // The crossing found again on the moved fence is near square now.
    await expect.poll(async () => (await page.getByTestId('crossing-angle').textContent()) ?? '', { timeout: 30_000 }).toMatch(/(8\d|9\d)°/);

    await page.getByTestId('sheet-tab-files').click();
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('export-geojson').click()]);
    expect(download.suggestedFilename()).toMatch(/\.geojson$/);
    const text = readFileSync((await download.path())!, 'utf8');
    const plan = check(text) as { features: { geometry: { type: string; coordinates: unknown }; properties: Record<string, unknown> }[] };
    const fenceNames = plan.features.filter((f) => f.geometry.type === 'LineString').map((f) => JSON.stringify(f.properties));
    expect(fenceNames.some((p) => p.includes('Oblique test fence'))).toBe(true);
    for (const feature of plan.features.filter((f) => f.geometry.type === 'Polygon')) {
      const [outer, ...holes] = feature.geometry.coordinates as number[][][];
      expect(shoelace(outer!)).toBeGreaterThan(0);
      for (const hole of holes) expect(shoelace(hole)).toBeLessThan(0);
    }
    expect(plan.features.some((f) => f.geometry.type === 'Point')).toBe(true);
    expect(outsideRequests).toEqual([]);
    await context.close();
  }, 180_000);
});
