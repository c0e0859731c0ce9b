import { PageHeader } from '@/components/page-header';
import { Panel } from '@/components/panel';
import { useSession } from '@/features/auth/api/get-session';
import { InvitationList } from '@/features/invitations/components/invitation-list';
import { InviteUserForm } from '@/features/invitations/components/invite-user-form';
import { UserTable } from '@/features/users/components/user-table';

/** /admin: people, roles and invitations of the organisation. */
export function AdminRoute() {
  const session = useSession();
  const user = session.data?.user;
  if (!user) return null;
  return (
    <div className="max-w-6xl">
      <PageHeader title="Admin" subtitle="People of your organisation, their roles, and invitations." />
      <div className="grid items-start gap-4 xl:grid-cols-[1fr_320px]">
        <Panel title="Users">
          <UserTable currentUserId={user.id} />
        </Panel>
        <div className="space-y-4">
          <Panel title="Invite someone">
            <InviteUserForm />
          </Panel>
          <Panel title="Pending invitations">
            <InvitationList />
          </Panel>
        </div>
      </div>
    </div>
  );
}
