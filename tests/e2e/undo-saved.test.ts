// Undo and redo of a saved change in the workspace, as a manager would: a fence line drawn across
// the demo's main creek and saved, taken back with Undo (gone from the list and from the map's
// data), brought back with Ctrl+Shift+Z, crossing and all; then an undo someone else's change has
// overtaken is refused and taken off the list.
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, openDemoWorkspace, screenshot, seedDemoIntoTestServer } from '../helpers/browser';
import { drainageLines, fenceAcrossSegment, framePoints, mainCreekPoint, propertyIdOf } from '../helpers/creek-fence';

let browser: Browser;
beforeAll(async () => {
  seedDemoIntoTestServer();
  browser = await launchBrowser();
});
afterAll(() => browser?.close());

const NAME = 'Undone across the creek';

/** Names of the fence lines, and of the fence lines with crossings, in the map's own sources. */
async function onTheMap(page: Page): Promise<{ fences: string[]; crossingFences: string[] }> {
  return page.evaluate(async () => {
    type Data = { features: { properties: Record<string, unknown> }[] };
    const map = window.__gullylineMap! as unknown as { getSource(id: string): { getData(): Promise<Data> } | undefined };
    const names = async (id: string, key: string) => ((await map.getSource(id)?.getData())?.features ?? []).map((f) => String(f.properties[key]));
    return { fences: await names('plan-fence-lines', 'name'), crossingFences: await names('plan-crossings', 'fenceName') };
  });
}

describe('undo and redo of saved changes', () => {
  it('undoes a saved fence line across the creek and redoes it, crossing and all', async () => {
    const { page, outsideRequests, close } = await openDemoWorkspace(browser, 'manager');
    const propertyId = propertyIdOf(page);
    const undo = page.getByTestId('saved-undo');
    const redo = page.getByTestId('saved-redo');
    expect(await undo.isDisabled()).toBe(true);
    expect(await redo.getAttribute('aria-label')).toBe('Nothing to redo');

    const { ends: [start, end] } = fenceAcrossSegment(await drainageLines(page, propertyId), mainCreekPoint(380), 80);
    const [a, b] = await framePoints(page, [start!, end!]);
    await page.getByTestId('draw-fence').click();
    for (const at of [a!, b!]) {
      await page.mouse.move(at.x, at.y, { steps: 4 });
      await page.mouse.click(at.x, at.y);
      await page.waitForTimeout(150);
    }
    await page.getByTestId('draft-finish').click();
    const form = page.getByTestId('fence-line-form');
    await form.waitFor();
    await form.getByLabel('Name').fill(NAME);
    await form.getByRole('button', { name: 'Save fence line' }).click();
    const detail = page.getByTestId('fence-line-detail');
    await detail.waitFor({ timeout: 30_000 });
    expect(await detail.getByRole('button', { name: /to the flow/ }).count()).toBeGreaterThan(0);

    // Undo says what it undoes, and takes the line away with its crossing.
    expect(await undo.getAttribute('aria-label')).toBe(`Undo: new fence line ${NAME}`);
    expect(await undo.getAttribute('title')).toBe(`Undo: new fence line ${NAME}`);
    await undo.click();
    const notice = page.getByTestId('workspace-notice');
    await expect.poll(() => notice.textContent(), { timeout: 30_000 }).toBe(`Undone: new fence line ${NAME}.`);
    await detail.waitFor({ state: 'detached' });
    await page.getByTestId('sheet-tab-plan').click();
    expect(await page.getByTestId('fence-row').filter({ hasText: NAME }).count()).toBe(0);
    await expect.poll(async () => (await onTheMap(page)).fences).not.toContain(NAME);
    expect((await onTheMap(page)).crossingFences).not.toContain(NAME);
    expect(await undo.isDisabled()).toBe(true);
    expect(await redo.getAttribute('aria-label')).toBe(`Redo: new fence line ${NAME}`);
    await screenshot(page, 'undo-saved-undone');

    // Redo by keyboard, with nothing being drawn: the line is made anew and its crossing found again.
    await page.locator('body').click({ position: { x: 5, y: 5 } });
    await page.keyboard.press('Control+Shift+Z');
    await expect.poll(() => notice.textContent(), { timeout: 30_000 }).toBe(`Redone: new fence line ${NAME}. ${NAME} is back; its crossings were found and designed again.`);
    const row = page.getByTestId('fence-row').filter({ hasText: NAME });
    await row.waitFor();
    await expect.poll(async () => (await onTheMap(page)).fences).toContain(NAME);
    await expect.poll(async () => (await onTheMap(page)).crossingFences).toContain(NAME);
    await row.click();
    await detail.waitFor();
    expect(await detail.getByRole('button', { name: /to the flow/ }).count()).toBeGreaterThan(0);
    expect(await undo.getAttribute('aria-label')).toBe(`Undo: new fence line ${NAME}`);
    expect(await redo.isDisabled()).toBe(true);
    await screenshot(page, 'undo-saved-redone');

    // Someone else renames the line: the undo is refused, said so, taken off, and nothing is deleted.
    await page.evaluate(
      async ({ id, name }) => {
        const { fenceLines } = (await (await fetch(`/api/properties/${id}/fence-lines`)).json()) as { fenceLines: { id: number; name: string; version: number }[] };
        const fence = fenceLines.find((f) => f.name === name)!;
        await fetch(`/api/properties/${id}/fence-lines/${fence.id}`, { method: 'PATCH', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ name: 'Renamed by the owner meanwhile', version: fence.version }) });
      },
      { id: propertyId, name: NAME },
    );
    await undo.click();
    await expect.poll(() => notice.textContent(), { timeout: 30_000 }).toBe(
      `Could not undo the new fence line ${NAME}: someone else has changed ${NAME} since. Nothing was changed; the plan now shows what is saved, and that step was taken off the list.`,
    );
    await page.getByTestId('fence-row').filter({ hasText: 'Renamed by the owner meanwhile' }).waitFor();
    expect(await undo.isDisabled()).toBe(true);
    await screenshot(page, 'undo-saved-refused');
    expect(outsideRequests).toEqual([]);
    await close();
  }, 240_000);
});
