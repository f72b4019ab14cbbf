import path from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { listCaughtMail } from '../../src/lib/server/mail/caught-mail';
import { TestClient, closeServerDb, newAccount, serverDb } from '../helpers/api-client';
import { appContext, launchBrowser, screenshot, signInThroughPage } from '../helpers/browser';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await closeServerDb();
});

async function mailTo(to: string) {
  const folder = path.join(inject('dataDir'), 'mail');
  for (let i = 0; i < 300; i++) {
    const found = (await listCaughtMail(folder, 500)).find((mail) => mail.to === to);
    if (found) return found;
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  throw new Error(`no e-mail to ${to} arrived`);
}

describe('inviting a crew member', () => {
  it('an owner invites by e-mail, sees it sent, and the invitee signs up on a phone and joins with the invited role', async () => {
    const owner = newAccount('inviting-owner');
    const ownerClient = new TestClient();
    await ownerClient.signUp(owner);
    await ownerClient.signIn(owner.email, owner.password);
    const created = await ownerClient.json<{ property: { id: number } }>('POST', '/api/properties', { name: 'Bluebush Bend', crs: 'EPSG:7854' });
    const propertyId = created.body.property.id;
    const invitee = newAccount('invited-crew');

    const { context, outsideRequests } = await appContext(browser);
    const page = await context.newPage();
    await signInThroughPage(page, owner.email, owner.password);
    await page.waitForURL('**/app');
    await page.goto(`/app/properties/${propertyId}/members`);
    await page.getByLabel('E-mail').fill(invitee.email);
    await page.getByLabel('Role', { exact: true }).selectOption('crew');
    await page.getByRole('button', { name: 'Send invitation' }).click();
    await page.getByRole('status').filter({ hasText: invitee.email }).waitFor();
    const pending = page.getByTestId('pending-invitations');
    await pending.getByText(invitee.email).waitFor();
    // The list looks again while the e-mail is on its way, and says when it went.
    await pending.getByText('E-mail sent.').waitFor({ timeout: 30_000 });
    await screenshot(page, 'invitation-sent');

    const mail = await mailTo(invitee.email);
    const link = /https?:\/\/\S+\/invitations\/accept\?token=[\w-]+/.exec(mail.text)?.[0];
    expect(link).toBeDefined();

    const phone = await appContext(browser, { viewport: { width: 390, height: 844 } });
    const phonePage = await phone.context.newPage();
    await phonePage.goto(link!);
    await phonePage.getByRole('heading', { name: 'Join Bluebush Bend' }).waitFor();
    // The card's link carries the invited address (the header has a plain one too).
    await phonePage.locator('a[href^="/sign-up?email="]').click();
    await phonePage.waitForURL('**/sign-up**');
    expect(await phonePage.getByLabel('E-mail').inputValue()).toBe(invitee.email);
    await phonePage.getByLabel('Your name').fill(invitee.name);
    await phonePage.getByLabel('Password').fill(invitee.password);
    await phonePage.getByRole('button', { name: 'Create account' }).click();
    // Back on the invitation, signed in: one tap joins.
    await phonePage.getByRole('button', { name: 'Accept and join Bluebush Bend' }).click();
    await phonePage.waitForURL(`**/app/properties/${propertyId}`);
    await screenshot(phonePage, 'invitation-accepted-phone');

    const membership = await serverDb()('memberships as m').join('users as u', 'u.id', 'm.user_id').where({ 'm.property_id': propertyId, 'u.email': invitee.email }).first('m.role');
    expect(membership).toEqual({ role: 'crew' });
    // The owner's list no longer shows the invitation as waiting.
    await page.reload();
    await page.getByText('No invitations are waiting.').waitFor();
    expect([...outsideRequests, ...phone.outsideRequests]).toEqual([]);
    await phone.context.close();
    await context.close();
  });
});
