import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../scripts/demo-accounts';
import { appContext, launchBrowser, screenshot, seedDemoIntoTestServer, signInThroughPage } from '../helpers/browser';

let browser: Browser;
beforeAll(async () => {
  seedDemoIntoTestServer();
  browser = await launchBrowser();
});
afterAll(() => browser?.close());

const HEADER = 'id,name,unit,unit_price_aud,supplier_note';

async function openCosts(role: 'manager' | 'viewer', viewport?: { width: number; height: number }) {
  const account = DEMO_ACCOUNTS.find((a) => a.role === role)!;
  const { context, outsideRequests } = await appContext(browser, viewport ? { viewport } : {});
  const page = await context.newPage();
  await signInThroughPage(page, account.email, DEMO_PASSWORD);
  await page.waitForURL('**/app');
  await page.getByRole('link', { name: /Saltbush Rise/ }).first().click();
  await page.waitForURL(/\/app\/properties\/\d+$/);
  await page.getByRole('navigation', { name: 'Property' }).getByRole('link', { name: 'Costs' }).click();
  await page.waitForURL(/\/costs$/);
  // The server designs the demo crossings after the seed (up to a minute): wait until they are priced,
  // so the total moves only with our edits.
  const deadline = Date.now() + 90_000;
  while ((await page.getByTestId('crossing-costs').locator('tbody tr').count()) === 0) {
    if (Date.now() > deadline) throw new Error('the demo crossings were never priced');
    await page.waitForTimeout(2000);
    await page.reload();
    await page.getByTestId('property-total').waitFor();
  }
  return { page, outsideRequests, close: () => context.close() };
}

const total = async (page: Page) => (await page.getByTestId('property-total').textContent())!.trim();
const priceOf = (page: Page, code: string) => page.getByTestId('price-row').filter({ has: page.locator(`input[value="${code}"]`) }).getByLabel(/Unit price/);

describe('the Costs page', () => {
  it('lets a manager change a price and see the total follow, refuses a CSV with a bad row until it is fixed, and keeps edits on a stale save', async () => {
    const { page, outsideRequests, close } = await openCosts('manager');
    const before = await total(page);
    await screenshot(page, 'costs-manager-1280-top');
    expect(before).toMatch(/^\$[\d,]+\.\d\d$/);

    await priceOf(page, 'LINE_POST').fill('20.00');
    await page.getByRole('button', { name: 'Save price list' }).click();
    await page.getByTestId('save-notice').filter({ hasText: 'Saved' }).waitFor();
    await expect.poll(() => total(page), { timeout: 10_000 }).not.toBe(before);
    const afterEdit = await total(page);
    await screenshot(page, 'costs-manager-1280-saved');

    // A file with one bad row: the row's problem shows and nothing changes.
    const input = page.getByTestId('price-import-file');
    await input.setInputFiles({ name: 'supplier.csv', mimeType: 'text/csv', buffer: Buffer.from(`${HEADER}\nLINE_POST,"Star picket, 1.8 m",each,25.00,new quote\nSTAY,Stay,bundle,32\n`) });
    const preview = page.getByTestId('import-preview');
    await preview.waitFor();
    expect(await preview.getByTestId('import-problem').nth(1).textContent()).toBe('The unit "bundle" is not one of each, m, roll, kg.');
    expect(await preview.textContent()).toMatch(/1 row needs fixing in the file/);
    expect(await preview.getByRole('button', { name: 'Apply and save' }).isDisabled()).toBe(true);
    await preview.scrollIntoViewIfNeeded();
    await screenshot(page, 'costs-import-bad-row');
    expect(await priceOf(page, 'LINE_POST').inputValue()).toBe('20.00');
    expect(await total(page)).toBe(afterEdit);

    // The fixed file applies (merged) and saves.
    await input.setInputFiles({ name: 'supplier.csv', mimeType: 'text/csv', buffer: Buffer.from(`${HEADER}\nLINE_POST,"Star picket, 1.8 m",each,25.00,new quote\nSTAY,Stay,each,32\n`) });
    await page.getByRole('button', { name: 'Apply and save' }).click();
    await page.getByTestId('save-notice').filter({ hasText: 'Saved' }).waitFor();
    expect(await priceOf(page, 'LINE_POST').inputValue()).toBe('25.00');
    await expect.poll(() => total(page), { timeout: 10_000 }).not.toBe(afterEdit);
    expect(await page.getByTestId('price-row').count()).toBe(13);

    // Someone else saves meanwhile: our save is refused, our edit stays, and theirs can be loaded.
    const propertyId = /properties\/(\d+)/.exec(page.url())![1];
    const theirs = (await (await page.request.get(`/api/properties/${propertyId}/settings`)).json()) as { settings: { version: number } };
    const patched = await page.request.patch(`/api/properties/${propertyId}/settings`, { data: { version: theirs.settings.version, designSettings: { metresPerDay: 350 } } });
    expect(patched.status()).toBe(200);
    await priceOf(page, 'CLIP').fill('0.50');
    await page.getByRole('button', { name: 'Save price list' }).click();
    const notice = page.getByTestId('save-notice');
    await notice.filter({ hasText: /Someone changed these settings/ }).waitFor();
    expect(await priceOf(page, 'CLIP').inputValue()).toBe('0.50');
    await notice.getByRole('button', { name: 'Load theirs' }).click();
    await expect.poll(() => page.getByLabel('Metres of fence a crew builds in a day').inputValue()).toBe('350');
    expect(await priceOf(page, 'CLIP').inputValue()).toBe('0.12');

    // A server field error lands on its cell.
    await page.getByRole('button', { name: 'Add row' }).click();
    const last = page.getByTestId('price-row').last();
    await last.getByLabel(/Item id/).fill('CLIP');
    await last.getByLabel(/Name/).fill('Clip again');
    await last.getByLabel(/Unit price/).fill('1');
    await page.getByRole('button', { name: 'Save price list' }).click();
    expect(await last.getByTestId('cell-error').textContent()).toMatch(/CLIP per each is already priced on row \d+/);
    expect(outsideRequests).toEqual([]);
    await close();
  }, 180_000);

  it('reads well on a phone', async () => {
    const { page, close } = await openCosts('manager', { width: 390, height: 844 });
    await screenshot(page, 'costs-manager-390');
    await page.getByRole('heading', { name: 'Price list' }).scrollIntoViewIfNeeded();
    await screenshot(page, 'costs-price-list-390');
    await close();
  }, 120_000);

  it('shows a viewer the costs and prices but no edit controls', async () => {
    const { page, close } = await openCosts('viewer');
    await page.getByTestId('price-list-table').waitFor();
    expect(await page.getByTestId('price-row').count()).toBeGreaterThan(5);
    expect(await page.getByTestId('price-list-table').locator('input, select').count()).toBe(0);
    for (const name of ['Save price list', 'Add row', /Remove/]) expect(await page.getByRole('button', { name }).count()).toBe(0);
    expect(await page.getByTestId('price-import').count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Download CSV' }).count()).toBe(1);
    await screenshot(page, 'costs-viewer-1280');
    await close();
  }, 120_000);
});
