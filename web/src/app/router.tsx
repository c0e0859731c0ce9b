import { BrowserRouter, Link, Route, Routes } from 'react-router-dom';
import { SignInRoute } from '../features/auth/routes/sign-in';
import { RequireAction, SignedInFrame } from './guards';
import { AcceptInvitationRoute } from './routes/accept-invitation';
import { AccountRoute } from './routes/account';
import { AdminRoute } from './routes/admin';
import { OverviewRoute } from './routes/overview';
import { PlaceholderRoute } from './routes/placeholder';

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
          <Route
            path="repositories"
            element={<PlaceholderRoute title="Repositories" description="Tracked codebases, their snapshots and clone budgets." />}
          />
        </Route>
        <Route element={<RequireAction action="cloneClasses.read" />}>
          <Route
            path="clone-classes"
            element={<PlaceholderRoute title="Clone classes" description="Groups of near-identical functions, to review side by side." />}
          />
        </Route>
        <Route element={<RequireAction action="findCopies.use" />}>
          <Route
            path="find-copies"
            element={<PlaceholderRoute title="Find copies" description="Paste a function and see every indexed copy of it." />}
          />
        </Route>
        <Route element={<RequireAction action="tasks.read" />}>
          <Route path="tasks" element={<PlaceholderRoute title="Tasks" description="Refactor work on clone classes, with owners." />} />
        </Route>
        <Route element={<RequireAction action="apiTokens.manage" />}>
          <Route
            path="api-tokens"
            element={<PlaceholderRoute title="API tokens" description="Tokens for CI to upload snapshots and check clone budgets." />}
          />
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
