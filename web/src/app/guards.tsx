import type { ReactNode } from 'react';
import { Navigate, Outlet, useLocation } from 'react-router-dom';
import { can, type Action } from '@shared/permissions';
import { Notice, errorMessage } from '@/components/notice';
import { useSession } from '@/features/auth/api/get-session';
import { AppLayout } from './layout';

/** Signed-in pages: the layout around them, or the sign-in page (coming back here afterwards). */
export function SignedInFrame() {
  const session = useSession();
  const location = useLocation();
  if (session.isPending) return <div className="p-8 text-sm text-muted">Loading…</div>;
  if (session.isError) {
    return (
      <div className="p-8">
        <Notice tone="error">{errorMessage(session.error)}</Notice>
      </div>
    );
  }
  const { user } = session.data;
  if (!user) return <Navigate to="/sign-in" replace state={{ from: location.pathname }} />;
  return <AppLayout session={{ ...session.data, user }} />;
}

/** Renders its children only for roles allowed the action (the server refuses the rest anyway). */
export function RequireAction({ action, children }: { action: Action; children?: ReactNode }) {
  const session = useSession();
  const role = session.data?.user?.role;
  if (!role || !can(role, action)) {
    return (
      <div className="max-w-lg">
        <h1 className="mb-2 text-lg font-semibold">Not available to your role</h1>
        <p className="text-sm text-muted">Ask an admin of your organisation if you need this.</p>
      </div>
    );
  }
  return children ?? <Outlet />;
}
