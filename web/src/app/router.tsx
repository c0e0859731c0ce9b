import { BrowserRouter, Link, Route, Routes } from 'react-router-dom';
import { SignInRoute } from '@/features/auth/routes/sign-in';
import { RequireAction, SignedInFrame } from './guards';
import { AcceptInvitationRoute } from './routes/accept-invitation';
import { AccountRoute } from './routes/account';
import { ApiTokensRoute } from './routes/api-tokens';
import { AdminRoute } from './routes/admin';
import { CloneClassRoute } from './routes/clone-class';
import { CloneClassesRoute } from './routes/clone-classes';
import { FindCopiesRoute } from './routes/find-copies';
import { OverviewRoute } from './routes/overview';
import { PlaceholderRoute } from './routes/placeholder';
import { RepositoriesRoute } from './routes/repositories';
import { RepositoryRoute } from './routes/repository';
import { SnapshotRoute } from './routes/snapshot';

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
      <Route path="/invitations/:token" element={<AcceptInvitationRoute />} />
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
          <Route path="snapshots/:id" element={<SnapshotRoute />} />
        </Route>
        <Route element={<RequireAction action="findCopies.use" />}>
          <Route path="find-copies" element={<FindCopiesRoute />} />
        </Route>
        <Route element={<RequireAction action="tasks.read" />}>
          <Route path="tasks" element={<PlaceholderRoute title="Tasks" description="Refactor work on clone classes, with owners." />} />
        </Route>
        <Route element={<RequireAction action="apiTokens.manage" />}>
          <Route path="api-tokens" element={<ApiTokensRoute />} />
        </Route>
        <Route element={<RequireAction action="users.manage" />}>
          <Route path="admin" element={<AdminRoute />} />
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
