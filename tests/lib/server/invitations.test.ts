import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, db, ensureMigrated } from '../../../src/lib/server/db';
import { ConflictError, ForbiddenError, GoneError, NotFoundError } from '../../../src/lib/server/http';
import { sendNextDueMail } from '../../../src/lib/server/mail/outbox';
import { listAuditForProperty } from '../../../src/lib/server/repos/audit-log';
import {
  acceptInvitation, createInvitation, findInvitationByToken, hashToken, listPendingInvitations, revokeInvitation,
} from '../../../src/lib/server/repos/invitations';
import { changeRole, findRole } from '../../../src/lib/server/repos/memberships';
import { createProperty } from '../../../src/lib/server/repos/properties';
import { createUser } from '../../../src/lib/server/repos/users';
import type { Role } from '../../../src/lib/schemas/roles';

type Inviter = { id: number; name: string; role: Role };
let owner: Inviter = { id: 0, name: 'Olive Owner', role: 'owner' };
let propertyId = 0;
let counter = 0;

async function person(label: string) {
  counter += 1;
  return createUser({ email: `${label}-${counter}@invite.example`, name: `${label} ${counter}`, passwordHash: 'hash' });
}

function invite(email: string, role: Role, by: Inviter = owner, now?: Date) {
  return createInvitation({ propertyId, email, role, invitedBy: by, origin: 'http://127.0.0.1:4321', now });
}

beforeAll(async () => {
  await ensureMigrated();
  const user = await createUser({ email: 'olive@invite.example', name: 'Olive Owner', passwordHash: 'hash' });
  owner = { ...owner, id: user.id };
  propertyId = (await createProperty({ name: 'Ironbark Flat', region: '', crs: 'EPSG:7854' }, user.id)).id;
});
afterAll(closeDb);

