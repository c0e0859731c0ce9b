import { ROLES, ROLE_LABELS, type Role } from '@shared/roles';
import type { UserDTO } from '@shared/api/users';
import { Button } from '@/components/button';
import { Notice, errorMessage } from '@/components/notice';
import { RoleBadge } from '@/components/role-badge';
import { formatDateTime } from '@/lib/format';
import { useChangeRole } from '@/features/users/api/change-role';
import { useDeactivateUser } from '@/features/users/api/deactivate-user';
import { useUsers } from '@/features/users/api/get-users';

function UserRow({ user, isSelf }: { user: UserDTO; isSelf: boolean }) {
  const changeRole = useChangeRole();
  const deactivate = useDeactivateUser();
  const locked = isSelf || !user.active;
  return (
    <tr className="border-t border-line align-middle">
      <td className="py-2 pr-4">
        <div className="font-medium">{user.name}</div>
        <div className="font-mono text-xs text-muted">{user.email}</div>
      </td>
      <td className="py-2 pr-4">
        {locked ? (
          <RoleBadge role={user.role} />
        ) : (
          <select
            aria-label={`Role of ${user.name}`}
            className="rounded-sm border border-line bg-white px-1.5 py-1 text-sm"
            value={user.role}
            disabled={changeRole.isPending}
            onChange={(e) => changeRole.mutate({ id: user.id, role: e.target.value as Role })}
          >
            {ROLES.map((role) => (
              <option key={role} value={role}>
                {ROLE_LABELS[role]}
              </option>
            ))}
          </select>
        )}
        {changeRole.isError ? <div className="mt-1 text-xs text-danger">{errorMessage(changeRole.error)}</div> : null}
      </td>
      <td className="py-2 pr-4 font-mono text-xs text-muted">{formatDateTime(user.lastSignedInAt)}</td>
      <td className="py-2 pr-4 text-xs">
        {user.active ? <span className="text-accent">active</span> : <span className="text-muted">deactivated</span>}
      </td>
      <td className="py-2 text-right">
        {locked ? (
          isSelf ? <span className="text-xs text-muted">you</span> : null
        ) : (
          <Button
            variant="danger"
            className="px-2 py-1 text-xs"
            disabled={deactivate.isPending}
            onClick={() => {
              if (window.confirm(`Deactivate ${user.name}? They are signed out and can no longer sign in.`)) {
                deactivate.mutate(user.id);
              }
            }}
          >
            Deactivate
          </Button>
        )}
      </td>
    </tr>
  );
}

/** The organisation's users: role changes and deactivation in place. */
export function UserTable({ currentUserId }: { currentUserId: string }) {
  const users = useUsers();
  if (users.isPending) return <p className="text-sm text-muted">Loading users…</p>;
  if (users.isError) return <Notice tone="error">{errorMessage(users.error)}</Notice>;
  return (
    <table className="w-full text-sm">
      <thead>
        <tr className="text-left text-xs tracking-wide text-muted uppercase">
          <th className="pb-2 font-semibold">Person</th>
          <th className="pb-2 font-semibold">Role</th>
          <th className="pb-2 font-semibold">Last sign-in</th>
          <th className="pb-2 font-semibold">Status</th>
          <th className="pb-2" />
        </tr>
      </thead>
      <tbody>
        {users.data.users.map((user) => (
          <UserRow key={user.id} user={user} isSelf={user.id === currentUserId} />
        ))}
      </tbody>
    </table>
  );
}
