import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, screenshot, seedDemoIntoTestServer, openDemoWorkspace } from '../helpers/browser';

let browser: Browser;
beforeAll(async () => {
  seedDemoIntoTestServer();
  browser = await launchBrowser();
});
afterAll(() => browser?.close());

const openDemo = (role: 'manager' | 'viewer') => openDemoWorkspace(browser, role);

describe('crossings in the workspace', () => {
  it('lists the demo crossings and shows the full design of the 35° one, with its cautions', async () => {
    const { page, outsideRequests, close } = await openDemo('manager');
    const rows = page.getByTestId('crossing-row');
    expect(await rows.count()).toBeGreaterThan(3);
    await rows.filter({ hasText: 'South cross fence' }).filter({ hasText: /3[2-8]°/ }).first().click();
    const detail = page.getByTestId('crossing-detail');
    await detail.waitFor();
    expect(await page.getByTestId('crossing-angle').textContent()).toMatch(/3[2-8]°/);
    const text = (await detail.textContent()) ?? '';
    for (const expected of [/poor/i, /end strainer/i, /flex run/i, /breakaway tie/i, /plain/i, /kN/, /never enter floodwater/i, /permits/i]) expect(text).toMatch(expected);
    await screenshot(page, 'crossing-detail');
    expect(outsideRequests).toEqual([]);
    await close();
  }, 120_000);

  it('redesigns at once when the manager enters a flood mark', async () => {
    const { page, close } = await openDemo('manager');
    await page.getByTestId('crossing-row').filter({ hasText: 'North cross fence' }).filter({ hasText: /8[5-9]°|9[0-4]°/ }).first().click();
    await page.getByTestId('crossing-detail').waitFor();
    const opener = page.getByRole('button', { name: /flood mark/i }).first();
    if (await opener.count()) await opener.click();
    const form = page.getByTestId('crossing-inputs-form');
    await form.waitFor();
    await form.getByLabel(/flood mark/i).fill('1.3');
    await form.getByRole('button', { name: /save|redesign|apply/i }).first().click();
    // The design now rests on the mark: the deepest water is the mark's height above the bed.
    await expect.poll(async () => (await page.getByTestId('crossing-detail').textContent()) ?? '', { timeout: 15_000 }).toMatch(/Deepest water\s*1\.30 m/);
    await screenshot(page, 'crossing-flood-mark');
    await close();
  }, 120_000);

  it('shows a viewer the designs but no inputs form', async () => {
    const { page, close } = await openDemo('viewer');
    await page.getByTestId('crossing-row').first().click();
    await page.getByTestId('crossing-detail').waitFor();
    expect(await page.getByTestId('crossing-inputs-form').count()).toBe(0);
    expect(await page.getByTestId('realign-accept').count()).toBe(0);
    await close();
  }, 120_000);
});
