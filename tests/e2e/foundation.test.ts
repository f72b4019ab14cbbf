import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TestClient, closeServerDb, newAccount, serverDb } from '../helpers/api-client';
import { appContext, launchBrowser, screenshot, signInThroughPage, waitForMap } from '../helpers/browser';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await closeServerDb();
});

describe('a new user', () => {
  it('signs up, creates a property, sees its map render and signs out, with no request leaving the app', async () => {
    const { context, outsideRequests } = await appContext(browser);
    const page = await context.newPage();
    const pageErrors: string[] = [];
    page.on('pageerror', (error) => pageErrors.push(error.message));
    const account = newAccount('browser');

    await page.goto('/');
    const preview = page.getByRole('img', { name: /map of the invented demo property/ });
    await expect.poll(() => preview.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth)).toBeGreaterThan(0);
    await screenshot(page, 'landing');
    await page.getByRole('link', { name: 'Create an account' }).first().click();
    await page.getByLabel('Your name').fill(account.name);
    await page.getByLabel('E-mail').fill(account.email);
    await page.getByLabel('Password').fill(account.password);
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.waitForURL('**/app');
    await expect.poll(() => page.getByTestId('signed-in-as').textContent()).toBe(account.name);

    await page.getByLabel('Property name').fill('Red Gum Bend');
    await page.getByLabel('State or region').fill('Riverina, NSW');
    await expect.poll(() => page.locator('#crs-note').textContent()).toBe('GDA2020 / MGA zone 54');
    await screenshot(page, 'new-property');
    await page.getByRole('button', { name: 'Create property' }).click();
    await page.waitForURL(/\/app\/properties\/\d+$/);

    await expect.poll(() => page.getByRole('heading', { level: 1 }).textContent()).toBe('Red Gum Bend');
    await waitForMap(page);
    const canvas = page.locator('canvas.maplibregl-canvas');
    expect(await canvas.count()).toBe(1);
    const box = await canvas.boundingBox();
    expect(box!.width).toBeGreaterThan(300);
    expect(box!.height).toBeGreaterThan(300);
    await screenshot(page, 'workspace-empty');

    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL((url) => url.pathname === '/');
    await page.goto('/app');
    expect(new URL(page.url()).pathname).toBe('/sign-in');

    expect(pageErrors).toEqual([]);
    expect(outsideRequests).toEqual([]);
    await context.close();
  });

  it('is told clearly when the password is wrong, and stays signed out', async () => {
    const account = newAccount('wrongpw');
    await new TestClient().signUp(account);
    const { context, outsideRequests } = await appContext(browser);
    const page = await context.newPage();
    await signInThroughPage(page, account.email, 'not my password');
    const alert = page.getByRole('alert');
    await expect.poll(() => alert.textContent()).toMatch(/do not match an account/);
    await screenshot(page, 'sign-in-wrong-password');
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    expect(outsideRequests).toEqual([]);
    await context.close();
  });
});

describe('roles in the browser', () => {
  it('shows role controls on the people page to an owner but not to a viewer', async () => {
    const owner = newAccount('owner');
    const viewer = newAccount('viewer');
    const ownerClient = new TestClient();
    await ownerClient.signUp(owner);
    await ownerClient.signIn(owner.email, owner.password);
    const viewerId = await new TestClient().signUp(viewer);
    const created = await ownerClient.json<{ property: { id: number } }>('POST', '/api/properties', { name: 'Quandong Hill', crs: 'EPSG:7854' });
    const propertyId = created.body.property.id;
    await serverDb()('memberships').insert({ property_id: propertyId, user_id: viewerId, role: 'viewer', created_at: new Date().toISOString() });

    const { context, outsideRequests } = await appContext(browser);
    const page = await context.newPage();
    await signInThroughPage(page, owner.email, owner.password);
    await page.waitForURL('**/app');
    await page.goto(`/app/properties/${propertyId}/members`);
    await page.getByTestId('members-table').waitFor();
    expect(await page.getByRole('combobox', { name: /Role of/ }).count()).toBe(2);
    await screenshot(page, 'members-owner');
    await context.close();

    const viewerSession = await appContext(browser);
    const viewerPage = await viewerSession.context.newPage();
    await signInThroughPage(viewerPage, viewer.email, viewer.password);
    await viewerPage.waitForURL('**/app');
    await viewerPage.goto(`/app/properties/${propertyId}/members`);
    await viewerPage.getByTestId('members-table').waitFor();
    expect(await viewerPage.getByRole('combobox').count()).toBe(0);
    expect(await viewerPage.getByRole('button', { name: 'Remove' }).count()).toBe(0);
    expect(await viewerPage.getByText('Only owners change roles').count()).toBe(1);
    await screenshot(viewerPage, 'members-viewer');
    expect([...outsideRequests, ...viewerSession.outsideRequests]).toEqual([]);
    await viewerSession.context.close();
  });
});
