// A work order from the office to the field: a manager makes and sends one on a desktop, the crew
// member opens it on a phone, sees where they are and marks a crossing done, and the manager's
// list shows the progress.
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../scripts/demo-accounts';
import { appContext, launchBrowser, openDemoWorkspace, screenshot, seedDemoIntoTestServer, signInThroughPage, waitForMap } from '../helpers/browser';
import { drainageLines, fenceAcrossSegment, mainCreekPoint, propertyIdOf } from '../helpers/creek-fence';

let browser: Browser;
beforeAll(async () => {
  seedDemoIntoTestServer();
  browser = await launchBrowser();
});
afterAll(() => browser?.close());

const PHONE = { width: 390, height: 844 };
/** Apple's Human Interface Guidelines ask for touch targets of at least 44 × 44 points. */
const MIN_TOUCH_PX = 44;

async function signIn(role: 'crew', viewport: { width: number; height: number }) {
  const account = DEMO_ACCOUNTS.find((a) => a.role === role)!;
  const { context, outsideRequests } = await appContext(browser, { viewport });
  const page = await context.newPage();
  await signInThroughPage(page, account.email, DEMO_PASSWORD);
  await page.waitForURL('**/app');
  return { page, context, outsideRequests, account };
}

describe('work orders', () => {
  it('a manager sends an order, the crew marks a crossing done on a phone, and the manager sees the progress', async () => {
    // The workspace opener waits until the demo's terrain run has made its drainage lines and crossings.
    const manager = await openDemoWorkspace(browser, 'manager');
    const page = manager.page;
    const propertyId = propertyIdOf(page);

    // A fence of its own, square across the main creek, so the demo's fences stay as other tests expect them.
    const fenceName = `Order fence ${Date.now().toString(36)}`;
    const { ends, middle } = fenceAcrossSegment(await drainageLines(page, propertyId), mainCreekPoint(250), 90, 400);
    const made = await page.request.post(`/api/properties/${propertyId}/fence-lines`, { data: { name: fenceName, coordinates: ends } });
    expect(made.status()).toBe(201);

    await page.getByRole('navigation', { name: 'Property' }).getByRole('link', { name: 'Work orders' }).click();
    await page.waitForURL(/\/work-orders$/);
    const form = page.getByTestId('create-work-order');
    await form.getByLabel('Title').fill(`Build ${fenceName}`);
    await form.getByLabel('Who does the work').selectOption({ label: `${DEMO_ACCOUNTS.find((a) => a.role === 'crew')!.name} (crew)` });
    await form.getByLabel('Target date').fill('2027-03-01');
    await form.getByRole('group', { name: 'Fence lines' }).getByRole('checkbox', { name: new RegExp(fenceName) }).check();
    const crossingBoxes = form.getByRole('group', { name: 'Crossings' }).getByRole('checkbox', { name: new RegExp(`on ${fenceName} · (Continuous swinging floodgate|Separate drop-down section)`) });
    expect(await crossingBoxes.count()).toBeGreaterThan(0);
    await crossingBoxes.first().check();
    await form.getByRole('button', { name: 'Save as draft' }).click();
    await page.getByTestId('notice').filter({ hasText: 'saved as a draft' }).waitFor();
    const row = page.getByTestId('work-order-row').filter({ hasText: `Build ${fenceName}` });
    expect(await row.getByTestId('order-status').textContent()).toBe('Draft');
    await row.getByRole('button', { name: 'Send' }).click();
    await page.getByTestId('notice').filter({ hasText: 'was sent to' }).waitFor();
    expect(await row.getByTestId('order-status').textContent()).toBe('Sent');
    expect(await row.getByTestId('progress-words').textContent()).toBe('0 of 2 done');
    await screenshot(page, 'work-orders-manager-1280');
    const orderUrl = await row.getByRole('link', { name: `Build ${fenceName}` }).getAttribute('href');

    // The crew member on a phone, letting the browser share a position beside the fence.
    const crew = await signIn('crew', PHONE);
    await crew.context.grantPermissions(['geolocation']);
    await crew.context.setGeolocation({ longitude: middle[0], latitude: middle[1], accuracy: 8 });
    const phone = crew.page;
    await phone.goto(orderUrl!);
    const items = phone.getByTestId('work-item');
    await items.first().waitFor();
    expect(await items.count()).toBe(2);
    await waitForMap(phone);
    const crossingItem = items.filter({ has: phone.getByTestId('crossing-style') });
    expect(await crossingItem.getByTestId('crossing-style').textContent()).toMatch(/floodgate|drop-down section/i);
    const done = crossingItem.getByRole('button', { name: 'Done' });
    const box = (await done.boundingBox())!;
    expect(box.height).toBeGreaterThanOrEqual(MIN_TOUCH_PX);
    expect(box.width).toBeGreaterThanOrEqual(MIN_TOUCH_PX);
    // Nothing wider than the phone: no sideways scrolling.
    expect(await phone.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(PHONE.width);

    await phone.getByRole('button', { name: 'Show where I am' }).click();
    await phone.getByTestId('own-position').filter({ hasText: 'You are the dark dot' }).waitFor();
    await done.click();
    await phone.waitForSelector('[data-testid="work-item"][data-state="done"]');
    expect(await crossingItem.getByTestId('item-state').textContent()).toBe('Done');
    expect(await phone.getByTestId('progress-words').first().textContent()).toBe('1 of 2 done');
    await screenshot(phone, 'work-order-crew-390');

    // The fence line is being built now, and the manager's list shows half the work done.
    const fence = (await (await page.request.get(`/api/properties/${propertyId}/fence-lines`)).json()) as { fenceLines: { name: string; status: string }[] };
    expect(fence.fenceLines.find((f) => f.name === fenceName)?.status).toBe('building');
    await page.reload();
    const after = page.getByTestId('work-order-row').filter({ hasText: `Build ${fenceName}` });
    expect(await after.getByTestId('progress-words').textContent()).toBe('1 of 2 done');
    expect(await after.getByRole('progressbar').getAttribute('aria-valuenow')).toBe('50');
    await screenshot(page, 'work-orders-manager-progress');

    // The printable sheet: the sketch drawn from the order's geometry, and no site header on paper.
    await page.goto(`${orderUrl}/print`);
    expect(await page.getByTestId('order-sketch').locator('polyline').count()).toBe(1);
    expect(await page.getByTestId('order-sketch').locator('circle').count()).toBeGreaterThan(0);
    await page.emulateMedia({ media: 'print' });
    expect(await page.locator('body > header').isVisible()).toBe(false);
    expect(await page.getByRole('button', { name: 'Print this sheet' }).isVisible()).toBe(false);
    await screenshot(page, 'work-order-print');

    expect(manager.outsideRequests).toEqual([]);
    expect(crew.outsideRequests).toEqual([]);
    await crew.context.close();
    await manager.close();
  }, 300_000);
});
