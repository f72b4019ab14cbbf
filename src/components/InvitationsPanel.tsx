import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { ApiError, api } from '../lib/client/api';
import type { Invitation } from '../lib/schemas/invitation';
import { ROLES, type Role } from '../lib/schemas/roles';
import { withQueryClient } from './QueryRoot';

type Props = { propertyId: number; canInviteOwners: boolean; initialInvitations: Invitation[] };

/** Owners and managers invite people by e-mail and revoke invitations not yet accepted. */
function InvitationsPanel({ propertyId, canInviteOwners, initialInvitations }: Props) {
  const queryClient = useQueryClient();
  const queryKey = ['invitations', propertyId];
  const invitations = useQuery({
    queryKey,
    queryFn: () => api.listInvitations(propertyId).then((r) => r.invitations),
    initialData: initialInvitations,
    // While an e-mail is still on its way, look again so its state does not go stale on screen.
    refetchInterval: (query) => (query.state.data?.some((i) => i.mail?.status === 'queued' || i.mail?.status === 'sending') ? 5000 : false),
  });
  const refresh = () => queryClient.invalidateQueries({ queryKey });
  const roles = ROLES.filter((role) => canInviteOwners || role !== 'owner');
  const [email, setEmail] = useState('');
  const [role, setRole] = useState<Role>('crew');
  const [notice, setNotice] = useState('');
  const invite = useMutation({
    mutationFn: () => api.createInvitation(propertyId, { email, role }),
    onSuccess: ({ invitation }) => {
      setNotice(`Invitation to ${invitation.email} saved; its e-mail is on its way.`);
      setEmail('');
    },
    onSettled: refresh,
  });
  const revoke = useMutation({ mutationFn: (id: number) => api.revokeInvitation(propertyId, id), onSettled: refresh });
  const error = invite.error ?? revoke.error;
  const emailProblem = invite.error instanceof ApiError ? invite.error.fields.email : undefined;

  const submit = (event: { preventDefault(): void }) => {
    event.preventDefault();
    setNotice('');
    invite.mutate();
  };

  return (
    <div className="flex flex-col gap-4" data-testid="invitations-panel">
      <form className="flex flex-col gap-3 sm:flex-row sm:items-end" onSubmit={submit} noValidate>
        <div className="field flex-1">
          <label htmlFor="invite-email">E-mail</label>
          <input
            id="invite-email"
            type="email"
            autoComplete="off"
            value={email}
            onChange={(e) => setEmail(e.target.value)}
            aria-invalid={emailProblem ? true : undefined}
            aria-describedby="invite-email-error"
            required
          />
          <p className="field-error" id="invite-email-error">{emailProblem}</p>
        </div>
        <div className="field">
          <label htmlFor="invite-role">Role</label>
          <select id="invite-role" className="min-h-11 rounded-lg border border-sand-300 bg-white px-2" value={role} onChange={(e) => setRole(e.target.value as Role)}>
            {roles.map((r) => (
              <option key={r} value={r}>
                {r}
              </option>
            ))}
          </select>
        </div>
        <button type="submit" className="btn-primary" disabled={invite.isPending}>
          {invite.isPending ? 'Sending…' : 'Send invitation'}
        </button>
      </form>
      {error && (
        <div className="alert-error" role="alert">
          {error instanceof ApiError ? error.message : 'The change could not be saved.'}
        </div>
      )}
      {notice && !error && <p role="status" className="text-sm text-bark-700">{notice}</p>}
      <h3 className="text-lg font-bold">Waiting for an answer</h3>
      {invitations.data.length === 0 ? (
        <p className="text-sm text-bark-500">No invitations are waiting.</p>
      ) : (
        <ul className="divide-y divide-sand-200" data-testid="pending-invitations">
          {invitations.data.map((invitation) => (
            <li key={invitation.id} className="flex flex-wrap items-center gap-x-3 gap-y-1 py-2">
              <span className="break-all font-semibold">{invitation.email}</span>
              <span>{invitation.role}</span>
              <span className="text-sm text-bark-500">
                {invitation.expired ? 'expired' : `until ${new Date(invitation.expiresAt).toLocaleDateString('en-AU')}`}
                {invitation.invitedByName && ` · invited by ${invitation.invitedByName}`}
              </span>
              <button
                type="button"
                className="btn-quiet ml-auto"
                disabled={revoke.isPending}
                onClick={() => {
                  if (confirm(`Revoke the invitation to ${invitation.email}? The link will stop working.`)) revoke.mutate(invitation.id);
                }}
              >
                Revoke
              </button>
              <MailState invitation={invitation} />
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}

/** Whether the invitation e-mail went: a failed send is shown, with what to do about it. */
function MailState({ invitation }: { invitation: Invitation }) {
  const mail = invitation.mail;
  if (!mail) return null;
  const time = (iso: string) => new Date(iso).toLocaleTimeString('en-AU', { hour: 'numeric', minute: '2-digit' });
  if (mail.status === 'sent') return <span className="w-full text-sm text-saltbush-700" data-testid="invitation-mail">E-mail sent.</span>;
  if (mail.status === 'failed') {
    return (
      <span className="w-full text-sm font-semibold text-clay-600" data-testid="invitation-mail" data-state="failed">
        The e-mail could not be sent{mail.lastError ? `: ${mail.lastError}` : ''}. Check the address and invite again, or give them the news another way.
      </span>
    );
  }
  if (mail.attempts > 0) {
    return (
      <span className="w-full text-sm text-clay-600" data-testid="invitation-mail" data-state="retrying">
        Not sent yet: the mail server refused it{mail.lastError ? ` (${mail.lastError})` : ''}. Trying again
        {mail.nextAttemptAt ? ` at ${time(mail.nextAttemptAt)}` : ' soon'}.
      </span>
    );
  }
  return <span className="w-full text-sm text-bark-500" data-testid="invitation-mail">E-mail on its way.</span>;
}

export default withQueryClient(InvitationsPanel);
