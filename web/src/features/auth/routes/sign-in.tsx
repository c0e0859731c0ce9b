import { Navigate, useLocation, useNavigate } from 'react-router-dom';
import { Logo } from '@/components/logo';
import { useSession } from '@/features/auth/api/get-session';
import { SignInForm } from '@/features/auth/components/sign-in-form';

/** /sign-in: the form, or straight on to where the visitor was going once signed in. */
export function SignInRoute() {
  const session = useSession();
  const navigate = useNavigate();
  const location = useLocation();
  const next = (location.state as { from?: string } | null)?.from ?? '/';
  if (session.data?.user) return <Navigate to={next} replace />;

  return (
    <div className="flex min-h-screen items-center justify-center bg-rail px-4">
      <div className="w-full max-w-sm">
        <div className="mb-6 flex items-center gap-2 text-paper">
          <Logo className="h-6 w-6 text-[#8fc9b6]" />
          <span className="text-xl font-semibold tracking-tight">Doublet</span>
        </div>
        <div className="rounded-sm border border-line bg-panel p-6 shadow-sm">
          <h1 className="mb-1 text-base font-semibold">Sign in</h1>
          <p className="mb-5 text-sm text-muted">Near-miss clones across your repositories, release by release.</p>
          <SignInForm onSignedIn={() => navigate(next, { replace: true })} />
        </div>
      </div>
    </div>
  );
}
