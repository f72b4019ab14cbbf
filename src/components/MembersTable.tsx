import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { ApiError, api } from '../lib/client/api';
import type { Member } from '../lib/schemas/property';
import { ROLES, type Role } from '../lib/schemas/roles';
import { withQueryClient } from './QueryRoot';

type Props = { propertyId: number; currentUserId: number; canManage: boolean; initialMembers: Member[] };

/** The people on a property and their roles; owners change roles and remove people here. */
function MembersTable({ propertyId, currentUserId, canManage, initialMembers }: Props) {
  const queryClient = useQueryClient();
  const queryKey = ['members', propertyId];
  const members = useQuery({ queryKey, queryFn: () => api.listMembers(propertyId).then((r) => r.members), initialData: initialMembers });
  const refresh = () => queryClient.invalidateQueries({ queryKey });
  const change = useMutation({ mutationFn: (v: { userId: number; role: Role }) => api.changeRole(propertyId, v.userId, v.role), onSettled: refresh });
  const remove = useMutation({ mutationFn: (userId: number) => api.removeMember(propertyId, userId), onSettled: refresh });
  const error = change.error ?? remove.error;

  return (
    <div>
      {error && (
        <div className="alert-error mb-3" role="alert">
          {error instanceof ApiError ? error.message : 'The change could not be saved.'}
        </div>
      )}
      <table className="w-full border-collapse text-left" data-testid="members-table">
        <thead>
          <tr className="border-b border-sand-300 text-sm text-bark-500">
            <th className="py-2 pr-3 font-semibold">Name</th>
            <th className="py-2 pr-3 font-semibold">E-mail</th>
            <th className="py-2 pr-3 font-semibold">Role</th>
            {canManage && <th className="py-2 font-semibold"><span className="sr-only">Actions</span></th>}
          </tr>
        </thead>
        <tbody>
          {members.data.map((member) => (
            <tr key={member.userId} className="border-b border-sand-200">
              <td className="py-2 pr-3">
                {member.name}
                {member.userId === currentUserId && <span className="text-bark-500"> (you)</span>}
              </td>
              <td className="py-2 pr-3 break-all">{member.email}</td>
              <td className="py-2 pr-3">
                {canManage ? (
                  <select
                    aria-label={`Role of ${member.name}`}
                    className="min-h-11 rounded-lg border border-sand-300 bg-white px-2"
                    value={member.role}
                    disabled={change.isPending}
                    onChange={(e) => change.mutate({ userId: member.userId, role: e.target.value as Role })}
                  >
                    {ROLES.map((role) => (
                      <option key={role} value={role}>
                        {role}
                      </option>
                    ))}
                  </select>
                ) : (
                  member.role
                )}
              </td>
              {canManage && (
                <td className="py-2 text-right">
                  <button
                    type="button"
                    className="btn-quiet"
                    disabled={remove.isPending}
                    onClick={() => {
                      if (confirm(`Remove ${member.name} from this property?`)) remove.mutate(member.userId);
                    }}
                  >
                    Remove
                  </button>
                </td>
              )}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export default withQueryClient(MembersTable);
