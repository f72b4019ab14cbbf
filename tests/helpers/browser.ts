import { execFileSync } from 'node:child_process';
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { inject } from 'vitest';
import { CHROMIUM_ARGS } from '../../scripts/local-process';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../scripts/demo-accounts';

export const CHROMIUM = '/usr/bin/chromium';


export const SCREENSHOTS = path.resolve('test-output/screenshots');

export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
}

/**
 * A browser context that records every request; `outsideRequests` lists those that went to any
 * host but the app's, which the tests require to be none. Requests to outside hosts are refused
 * as a closed network would.
 */
export async function appContext(browser: Browser, options: { viewport?: { width: number; height: number } } = {}) {
  const baseUrl = inject('baseUrl');
  const appOrigin = new URL(baseUrl).origin;
  const context: BrowserContext = await browser.newContext({ baseURL: baseUrl, viewport: options.viewport ?? { width: 1280, height: 800 } });
  const outsideRequests: string[] = [];
  await context.route('**/*', (route) => {
    const url = route.request().url();
    if (url.startsWith('data:') || url.startsWith('blob:') || new URL(url).origin === appOrigin) return route.continue();
    outsideRequests.push(url);
    return route.abort('blockedbyclient');
  });
  return { context, outsideRequests, baseUrl };
}

export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(SCREENSHOTS, { recursive: true });
  const file = path.join(SCREENSHOTS, `${name}.png`);
  await page.screenshot({ path: file, fullPage: false });
  return file;
}

/** Signs in through the sign-in page, as a person would. */
export async function signInThroughPage(page: Page, email: string, password: string): Promise<void> {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

/**
 * Waits until the workspace map has loaded its style and data and drawn a frame: found loaded when
 * polled, or seen firing `idle` (a busy machine can keep a map reloading between polls).
 */
export async function waitForMap(page: Page): Promise<void> {
  type Watched = { loaded(): boolean; areTilesLoaded(): boolean; on(event: 'idle', listener: () => void): void };
  await page.waitForFunction(
    () => {
      const win = window as unknown as { __gullylineMap?: Watched; __mapIdleSeen?: boolean };
      const map = win.__gullylineMap;
      if (!map) return false;
      if (win.__mapIdleSeen === undefined) {
        win.__mapIdleSeen = false;
        map.on('idle', () => (win.__mapIdleSeen = true));
      }
      return win.__mapIdleSeen || (map.loaded() && map.areTilesLoaded());
    },
    undefined,
    // The first test to open the demo meets its terrain run and crossing analysis in full swing.
    { timeout: 90_000, polling: 100 },
  );
}

/**
 * `npm run db:seed` against the test server's own database, as the demo command runs it. The seed
 * queues the demo's terrain run; the running server picks it up and designs the crossings.
 */
export function seedDemoIntoTestServer(): void {
  execFileSync(process.execPath, ['--import', 'tsx', 'scripts/db.ts', 'seed'], {
    env: { ...process.env, DATA_DIR: inject('dataDir'), DATABASE_URL: '', NODE_ENV: 'test' },
    stdio: 'pipe',
  });
}

/**
 * Signs a demo account in through the pages and opens the demo property's workspace, waiting for
 * its crossings (the terrain run and crossing analysis after the seed take up to a minute).
 */
export async function openDemoWorkspace(browser: Browser, role: 'owner' | 'manager' | 'crew' | 'viewer', viewport?: { width: number; height: number }) {
  const account = DEMO_ACCOUNTS.find((a) => a.role === role)!;
  const { context, outsideRequests } = await appContext(browser, { viewport });
  const page = await context.newPage();
  await signInThroughPage(page, account.email, DEMO_PASSWORD);
  await page.waitForURL('**/app');
  await page.getByRole('link', { name: /Saltbush Rise/ }).first().click();
  await waitForMap(page);
  await page.getByTestId('crossing-row').first().waitFor({ timeout: 60_000 });
  return { page, outsideRequests, close: () => context.close() };
}
