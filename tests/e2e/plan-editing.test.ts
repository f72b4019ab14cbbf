// Drawing and editing the plan in the workspace, as a manager would with a mouse, and the
// limits a crew member meets. The fence drawn here is constructed in the test at a chosen angle to
// the drainage line the map shows (the main creek, found near a point of the generator's creek
// centreline in data-samples/saltbush-rise.json), so the angle the app reports is checked against
// geometry made outside it.
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, screenshot, seedDemoIntoTestServer, waitForMap, openDemoWorkspace } from '../helpers/browser';
import { drainageLines, fenceAcrossSegment, framePoints, mainCreekPoint, propertyIdOf } from '../helpers/creek-fence';

let browser: Browser;
beforeAll(async () => {
  seedDemoIntoTestServer();
  browser = await launchBrowser();
});
afterAll(() => browser?.close());

const openDemo = (role: 'manager' | 'crew', viewport?: { width: number; height: number }) => openDemoWorkspace(browser, role, viewport);

async function clickAt(page: Page, at: { x: number; y: number }) {
  await page.mouse.move(at.x, at.y, { steps: 4 });
  await page.mouse.click(at.x, at.y);
  await page.waitForTimeout(150);
}

describe('drawing and editing the plan', () => {
  it('draws a fence across the creek by clicks, and the crossing has the constructed angle within 2°', async () => {
    const { page, outsideRequests, close } = await openDemo('manager');
    const { ends: [start, end] } = fenceAcrossSegment(await drainageLines(page, propertyIdOf(page)), mainCreekPoint(450), 70);
    const detour: [number, number] = [end![0] + 0.001, end![1] + 0.001];
    const [a, b, x] = await framePoints(page, [start!, end!, detour]);

    await page.getByTestId('draw-fence').click();
    await clickAt(page, a!);
    await clickAt(page, b!);
    await clickAt(page, x!);
    const withDetour = await page.getByTestId('draft-measure').textContent();
    // Undo takes the detour back out, redo returns it, undo again leaves the straight line.
    await page.getByTestId('draft-undo').click();
    expect(await page.getByTestId('draft-measure').textContent()).not.toBe(withDetour);
    await page.getByTestId('draft-redo').click();
    expect(await page.getByTestId('draft-measure').textContent()).toBe(withDetour);
    await page.getByTestId('draft-undo').click();
    await page.mouse.move(b!.x + 40, b!.y + 40);
    await screenshot(page, 'plan-drawing');
    await page.getByTestId('draft-finish').click();

    const form = page.getByTestId('fence-line-form');
    await form.waitFor();
    expect(await page.getByTestId('edit-panel').textContent()).toMatch(/New fence line · 3\d\d m/);
    await form.getByLabel('Name').fill('Drawn across the creek');
    await form.getByRole('button', { name: 'Save fence line' }).click();

    const detail = page.getByTestId('fence-line-detail');
    await detail.waitFor({ timeout: 30_000 });
    expect(await detail.textContent()).toMatch(/Drawn across the creek/);
    // The creek is crossed at the fence's middle, 150 m along.
    const crossingText = (await detail.getByRole('button', { name: /to the flow/ }).allTextContents()).join(' | ');
    const atCreek = [...crossingText.matchAll(/(\d+) m along: (\d+)° to the flow/g)].find((match) => Math.abs(Number(match[1]) - 150) <= 15);
    expect(atCreek, `crossings found: ${crossingText}`).toBeDefined();
    expect(Math.abs(Number(atCreek![2]) - 70)).toBeLessThanOrEqual(2);
    await screenshot(page, 'plan-drawn-fence');
    expect(outsideRequests).toEqual([]);
    await close();
  }, 180_000);

  it('reshapes a fence by dragging points, removes points by tapping, and catches a stale save with both choices offered', async () => {
    const { page, close } = await openDemo('manager');
    const propertyId = propertyIdOf(page);
    const { ends: [start, end] } = fenceAcrossSegment(await drainageLines(page, propertyId), mainCreekPoint(430), 90);
    // Made through the API as the manager's own browser session, then reshaped on the map.
    const made = await page.evaluate(
      async ({ id, coordinates }) => {
        const response = await fetch(`/api/properties/${id}/fence-lines`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ name: 'To be reshaped', coordinates }) });
        return (await response.json()) as { fenceLine: { id: number; version: number; lengthM: number } };
      },
      { id: propertyId, coordinates: [start!, end!] },
    );
    await page.reload();
    await waitForMap(page);
    await page.getByTestId('sheet-tab-plan').click();
    await page.getByTestId('fence-row').filter({ hasText: 'To be reshaped' }).click();
    await page.getByTestId('fence-reshape').click();
    const [a, b] = await framePoints(page, [start!, end!]);

    // Drag the far end 60 px sideways.
    await page.mouse.move(b!.x, b!.y, { steps: 3 });
    await page.mouse.down();
    await page.mouse.move(b!.x + 30, b!.y, { steps: 5 });
    await page.mouse.move(b!.x + 60, b!.y, { steps: 5 });
    await page.mouse.up();
    await expect.poll(() => page.getByTestId('draft-measure').textContent()).toMatch(/Now: 3\d\d m/);
    const moved = await page.getByTestId('draft-measure').textContent();

    // Drag the middle handle aside: a third point, a longer line.
    const middle = { x: (a!.x + b!.x + 60) / 2, y: (a!.y + b!.y) / 2 };
    await page.mouse.move(middle.x, middle.y, { steps: 3 });
    await page.mouse.down();
    await page.mouse.move(middle.x, middle.y + 20, { steps: 5 });
    await page.mouse.move(middle.x, middle.y + 40, { steps: 5 });
    await page.mouse.up();
    await expect.poll(() => page.getByTestId('draft-measure').textContent()).not.toBe(moved);

    // Remove points, as on a phone: tap the new point and the line is as it was; a two-point line keeps both.
    await page.getByTestId('reshape-remove-points').click();
    await page.mouse.click(middle.x, middle.y + 40);
    await expect.poll(() => page.getByTestId('draft-measure').textContent()).toBe(moved);
    await page.mouse.click(a!.x, a!.y);
    await expect.poll(async () => (await page.getByTestId('edit-error').textContent()) ?? '').toMatch(/at least two points/);
    expect(await page.getByTestId('draft-measure').textContent()).toBe(moved);
    await page.getByTestId('reshape-remove-points').click();

    // Someone else saves a change first.
    await page.evaluate(
      async ({ id, fence }) => {
        await fetch(`/api/properties/${id}/fence-lines/${fence.id}`, { method: 'PATCH', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ name: 'Renamed elsewhere', version: fence.version }) });
      },
      { id: propertyId, fence: made.fenceLine },
    );
    await page.getByTestId('reshape-save').click();
    const conflict = page.getByTestId('edit-conflict');
    await conflict.waitFor();
    expect(await conflict.textContent()).toMatch(/changed/i);
    await screenshot(page, 'plan-edit-conflict');
    await conflict.getByRole('button', { name: 'Save mine over theirs' }).click();
    await page.getByTestId('workspace-notice').waitFor({ timeout: 30_000 });
    const saved = await page.evaluate(
      async ({ id, fenceId }) => ((await (await fetch(`/api/properties/${id}/fence-lines/${fenceId}`)).json()) as { fenceLine: { name: string; version: number; lengthM: number } }).fenceLine,
      { id: propertyId, fenceId: made.fenceLine.id },
    );
    // Their rename and my shape are both kept.
    expect(saved.name).toBe('Renamed elsewhere');
    expect(saved.version).toBe(made.fenceLine.version + 2);
    expect(Math.abs(saved.lengthM - made.fenceLine.lengthM)).toBeGreaterThan(1);
    await close();
  }, 180_000);

  it('lists the keyboard shortcuts on "?"', async () => {
    const { page, close } = await openDemo('manager');
    await page.keyboard.press('?');
    const help = page.getByTestId('shortcuts-help');
    await help.waitFor();
    expect(await help.textContent()).toMatch(/Draw a fence line/);
    await page.keyboard.press('f');
    await page.getByTestId('draft-cancel').waitFor();
    await page.keyboard.press('Escape');
    await page.getByTestId('draw-fence').waitFor();
    await close();
  }, 120_000);

  it('gives crew no drawing or editing controls', async () => {
    const { page, close } = await openDemo('crew');
    await page.getByTestId('sheet-tab-plan').click();
    await page.getByTestId('fence-row').first().click();
    await page.getByTestId('fence-line-detail').waitFor();
    for (const testId of ['edit-toolbar', 'draw-fence', 'fence-reshape', 'fence-delete', 'fence-edit-details', 'track-file', 'paddocks-from-fences']) {
      expect(await page.getByTestId(testId).count(), testId).toBe(0);
    }
    await page.keyboard.press('f');
    expect(await page.getByTestId('draft-cancel').count()).toBe(0);
    await close();
  }, 120_000);
});
