import { PageHeader } from '@/components/page-header';
import { Panel } from '@/components/panel';
import { RoleBadge } from '@/components/role-badge';
import { useSession } from '@/features/auth/api/get-session';
import { ChangePasswordForm } from '@/features/auth/components/change-password-form';
import { NoticePreferencesForm } from '@/features/notices/components/notice-preferences-form';

/** /account: who you are, your password, and which notice mails you receive. */
export function AccountRoute() {
  const user = useSession().data?.user;
  if (!user) return null;
  return (
    <div className="max-w-3xl space-y-4">
      <PageHeader title="Account" subtitle={<span className="font-mono">{user.email}</span>} />
      <Panel title="Profile">
        <div className="flex items-center gap-3 text-sm">
          <span className="font-medium">{user.name}</span>
          <RoleBadge role={user.role} />
        </div>
      </Panel>
      <Panel title="Change password">
        <ChangePasswordForm />
      </Panel>
      <div id="notices">
        <Panel title="Notice mails">
          <NoticePreferencesForm />
        </Panel>
      </div>
    </div>
  );
}
