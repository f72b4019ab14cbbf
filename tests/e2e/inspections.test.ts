import sharp from 'sharp';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../scripts/demo-accounts';
import { appContext, launchBrowser, openDemoWorkspace, screenshot, seedDemoIntoTestServer, signInThroughPage } from '../helpers/browser';

let browser: Browser;
beforeAll(async () => {
  seedDemoIntoTestServer();
  browser = await launchBrowser();
});
afterAll(() => browser?.close());

const PHONE = { width: 390, height: 844 };

/** The crew member's phone, signed in through the pages. */
async function crewPhone() {
  const crew = DEMO_ACCOUNTS.find((account) => account.role === 'crew')!;
  const { context, outsideRequests } = await appContext(browser, { viewport: PHONE });
  const page = await context.newPage();
  await signInThroughPage(page, crew.email, DEMO_PASSWORD);
  await page.waitForURL('**/app');
  return { page, outsideRequests, close: () => context.close() };
}

/** Marks the first crossing of a round damaged on the phone, and waits for the saved status. */
async function markFirstDamaged(page: Page, roundPath: string) {
  await page.goto(roundPath);
  const first = page.getByTestId('inspection-check').first();
  await first.getByRole('button', { name: 'Damaged', exact: true }).click();
  await expect.poll(async () => (await first.getByTestId('check-status').textContent()) ?? '', { timeout: 15_000 }).toMatch(/^Damaged · Jess Kowalski/);
  return first;
}

describe('inspections after rain', () => {
  it('a manager records rain on a desktop, the crew works the round on a phone with a photo, and two damaged rounds flag the crossing', async () => {
    const manager = await openDemoWorkspace(browser, 'manager');
    const page = manager.page;
    const propertyId = Number(/properties\/(\d+)/.exec(page.url())![1]);
    await page.getByRole('navigation', { name: 'Property' }).getByRole('link', { name: 'Inspections' }).click();
    await page.waitForURL(/\/inspections$/);
    await page.getByLabel('Day the rain fell').fill('2026-11-27');
    await page.getByLabel('Rainfall (mm)').fill('56');
    await page.getByLabel('Note (optional)').fill('Main creek over the crossing at dawn.');
    await page.getByRole('button', { name: 'Record rain and open a round' }).click();
    const recorded = page.getByRole('status').filter({ hasText: 'Rain event recorded' });
    await recorded.waitFor();
    expect(await recorded.textContent()).toMatch(/Rain event recorded: \d+ crossings to check/);
    await page.getByTestId('rain-event').filter({ hasText: '2026-11-27: 56 mm' }).waitFor();
    await screenshot(page, 'inspections-manager-1280');
    const firstRound = await recorded.getByRole('link', { name: 'Open the round' }).getAttribute('href');
    expect(firstRound).toMatch(new RegExp(`^/app/properties/${propertyId}/inspections/\\d+$`));

    // The crew member on a phone: the round's crossings in order, each with what to look at.
    const phone = await crewPhone();
    await phone.page.goto(firstRound!);
    const checks = phone.page.getByTestId('inspection-check');
    await checks.first().waitFor();
    expect(await checks.count()).toBeGreaterThan(1);
    expect(await checks.first().getByRole('list', { name: 'What to look at' }).textContent()).toMatch(/breakaway tie|drop-down section|No design yet/);
    // Large status buttons, made for a thumb.
    const button = await checks.first().getByRole('button', { name: 'Intact', exact: true }).boundingBox();
    expect(button!.height).toBeGreaterThanOrEqual(44);

    // A photo from the camera (a JPEG made here with sharp).
    const jpeg = await sharp({ create: { width: 1024, height: 768, channels: 3, background: { r: 140, g: 100, b: 60 } } }).jpeg().toBuffer();
    await checks.first().getByTestId('photo-input').setInputFiles({ name: 'IMG_2041.jpg', mimeType: 'image/jpeg', buffer: jpeg });
    await checks.first().getByRole('status').filter({ hasText: 'Photo added' }).waitFor({ timeout: 20_000 });
    const thumbnail = checks.first().getByTestId('check-photos').locator('img').first();
    await thumbnail.waitFor();
    await expect.poll(() => thumbnail.evaluate((img: HTMLImageElement) => img.naturalWidth), { timeout: 10_000 }).toBe(320);
    // A photo sent by mistake is removed by its sender (after a confirmation).
    await checks.first().getByTestId('photo-input').setInputFiles({ name: 'IMG_2042.jpg', mimeType: 'image/jpeg', buffer: jpeg });
    const photos = checks.first().getByTestId('check-photos').locator('img');
    await expect.poll(() => photos.count(), { timeout: 20_000 }).toBe(2);
    phone.page.once('dialog', (dialog) => void dialog.accept());
    await checks.first().getByTestId('check-photos').getByRole('button', { name: 'Remove' }).nth(1).click();
    await checks.first().getByRole('status').filter({ hasText: 'Photo removed' }).waitFor({ timeout: 20_000 });
    await expect.poll(() => photos.count(), { timeout: 10_000 }).toBe(1);
    await markFirstDamaged(phone.page, firstRound!);
    await checks.nth(1).getByRole('button', { name: 'Intact', exact: true }).click();
    await expect.poll(async () => (await checks.nth(1).getByTestId('check-status').textContent()) ?? '', { timeout: 15_000 }).toMatch(/^Intact/);
    await screenshot(phone.page, 'inspections-round-phone-390');

    // A second rain event; the same crossing is damaged again.
    const second = await page.request.post(`/api/properties/${propertyId}/rain-events`, { data: { fellOn: '2026-12-01', rainfallMm: 71, scope: 'property' } });
    expect(second.status()).toBe(201);
    const secondRound = (await second.json()) as { round: { id: number } };
    await markFirstDamaged(phone.page, `/app/properties/${propertyId}/inspections/${secondRound.round.id}`);

    // Back on the map: the crossing list carries the flag, and its history shows both rounds.
    await page.goto(`/app/properties/${propertyId}`);
    const flagged = page.getByTestId('crossing-row').filter({ has: page.getByTestId('redesign-flag') });
    await flagged.first().waitFor({ timeout: 60_000 });
    expect(await flagged.count()).toBe(1);
    await flagged.first().click();
    const history = page.getByTestId('crossing-detail').getByTestId('inspection-history');
    await history.waitFor();
    const rows = history.getByTestId('inspection-history-row');
    await expect.poll(() => rows.count()).toBe(2);
    expect(await rows.nth(0).textContent()).toMatch(/2026-12-01.*71 mm.*Damaged/);
    expect(await rows.nth(1).textContent()).toMatch(/2026-11-27.*56 mm.*Damaged/);
    expect(await rows.nth(1).locator('img').count()).toBe(1);
    expect(await history.getByTestId('redesign-suggestion').textContent()).toMatch(/Reconsider/);
    await history.scrollIntoViewIfNeeded();
    await screenshot(page, 'inspections-history-redesign');

    expect(manager.outsideRequests).toEqual([]);
    expect(phone.outsideRequests).toEqual([]);
    await phone.close();
    await manager.close();
  }, 240_000);
});
