import { Suspense } from 'react';
import { NavLink, Outlet, useNavigate } from 'react-router-dom';
import clsx from 'clsx';
import type { SessionDTO } from '@shared/api/session';
import { Button } from '@/components/button';
import { Logo } from '@/components/logo';
import { RoleBadge } from '@/components/role-badge';
import { useSignOut } from '@/features/auth/api/sign-out';
import { navigationFor } from './navigation';

/** The signed-in frame: a dark rail with the navigation the role may use, and the page. */
export function AppLayout({ session }: { session: SessionDTO & { user: NonNullable<SessionDTO['user']> } }) {
  const { user, organisation } = session;
  const signOut = useSignOut();
  const navigate = useNavigate();

  return (
    <div className="flex min-h-screen">
      <aside className="flex w-52 shrink-0 flex-col bg-rail text-rail-ink">
        <div className="border-b border-white/10 px-4 py-3">
          <div className="flex items-center gap-2 text-paper">
            <Logo className="h-5 w-5 text-[#8fc9b6]" />
            <span className="text-[15px] font-semibold tracking-tight">Doublet</span>
          </div>
          <div className="mt-1 truncate text-xs text-rail-ink/70" title={organisation?.name}>
            {organisation?.name}
          </div>
        </div>
        <nav aria-label="Main" className="flex-1 px-2 py-3">
          <ul className="space-y-0.5">
            {navigationFor(user.role).map((item) => (
              <li key={item.to}>
                <NavLink
                  to={item.to}
                  end={item.to === '/'}
                  className={({ isActive }) =>
                    clsx(
                      'block rounded-sm border-l-2 px-3 py-1.5 text-sm',
                      isActive
                        ? 'border-[#8fc9b6] bg-rail-active text-paper'
                        : 'border-transparent hover:bg-rail-active/60 hover:text-paper',
                    )
                  }
                >
                  {item.label}
                </NavLink>
              </li>
            ))}
          </ul>
        </nav>
        <div className="border-t border-white/10 px-4 py-3 text-sm">
          <NavLink to="/account" className="block truncate text-paper hover:underline" title={user.email}>
            {user.name}
          </NavLink>
          <div className="mt-1 flex items-center justify-between">
            <RoleBadge role={user.role} />
            <Button
              variant="ghost"
              className="-mr-2 px-2 py-0.5 text-xs"
              disabled={signOut.isPending}
              onClick={() => signOut.mutate(undefined, { onSuccess: () => navigate('/sign-in', { replace: true }) })}
            >
              Sign out
            </Button>
          </div>
        </div>
      </aside>
      <main className="min-w-0 flex-1 px-8 py-6">
        {/* Pages are loaded on first visit; the navigation stays while one arrives. */}
        <Suspense
          fallback={
            <p className="text-sm text-muted" role="status">
              Loading…
            </p>
          }
        >
          <Outlet />
        </Suspense>
      </main>
    </div>
  );
}
