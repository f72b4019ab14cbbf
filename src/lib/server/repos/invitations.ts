import { createHash, randomBytes } from 'node:crypto';
import type { Knex } from 'knex';
import type { Invitation } from '../../schemas/invitation';
import type { MailDelivery } from '../../schemas/mail-delivery';
import { hasRole, type Role } from '../../schemas/roles';
import { getConfig } from '../config';
import { db } from '../db';
import { ConflictError, ForbiddenError, GoneError, NotFoundError } from '../http';
import { enqueueMail } from '../mail/outbox';
import { absoluteUrl, invitationMail } from '../mail/templates';
import { recordAudit } from './audit-log';
import { addMember, findRole } from './memberships';

type InvitationRow = {
  id: number;
  property_id: number;
  email: string;
  role: Role;
  token_hash: string;
  invited_by: number | null;
  expires_at: string;
  accepted_at: string | null;
  revoked_at: string | null;
  created_at: string;
  outbox_id: number | null;
};

type MailColumns = { mail_status: MailDelivery['status'] | null; mail_attempts: number | null; mail_last_error: string | null; mail_next_attempt_at: string | null };

function rowToInvitation(row: InvitationRow & { invited_by_name?: string | null } & Partial<MailColumns>, now: Date): Invitation {
  return {
    id: row.id,
    email: row.email,
    role: row.role,
    invitedByName: row.invited_by_name ?? null,
    createdAt: row.created_at,
    expiresAt: row.expires_at,
    expired: Date.parse(row.expires_at) <= now.getTime(),
    mail: row.mail_status
      ? { status: row.mail_status, attempts: row.mail_attempts ?? 0, lastError: row.mail_last_error ?? null, nextAttemptAt: row.mail_status === 'queued' ? (row.mail_next_attempt_at ?? null) : null }
      : null,
  };
}

/** SHA-256 of the token, hex: all the database keeps. */
export function hashToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

/**
 * Invites a person by e-mail: stores the invitation (the token's hash only), writes the audit
 * entry and queues the e-mail with the accept link, in one transaction. An earlier pending
 * invitation for the same address is revoked, so only the newest link works.
 * @throws ForbiddenError when a manager invites an owner, ConflictError when the person is a member
 */
export async function createInvitation(input: {
  propertyId: number;
  email: string;
  role: Role;
  invitedBy: { id: number; name: string; role: Role };
  origin: string;
  now?: Date;
}): Promise<{ invitation: Invitation; token: string }> {
  const { propertyId, email, role, invitedBy } = input;
  if (role === 'owner' && !hasRole(invitedBy.role, 'owner')) {
    throw new ForbiddenError('Only an owner can invite another owner. Choose manager, crew or viewer.');
  }
  const now = input.now ?? new Date();
  const token = randomBytes(32).toString('base64url');
  const expiresAt = new Date(now.getTime() + getConfig().invitationExpiryMs);
  return db().transaction(async (trx) => {
    const member = await trx('memberships as m').join('users as u', 'u.id', 'm.user_id').where({ 'm.property_id': propertyId, 'u.email': email }).first('m.role');
    if (member) throw new ConflictError(`${email} is already a member of this property (${member.role}). Change their role in the list instead.`, { email: 'Already a member.' });
    const property = await trx('properties').where({ id: propertyId }).first('name');
    if (!property) throw new NotFoundError('property');
    const replaced = await trx('invitations')
      .where({ property_id: propertyId, email })
      .whereNull('accepted_at')
      .whereNull('revoked_at')
      .update({ revoked_at: now.toISOString() });
    const [row] = await trx<InvitationRow>('invitations')
      .insert({
        property_id: propertyId, email, role, token_hash: hashToken(token), invited_by: invitedBy.id,
        expires_at: expiresAt.toISOString(), created_at: now.toISOString(),
      })
      .returning('*');
    const invitation = row as InvitationRow;
    await recordAudit(
      { propertyId, userId: invitedBy.id, action: 'invitation.create', entityType: 'invitation', entityId: invitation.id, detail: { email, role, replaced } },
      trx,
    );
    const outboxId = await enqueueMail(
      invitationMail({
        to: email, propertyName: property.name as string, inviterName: invitedBy.name, role, expiresAt,
        acceptUrl: absoluteUrl(`/invitations/accept?token=${encodeURIComponent(token)}`, input.origin),
      }),
      trx,
    );
    await trx('invitations').where({ id: invitation.id }).update({ outbox_id: outboxId });
    const mail: MailColumns = { mail_status: 'queued', mail_attempts: 0, mail_last_error: null, mail_next_attempt_at: null };
    return { invitation: rowToInvitation({ ...invitation, invited_by_name: invitedBy.name, ...mail }, now), token };
  });
}

