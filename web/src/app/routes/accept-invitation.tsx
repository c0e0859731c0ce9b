import { useNavigate, useParams } from 'react-router-dom';
import { Logo } from '@/components/logo';
import { Notice } from '@/components/notice';
import { useSignIn } from '@/features/auth/api/sign-in';
import { useInvitationPreview } from '@/features/invitations/api/get-invitation-preview';
import { AcceptInvitationForm } from '@/features/invitations/components/accept-invitation-form';

/** /invitations/:token: the one-time link from the mail. Accepting signs the new user straight in. */
export function AcceptInvitationRoute() {
  const { token = '' } = useParams();
  const preview = useInvitationPreview(token);
  const signIn = useSignIn();
  const navigate = useNavigate();

  return (
    <div className="flex min-h-screen items-center justify-center bg-rail px-4">
      <div className="w-full max-w-sm">
        <div className="mb-6 flex items-center gap-2 text-paper">
          <Logo className="h-6 w-6 text-[#8fc9b6]" />
          <span className="text-xl font-semibold tracking-tight">Doublet</span>
        </div>
        <div className="rounded-sm border border-line bg-panel p-6">
          <h1 className="mb-4 text-base font-semibold">Accept invitation</h1>
          {preview.isPending ? <p className="text-sm text-muted">Checking the link…</p> : null}
          {preview.isError ? (
            <Notice tone="warning">This link is no longer valid: it was used, revoked or has expired. Ask an admin for a new one.</Notice>
          ) : null}
          {preview.data ? (
            <AcceptInvitationForm
              token={token}
              preview={preview.data}
              onAccepted={(credentials) => signIn.mutate(credentials, { onSuccess: () => navigate('/', { replace: true }) })}
            />
          ) : null}
        </div>
      </div>
    </div>
  );
}