describe('invitations', () => {
  it('stores only the hash of a random 32-byte token and queues the e-mail with the link, in one go', async () => {
    const invitee = await person('crew');
    const outboxBefore = await db()('outbox').count<{ n: number }[]>({ n: '*' });
    const { invitation, token } = await invite(invitee.email, 'crew');
    expect(Buffer.from(token, 'base64url')).toHaveLength(32);
    const row = await db()('invitations').where({ id: invitation.id }).first();
    expect(row.token_hash).toBe(hashToken(token));
    expect(JSON.stringify(row)).not.toContain(token);
    const outboxAfter = await db()('outbox').count<{ n: number }[]>({ n: '*' });
    expect(outboxAfter[0]!.n).toBe(outboxBefore[0]!.n + 1);
    const mail = await db()('outbox').orderBy('id', 'desc').first();
    expect(mail.to).toBe(invitee.email);
    expect(mail.text).toContain(`http://127.0.0.1:4321/invitations/accept?token=${token}`);
    expect(Date.parse(invitation.expiresAt) - Date.parse(invitation.createdAt)).toBe(7 * 24 * 3_600_000);
  });

  it('shows the invitation e-mail’s delivery: queued, refused and retried, then failed', async () => {
    const invitee = await person('unreachable');
    const { invitation } = await invite(invitee.email, 'crew');
    expect(invitation.mail).toEqual({ status: 'queued', attempts: 0, lastError: null, nextAttemptAt: null });
    // Only this message is due, so the worker's next pick is ours.
    await db()('outbox').whereNot({ id: db()('invitations').where({ id: invitation.id }).select('outbox_id') }).update({ status: 'sent' });
    const mailOf = async () => (await listPendingInvitations(propertyId)).find((i) => i.id === invitation.id)?.mail;
    // Port 1 on loopback: nothing listens, the connection is refused.
    const refused = { smtpUrl: 'smtp://127.0.0.1:1', maxAttempts: 2 };
    await sendNextDueMail({ ...refused, now: new Date() });
    const retrying = await mailOf();
    expect(retrying).toMatchObject({ status: 'queued', attempts: 1 });
    expect(retrying?.lastError).toMatch(/ECONNREFUSED|connect/i);
    expect(Date.parse(retrying!.nextAttemptAt!)).toBeGreaterThan(Date.now());
    await sendNextDueMail({ ...refused, now: new Date(Date.now() + 24 * 3_600_000) });
    const failed = await mailOf();
    expect(failed).toMatchObject({ status: 'failed', attempts: 2, nextAttemptAt: null });
    expect(failed?.lastError).toMatch(/^Gave up after 2 attempts/);
  });

  it('adds the membership with the invited role once, then refuses the same link', async () => {
    const invitee = await person('manager');
    const { token } = await invite(invitee.email, 'manager');
    expect(await acceptInvitation(token, invitee)).toEqual({ propertyId, role: 'manager' });
    expect(await findRole(propertyId, invitee.id)).toBe('manager');
    await expect(acceptInvitation(token, invitee)).rejects.toThrow(/already been used/);
    await expect(acceptInvitation(token, invitee)).rejects.toBeInstanceOf(GoneError);
    const actions = (await listAuditForProperty(propertyId)).map((entry) => entry.action);
    expect(actions).toEqual(expect.arrayContaining(['invitation.create', 'membership.add', 'invitation.accept']));
  });

  it('refuses an expired link and changes nothing', async () => {
    const invitee = await person('late');
    const { token } = await invite(invitee.email, 'crew', owner, new Date(Date.now() - 8 * 24 * 3_600_000));
    expect((await findInvitationByToken(token))?.state).toBe('expired');
    await expect(acceptInvitation(token, invitee)).rejects.toThrow(/expired/);
    expect(await findRole(propertyId, invitee.id)).toBeUndefined();
  });

  it('refuses a revoked link, and a revoked invitation leaves the pending list', async () => {
    const invitee = await person('revoked');
    const { invitation, token } = await invite(invitee.email, 'viewer');
    expect((await listPendingInvitations(propertyId)).map((i) => i.id)).toContain(invitation.id);
    await revokeInvitation(propertyId, invitation.id, owner.id);
    expect((await listPendingInvitations(propertyId)).map((i) => i.id)).not.toContain(invitation.id);
    await expect(acceptInvitation(token, invitee)).rejects.toThrow(/withdrawn/);
    await expect(revokeInvitation(propertyId, invitation.id, owner.id)).rejects.toBeInstanceOf(ConflictError);
    await expect(revokeInvitation(propertyId + 1000, invitation.id, owner.id)).rejects.toBeInstanceOf(NotFoundError);
    expect(await findRole(propertyId, invitee.id)).toBeUndefined();
    expect((await listAuditForProperty(propertyId)).some((e) => e.action === 'invitation.revoke' && e.entityId === String(invitation.id))).toBe(true);
  });

  it('refuses a link accepted by someone signed in with another address', async () => {
    const invitee = await person('right');
    const other = await person('wrong');
    const { token } = await invite(invitee.email, 'crew');
    await expect(acceptInvitation(token, other)).rejects.toBeInstanceOf(ForbiddenError);
    await expect(acceptInvitation(token, other)).rejects.toThrow(invitee.email);
    expect(await findRole(propertyId, other.id)).toBeUndefined();
    expect((await findInvitationByToken(token))?.state).toBe('pending');
  });

  it('refuses an unknown token', async () => {
    const someone = await person('guess');
    await expect(acceptInvitation('x'.repeat(43), someone)).rejects.toBeInstanceOf(NotFoundError);
  });

  it('lets only an owner invite an owner, and refuses to invite a member', async () => {
    const manager = await person('mgr');
    await db()('memberships').insert({ property_id: propertyId, user_id: manager.id, role: 'manager', created_at: new Date().toISOString() });
    const target = await person('future-owner');
    await expect(invite(target.email, 'owner', { id: manager.id, name: manager.name, role: 'manager' })).rejects.toBeInstanceOf(ForbiddenError);
    await expect(invite('olive@invite.example', 'crew')).rejects.toBeInstanceOf(ConflictError);
    const { token } = await invite(target.email, 'owner');
    expect((await acceptInvitation(token, target)).role).toBe('owner');
  });

  it('a newer invitation to the same address replaces the older link', async () => {
    const invitee = await person('twice');
    const first = await invite(invitee.email, 'viewer');
    const second = await invite(invitee.email, 'crew');
    await expect(acceptInvitation(first.token, invitee)).rejects.toThrow(/withdrawn/);
    expect((await acceptInvitation(second.token, invitee)).role).toBe('crew');
  });

  it('never lowers a member’s role, so the last owner stays an owner', async () => {
    const { id } = await createUser({ email: 'solo@invite.example', name: 'Solo', passwordHash: 'h' });
    const solo: Inviter = { id, name: 'Solo', role: 'owner' };
    const own = await createProperty({ name: 'Solo Creek', region: '', crs: 'EPSG:7854' }, id);
    // An invitation to an address that becomes the owner's only after it was sent (the owner joined meanwhile).
    const [row] = await db()('invitations')
      .insert({ property_id: own.id, email: 'solo@invite.example', role: 'viewer', token_hash: hashToken('solo-token-0123456789abcdef'), invited_by: solo.id, expires_at: new Date(Date.now() + 3_600_000).toISOString(), created_at: new Date().toISOString() })
      .returning('id');
    expect(row.id).toBeGreaterThan(0);
    expect(await acceptInvitation('solo-token-0123456789abcdef', { id, email: 'solo@invite.example' })).toEqual({ propertyId: own.id, role: 'owner' });
    expect(await findRole(own.id, id)).toBe('owner');
    await expect(changeRole(own.id, id, 'crew', id)).rejects.toThrow(/at least one owner/);
  });
});