/** Invitations not yet accepted or revoked, newest first; expired ones are marked so. */
export async function listPendingInvitations(propertyId: number, now = new Date(), trx: Knex = db()): Promise<Invitation[]> {
  const rows = await trx<InvitationRow & { invited_by_name: string | null } & MailColumns>('invitations as i')
    .leftJoin('users as u', 'u.id', 'i.invited_by')
    .leftJoin('outbox as o', 'o.id', 'i.outbox_id')
    .where('i.property_id', propertyId)
    .whereNull('i.accepted_at')
    .whereNull('i.revoked_at')
    .orderBy('i.id', 'desc')
    .select('i.*', 'u.name as invited_by_name', 'o.status as mail_status', 'o.attempts as mail_attempts', 'o.last_error as mail_last_error', 'o.next_attempt_at as mail_next_attempt_at');
  return rows.map((row) => rowToInvitation(row, now));
}

/** @throws NotFoundError when no pending invitation has that id on the property */
export async function revokeInvitation(propertyId: number, invitationId: number, byUserId: number): Promise<void> {
  await db().transaction(async (trx) => {
    const row = await trx<InvitationRow>('invitations').where({ id: invitationId, property_id: propertyId }).first();
    if (!row) throw new NotFoundError('invitation');
    if (row.accepted_at) throw new ConflictError('This invitation was already accepted. Remove the member from the list instead.');
    if (row.revoked_at) throw new ConflictError('This invitation was already revoked.');
    await trx('invitations').where({ id: invitationId }).update({ revoked_at: new Date().toISOString() });
    await recordAudit(
      { propertyId, userId: byUserId, action: 'invitation.revoke', entityType: 'invitation', entityId: invitationId, detail: { email: row.email, role: row.role } },
      trx,
    );
  });
}

export type InvitationLookup = {
  invitation: Invitation;
  propertyId: number;
  propertyName: string;
  state: 'pending' | 'expired' | 'revoked' | 'accepted';
};

/** What the accept page shows for a link, or undefined for a token that matches nothing. */
export async function findInvitationByToken(token: string, now = new Date(), trx: Knex = db()): Promise<InvitationLookup | undefined> {
  const row = await trx<InvitationRow & { property_name: string; invited_by_name: string | null }>('invitations as i')
    .join('properties as p', 'p.id', 'i.property_id')
    .leftJoin('users as u', 'u.id', 'i.invited_by')
    .where('i.token_hash', hashToken(token))
    .first('i.*', 'p.name as property_name', 'u.name as invited_by_name');
  if (!row) return undefined;
  const invitation = rowToInvitation(row, now);
  const state = row.accepted_at ? 'accepted' : row.revoked_at ? 'revoked' : invitation.expired ? 'expired' : 'pending';
  return { invitation, propertyId: row.property_id, propertyName: row.property_name, state };
}

/**
 * Accepts an invitation for the signed-in user: adds the membership with the invited role (a
 * member already holding a higher role keeps it, so an owner is never demoted by a link), marks
 * the invitation used and writes the audit entries, in one transaction.
 * @throws NotFoundError for an unknown token, GoneError when used, revoked or expired,
 *   ForbiddenError when the invitation is for another e-mail address
 */
export async function acceptInvitation(token: string, user: { id: number; email: string }, now = new Date()): Promise<{ propertyId: number; role: Role }> {
  return db().transaction(async (trx) => {
    const found = await findInvitationByToken(token, now, trx);
    if (!found) throw new NotFoundError('invitation', 'This invitation link is not valid. Check that the whole link was opened, or ask for a new invitation.');
    const { invitation, propertyId, state } = found;
    if (state === 'accepted') throw new GoneError('This invitation has already been used. Ask whoever invited you for a new one if you still need access.');
    if (state === 'revoked') throw new GoneError('This invitation was withdrawn. Ask whoever invited you for a new one.');
    if (state === 'expired') throw new GoneError('This invitation has expired. Ask whoever invited you to send a new one.');
    if (invitation.email !== user.email.trim().toLowerCase()) {
      throw new ForbiddenError(`This invitation is for ${invitation.email}, and you are signed in as ${user.email}. Sign out and sign in (or create an account) with ${invitation.email}.`);
    }
    const used = await trx('invitations').where({ id: invitation.id }).whereNull('accepted_at').whereNull('revoked_at').update({ accepted_at: now.toISOString() });
    if (used === 0) throw new GoneError('This invitation has already been used.');
    const current = await findRole(propertyId, user.id, trx);
    const role = current && hasRole(current, invitation.role) ? current : invitation.role;
    if (role !== current) await addMember(propertyId, user.id, role, user.id, trx);
    await recordAudit(
      { propertyId, userId: user.id, action: 'invitation.accept', entityType: 'invitation', entityId: invitation.id, detail: { email: invitation.email, role } },
      trx,
    );
    return { propertyId, role };
  });
}
