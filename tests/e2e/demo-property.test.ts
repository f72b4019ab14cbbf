import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../scripts/demo-accounts';
import { appContext, launchBrowser, screenshot, seedDemoIntoTestServer, signInThroughPage, waitForMap } from '../helpers/browser';

let browser: Browser;
beforeAll(async () => {
  seedDemoIntoTestServer();
  browser = await launchBrowser();
});
afterAll(() => browser?.close());

describe('the demo property', () => {
  it('opens for the demo manager with its extent and name drawn in Noto Sans from the app', async () => {
    const manager = DEMO_ACCOUNTS.find((account) => account.role === 'manager')!;
    const { context, outsideRequests } = await appContext(browser);
    const page = await context.newPage();
    const glyphAnswers: number[] = [];
    page.on('response', (response) => {
      if (response.url().includes('/glyphs/')) glyphAnswers.push(response.status());
    });
    await signInThroughPage(page, manager.email, DEMO_PASSWORD);
    await page.waitForURL('**/app');
    await page.getByRole('link', { name: /Saltbush Rise/ }).click();
    await waitForMap(page);
    const labels = await page.evaluate(
      () => window.__gullylineMap!.queryRenderedFeatures({ layers: ['property-extent-label'] }).map((f) => f.properties.name),
    );
    expect(labels).toContain('Saltbush Rise');
    expect(glyphAnswers.length).toBeGreaterThan(0);
    expect(glyphAnswers.every((status) => status === 200)).toBe(true);
    await screenshot(page, 'demo-workspace');

    await page.setViewportSize({ width: 390, height: 800 });
    await screenshot(page, 'demo-workspace-phone');
    expect(outsideRequests).toEqual([]);
    await context.close();
  });

  it('takes the demo elevation model through the upload form with a progress bar, then draws drainage lines over hillshade and contours', async () => {
    const manager = DEMO_ACCOUNTS.find((account) => account.role === 'manager')!;
    const { context, outsideRequests } = await appContext(browser);
    const page = await context.newPage();
    await signInThroughPage(page, manager.email, DEMO_PASSWORD);
    await page.waitForURL('**/app');
    await page.getByRole('link', { name: /Saltbush Rise/ }).click();
    await waitForMap(page);
    await page.getByTestId('sheet-tab-terrain').click();
    await page.getByLabel('Elevation model (GeoTIFF)').setInputFiles('data-samples/saltbush-rise-dem.tif');
    await page.getByRole('button', { name: 'Upload and find drainage lines' }).click();
    // The bar shows the upload and then each stage of the terrain run.
    const bar = page.getByRole('progressbar');
    await bar.waitFor({ timeout: 10_000 });
    const labels = new Set<string>();
    while (await bar.count()) {
      labels.add((await bar.getAttribute('aria-label').catch(() => null)) ?? '');
      await page.waitForTimeout(50);
    }
    expect([...labels].filter(Boolean).length).toBeGreaterThan(0);
    // The seed's own model finishes too (the server picks it up within seconds): two are done.
    await expect.poll(() => page.getByTestId('terrain-run-done').count(), { timeout: 60_000 }).toBe(2);
    await waitForMap(page);
    // One drainage layer per terrain run (drainage-lines-<runId>), drawn from vector tiles.
    await page.waitForFunction(
      () => {
        const map = window.__gullylineMap!;
        const layers = map.getStyle().layers.map((layer) => layer.id).filter((id) => id.startsWith('drainage-lines-'));
        return layers.length > 0 && map.queryRenderedFeatures({ layers }).length > 10;
      },
      undefined,
      { timeout: 15_000 },
    );
    const layers = await page.evaluate(() => window.__gullylineMap!.getStyle().layers.map((layer) => layer.id));
    expect(layers.some((id) => id.startsWith('hillshade-'))).toBe(true);
    expect(layers.some((id) => id.startsWith('contours-'))).toBe(true);
    await screenshot(page, 'demo-terrain-done');
    expect(outsideRequests).toEqual([]);
    await context.close();
  });

  it('shows a viewer the terrain but no upload form', async () => {
    const viewer = DEMO_ACCOUNTS.find((account) => account.role === 'viewer')!;
    const { context } = await appContext(browser);
    const page = await context.newPage();
    await signInThroughPage(page, viewer.email, DEMO_PASSWORD);
    await page.waitForURL('**/app');
    await page.getByRole('link', { name: /Saltbush Rise/ }).click();
    await page.getByTestId('sheet-tab-terrain').click();
    await page.getByTestId('terrain-panel').waitFor();
    expect(await page.getByLabel('Elevation model (GeoTIFF)').count()).toBe(0);
    expect(await page.getByRole('button', { name: /Run again|Cancel run/ }).count()).toBe(0);
    await context.close();
  });

  it('lets every demo account sign in', async () => {
    for (const account of DEMO_ACCOUNTS) {
      const { context } = await appContext(browser);
      const page = await context.newPage();
      await signInThroughPage(page, account.email, DEMO_PASSWORD);
      await page.waitForURL('**/app');
      expect(await page.getByTestId('property-list').textContent()).toContain(account.role);
      await context.close();
    }
  });
});
