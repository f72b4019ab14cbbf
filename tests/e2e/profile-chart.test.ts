import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CrossingDetailView, DesignedCrossingView } from '../../src/lib/schemas/crossing-view';
import { launchBrowser, screenshot, seedDemoIntoTestServer, openDemoWorkspace } from '../helpers/browser';

let browser: Browser;
beforeAll(async () => {
  seedDemoIntoTestServer();
  browser = await launchBrowser();
});
afterAll(() => browser?.close());

/** Signs the demo manager in at this viewport and opens the demo property's workspace. */
const openDemo = (viewport: { width: number; height: number }) => openDemoWorkspace(browser, 'manager', viewport);

/** Opens the 35° crossing of the South cross fence (designed, with stayed posts and a tie) and returns what the API answered for it. */
async function openDesignedCrossing(page: Page): Promise<CrossingDetailView & { design: DesignedCrossingView }> {
  const answer = page.waitForResponse((response) => /\/api\/properties\/\d+\/crossings\/\d+$/.test(new URL(response.url()).pathname));
  await page.getByTestId('crossing-row').filter({ hasText: 'South cross fence' }).filter({ hasText: /3[2-8]°/ }).first().click();
  const { crossing } = (await (await answer).json()) as { crossing: CrossingDetailView };
  expect(crossing.design?.status).toBe('designed');
  return crossing as CrossingDetailView & { design: DesignedCrossingView };
}

/** "−31 m" / "+28 m", as the chart writes a distance from the crossing. */
const signed = (offsetM: number) => `${offsetM > 0 ? '+' : offsetM < 0 ? '\u2212' : ''}${Math.abs(Math.round(offsetM))} m`;

describe('the crossing profile chart', () => {
  for (const [name, viewport] of [
    ['desktop', { width: 1280, height: 800 }],
    ['phone', { width: 390, height: 844 }],
  ] as const) {
    it(`draws the ground, flood and layout of a designed crossing, with a text alternative (${name})`, async () => {
      const { page, outsideRequests, close } = await openDemo(viewport);
      const crossing = await openDesignedCrossing(page);
      const { layout } = crossing.design;

      const chart = page.getByTestId('profile-chart');
      await chart.waitFor();
      const canvas = chart.locator('canvas');
      await canvas.evaluate((element) => element.scrollIntoView({ block: 'center' }));

      // A real drawing of a usable size that fits the panel (no sideways scrolling on a phone).
      const box = (await canvas.boundingBox())!;
      expect(box.width).toBeGreaterThan(240);
      expect(box.height).toBeGreaterThan(150);
      const panel = (await page.getByTestId('crossing-detail').boundingBox())!;
      expect(box.x + box.width).toBeLessThanOrEqual(panel.x + panel.width);
      // Nor does anything of the chart widen the page (its screen-reader table once did).
      expect(await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).toBeLessThanOrEqual(0);
      const painted = await canvas.evaluate((element) => {
        const canvasElement = element as HTMLCanvasElement;
        const pixels = canvasElement.getContext('2d')!.getImageData(0, 0, canvasElement.width, canvasElement.height).data;
        let count = 0;
        for (let i = 3; i < pixels.length; i += 4) if (pixels[i]! > 0) count += 1;
        return count / (canvasElement.width * canvasElement.height);
      });
      expect(painted).toBeGreaterThan(0.2); // the ground's fill alone covers more than this

      // The canvas is an image whose label says what a sighted reader takes from it.
      expect(await canvas.getAttribute('role')).toBe('img');
      const label = (await canvas.getAttribute('aria-label')) ?? '';
      const flood = /flood (\d+) m wide, (\d+\.\d) m deep/.exec(label);
      expect(flood, label).not.toBeNull();
      // The water's width along the fence is within the wet zone, which adds the freeboard.
      expect(Number(flood![1])).toBeGreaterThan(0);
      expect(Number(flood![1])).toBeLessThanOrEqual(Math.round(layout.wetZone.lengthM));
      expect(flood![2]).toBe(layout.wetZone.maxDepthM.toFixed(1));
      expect(label).toContain(crossing.fenceName);
      const [start, end] = layout.endStrainers;
      expect(label).toContain(`end strainers at ${signed(start.chainageM - crossing.chainageM)} and ${signed(end.chainageM - crossing.chainageM)}`);

      // The key names what this layout has; the table gives the figures to a screen reader.
      const key = (await chart.locator('ul').textContent()) ?? '';
      for (const entry of ['Ground', 'Design flood', 'Wet zone', 'End strainer']) expect(key).toContain(entry);
      if (layout.posts.some((post) => post.braced)) expect(key).toContain('Stayed post');
      if (layout.breakawayTies.length) expect(key).toContain('Breakaway tie');
      expect(await chart.getByRole('table').getByRole('rowheader', { name: 'End strainer, near side' }).count()).toBe(1);

      if (name === 'desktop') {
        // Pointing at the chart reads the ground there.
        // (The mouse, not canvas.hover: uPlot's event layer lies over the canvas.)
        const now = (await canvas.boundingBox())!;
        await page.mouse.move(now.x + now.width / 2, now.y + now.height / 2);
        await expect.poll(async () => (await page.getByTestId('profile-readout').textContent()) ?? '').toMatch(/from the crossing · ground \d+\.\d\d m/);
      }
      await screenshot(page, `profile-chart-${name}`);
      expect(outsideRequests).toEqual([]);
      await close();
    }, 120_000);
  }
});
