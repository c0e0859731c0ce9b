import { Suspense, lazy, type ComponentType } from 'react';
import { BrowserRouter, Link, Route, Routes } from 'react-router-dom';
import { SignInRoute } from '@/features/auth/routes/sign-in';
import { RequireAction, SignedInFrame } from './guards';

/**
 * A page loaded on first visit: each route is its own chunk, so charts (recharts) and the code
 * highlighter (shiki and its grammars) are fetched only by the pages that show them.
 */
function page<K extends string>(load: () => Promise<Record<K, ComponentType>>, name: K) {
  return lazy(() => load().then((module) => ({ default: module[name] })));
}

const AcceptInvitationRoute = page(() => import('./routes/accept-invitation'), 'AcceptInvitationRoute');
const AccountRoute = page(() => import('./routes/account'), 'AccountRoute');
const AdminRoute = page(() => import('./routes/admin'), 'AdminRoute');
const ApiTokensRoute = page(() => import('./routes/api-tokens'), 'ApiTokensRoute');
const CloneClassRoute = page(() => import('./routes/clone-class'), 'CloneClassRoute');
const CloneClassesRoute = page(() => import('./routes/clone-classes'), 'CloneClassesRoute');
const CrossClassRoute = page(() => import('./routes/cross-class'), 'CrossClassRoute');
const FindCopiesRoute = page(() => import('./routes/find-copies'), 'FindCopiesRoute');
const OutboxRoute = page(() => import('@/features/outbox/routes/outbox'), 'OutboxRoute');
const OverviewRoute = page(() => import('./routes/overview'), 'OverviewRoute');
const RepositoriesRoute = page(() => import('./routes/repositories'), 'RepositoriesRoute');
const RepositoryRoute = page(() => import('./routes/repository'), 'RepositoryRoute');
const SnapshotRoute = page(() => import('./routes/snapshot'), 'SnapshotRoute');
const TaskRoute = page(() => import('./routes/task'), 'TaskRoute');
const TasksRoute = page(() => import('./routes/tasks'), 'TasksRoute');

/** Where a page outside the layout waits for its chunk (signed-in pages wait inside the layout). */
function PageLoading() {
  return (
    <p className="p-8 text-sm text-muted" role="status">
      Loading…
    </p>
  );
}

function NotFoundRoute() {
  return (
    <div className="max-w-lg">
      <h1 className="mb-2 text-lg font-semibold">No such page</h1>
      <Link to="/" className="text-sm text-accent hover:underline">
        Back to the overview
      </Link>
    </div>
  );
}

/** Every client route. Signed-in routes sit in the layout; each is guarded by the action it needs. */
export function AppRoutes() {
  return (
    <Routes>
      <Route path="/sign-in" element={<SignInRoute />} />
      <Route
        path="/invitations/:token"
        element={
          <Suspense fallback={<PageLoading />}>
            <AcceptInvitationRoute />
          </Suspense>
        }
      />
      <Route element={<SignedInFrame />}>
        <Route index element={<OverviewRoute />} />
        <Route path="account" element={<AccountRoute />} />
        <Route element={<RequireAction action="repositories.read" />}>
          <Route path="repositories" element={<RepositoriesRoute />} />
          <Route path="repositories/:id" element={<RepositoryRoute />} />
        </Route>
        <Route element={<RequireAction action="cloneClasses.read" />}>
          <Route path="clone-classes" element={<CloneClassesRoute />} />
          <Route path="clone-classes/:id" element={<CloneClassRoute />} />
          <Route path="clone-classes/across/:id" element={<CrossClassRoute />} />
          <Route path="snapshots/:id" element={<SnapshotRoute />} />
        </Route>
        <Route element={<RequireAction action="findCopies.use" />}>
          <Route path="find-copies" element={<FindCopiesRoute />} />
        </Route>
        <Route element={<RequireAction action="tasks.read" />}>
          <Route path="tasks" element={<TasksRoute />} />
          <Route path="tasks/:id" element={<TaskRoute />} />
        </Route>
        <Route element={<RequireAction action="apiTokens.manage" />}>
          <Route path="api-tokens" element={<ApiTokensRoute />} />
        </Route>
        <Route element={<RequireAction action="users.manage" />}>
          <Route path="admin" element={<AdminRoute />} />
        </Route>
        <Route element={<RequireAction action="outbox.read" />}>
          <Route path="outbox" element={<OutboxRoute />} />
        </Route>
        <Route path="*" element={<NotFoundRoute />} />
      </Route>
    </Routes>
  );
}

/** The router with the browser's history. */
export function AppRouter() {
  return (
    <BrowserRouter>
      <AppRoutes />
    </BrowserRouter>
  );
}
