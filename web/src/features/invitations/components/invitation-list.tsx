import { Button } from '@/components/button';
import { Notice, errorMessage } from '@/components/notice';
import { RoleBadge } from '@/components/role-badge';
import { formatDateTime } from '@/lib/format';
import { useInvitations } from '@/features/invitations/api/get-invitations';
import { useRevokeInvitation } from '@/features/invitations/api/revoke-invitation';

/** Pending invitations with their expiry, each revocable. */
export function InvitationList() {
  const invitations = useInvitations();
  const revoke = useRevokeInvitation();
  if (invitations.isPending) return <p className="text-sm text-muted">Loading invitations…</p>;
  if (invitations.isError) return <Notice tone="error">{errorMessage(invitations.error)}</Notice>;
  if (invitations.data.invitations.length === 0) return <p className="text-sm text-muted">No pending invitations.</p>;
  return (
    <ul className="divide-y divide-line text-sm">
      {invitations.data.invitations.map((invitation) => (
        <li key={invitation.id} className="flex items-center justify-between gap-3 py-2">
          <div className="min-w-0">
            <div className="flex items-center gap-2">
              <span className="font-medium">{invitation.name}</span>
              <RoleBadge role={invitation.role} />
            </div>
            <div className="truncate font-mono text-xs text-muted">
              {invitation.email} · expires {formatDateTime(invitation.expiresAt)}
            </div>
          </div>
          <Button variant="secondary" className="px-2 py-1 text-xs" disabled={revoke.isPending} onClick={() => revoke.mutate(invitation.id)}>
            Revoke
          </Button>
        </li>
      ))}
    </ul>
  );
}
