import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import { listCaughtMail } from '../../src/lib/server/mail/caught-mail';
import { TestClient, closeServerDb, newAccount, rowCounts, serverDb, signedInClient } from '../helpers/api-client';

let propertyId = 0;
let owner: TestClient;
let manager: TestClient;

/** Waits for the server's catcher to hold a message to `to`, and returns it. */
async function mailTo(to: string) {
  const folder = path.join(inject('dataDir'), 'mail');
  for (let i = 0; i < 150; i++) {
    const found = (await listCaughtMail(folder, 500)).find((mail) => mail.to === to);
    if (found) return found;
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  throw new Error(`no e-mail to ${to} arrived`);
}

function tokenIn(text: string): string {
  const match = /\/invitations\/accept\?token=([\w-]+)/.exec(text);
  if (!match) throw new Error(`no accept link in:\n${text}`);
  return match[1]!;
}

beforeAll(async () => {
  const first = await signedInClient('inv-owner');
  owner = first.client;
  const created = await owner.json<{ property: { id: number } }>('POST', '/api/properties', { name: 'Wattle Gully', crs: 'EPSG:7854' });
  propertyId = created.body.property.id;
  const second = await signedInClient('inv-manager');
  manager = second.client;
  await serverDb()('memberships').insert({ property_id: propertyId, user_id: second.userId, role: 'manager', created_at: new Date().toISOString() });
});
afterAll(closeServerDb);

describe('invitations', () => {
  it('a manager invites, the e-mail arrives with the link, a new account signs up and accepts with the invited role', async () => {
    const account = newAccount('invitee');
    const sent = await manager.json<{ invitation: { id: number; email: string; role: string } }>('POST', `/api/properties/${propertyId}/invitations`, { email: account.email.toUpperCase(), role: 'crew' });
    expect(sent.status).toBe(201);
    expect(sent.body.invitation).toMatchObject({ email: account.email, role: 'crew' });

    const mail = await mailTo(account.email);
    expect(mail.subject).toMatch(/invited you to Wattle Gully/);
    const baseUrl = inject('baseUrl');
    expect(mail.text).toContain(`${baseUrl}/invitations/accept?token=`);
    const token = tokenIn(mail.text);
    expect(mail.html).toContain(`href="${baseUrl}/invitations/accept?token=${token}"`);
    // The catcher holds the message a moment before the worker records it sent.
    let outbox: { status: string; attempts: number } | undefined;
    for (let i = 0; i < 50 && outbox?.status !== 'sent'; i++) {
      if (i) await new Promise((resolve) => setTimeout(resolve, 100));
      outbox = await serverDb()('outbox').where({ to: account.email }).first('status', 'attempts');
    }
    expect(outbox).toEqual({ status: 'sent', attempts: 1 });

    // Signed out, the page offers sign-in and sign-up with the address filled in, coming back here.
    const page = await new TestClient().request('GET', `/invitations/accept?token=${token}`);
    const html = await page.text();
    expect(page.status).toBe(200);
    expect(html).toContain('Wattle Gully');
    const back = encodeURIComponent(`/invitations/accept?token=${token}`);
    expect(html).toContain(`/sign-up?email=${encodeURIComponent(account.email)}&#38;callbackUrl=${back}`);
    expect(html).toContain(`/sign-in?email=${encodeURIComponent(account.email)}&#38;callbackUrl=${back}`);

    const invitee = new TestClient();
    const userId = await invitee.signUp(account);
    await invitee.signIn(account.email, account.password);
    const signedInPage = await (await invitee.request('GET', `/invitations/accept?token=${token}`)).text();
    expect(signedInPage).toContain('data-accept-invitation');

    const accepted = await invitee.json('POST', '/api/invitations/accept', { token });
    expect(accepted).toEqual({ status: 200, body: { membership: { propertyId, role: 'crew' } } });
    expect(await serverDb()('memberships').where({ property_id: propertyId, user_id: userId }).first('role')).toEqual({ role: 'crew' });
    const audit = await serverDb()('audit_log').where({ property_id: propertyId }).pluck('action');
    expect(audit).toEqual(expect.arrayContaining(['invitation.create', 'membership.add', 'invitation.accept']));

    const again = await invitee.json<{ error: string }>('POST', '/api/invitations/accept', { token });
    expect(again.status).toBe(410);
    expect(again.body.error).toMatch(/already been used/);
    const list = await manager.json<{ invitations: { id: number }[] }>('GET', `/api/properties/${propertyId}/invitations`);
    expect(list.body.invitations.map((i) => i.id)).not.toContain(sent.body.invitation.id);
  });

  it('a revoked invitation leaves the list and its link is refused', async () => {
    const account = newAccount('revoked');
    const sent = await manager.json<{ invitation: { id: number } }>('POST', `/api/properties/${propertyId}/invitations`, { email: account.email, role: 'viewer' });
    const token = tokenIn((await mailTo(account.email)).text);
    const before = await manager.json<{ invitations: { id: number }[] }>('GET', `/api/properties/${propertyId}/invitations`);
    expect(before.body.invitations.map((i) => i.id)).toContain(sent.body.invitation.id);
    expect((await manager.request('DELETE', `/api/properties/${propertyId}/invitations/${sent.body.invitation.id}`)).status).toBe(204);
    const after = await manager.json<{ invitations: { id: number }[] }>('GET', `/api/properties/${propertyId}/invitations`);
    expect(after.body.invitations.map((i) => i.id)).not.toContain(sent.body.invitation.id);
    const invitee = new TestClient();
    await invitee.signUp(account);
    await invitee.signIn(account.email, account.password);
    const refused = await invitee.json<{ error: string }>('POST', '/api/invitations/accept', { token });
    expect(refused.status).toBe(410);
    expect(refused.body.error).toMatch(/withdrawn/);
  });

  it('refuses a link opened by an account with another address', async () => {
    const account = newAccount('meant');
    await manager.json('POST', `/api/properties/${propertyId}/invitations`, { email: account.email, role: 'crew' });
    const token = tokenIn((await mailTo(account.email)).text);
    const other = await signedInClient('other');
    const refused = await other.client.json<{ error: string }>('POST', '/api/invitations/accept', { token });
    expect(refused.status).toBe(403);
    expect(refused.body.error).toContain(account.email);
    expect(await serverDb()('memberships').where({ property_id: propertyId, user_id: other.userId }).first()).toBeUndefined();
  });

  it('a manager may not invite an owner, and nothing is stored or sent', async () => {
    const before = await rowCounts('invitations', 'outbox', 'audit_log');
    const refused = await manager.json<{ error: string }>('POST', `/api/properties/${propertyId}/invitations`, { email: newAccount('boss').email, role: 'owner' });
    expect(refused.status).toBe(403);
    expect(refused.body.error).toMatch(/Only an owner/);
    expect(await rowCounts('invitations', 'outbox', 'audit_log')).toEqual(before);
  });

  it('a bad e-mail address gets 422 with the field named, and changes nothing', async () => {
    const before = await rowCounts('invitations', 'outbox', 'audit_log');
    const refused = await owner.json<{ error: string; fields: Record<string, string> }>('POST', `/api/properties/${propertyId}/invitations`, { email: 'not an address', role: 'crew' });
    expect(refused.status).toBe(422);
    expect(refused.body.fields.email).toMatch(/valid e-mail/);
    const badRole = await owner.json<{ fields: Record<string, string> }>('POST', `/api/properties/${propertyId}/invitations`, { email: 'ok@test.example', role: 'boss' });
    expect(badRole.status).toBe(422);
    expect(Object.keys(badRole.body.fields)).toEqual(['role']);
    expect(await rowCounts('invitations', 'outbox', 'audit_log')).toEqual(before);
  });

  it('keeps the developer mail page closed in production unless it is switched on', async () => {
    const response = await owner.request('GET', '/dev/mail');
    expect(response.status).toBe(404);
    expect(await response.text()).not.toContain('Outbox');
  });
});
