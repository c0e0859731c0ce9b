import { can, type Action } from '@shared/permissions';
import type { Role } from '@shared/roles';

/** One entry of the side navigation; `action` is what the role needs to see it. */
export interface NavItem {
  to: string;
  label: string;
  action?: Action;
}

/** The whole navigation, in display order. Routes in router.tsx use the same actions. */
export const NAV_ITEMS: readonly NavItem[] = [
  { to: '/', label: 'Overview' },
  { to: '/repositories', label: 'Repositories', action: 'repositories.read' },
  { to: '/clone-classes', label: 'Clone classes', action: 'cloneClasses.read' },
  { to: '/find-copies', label: 'Find copies', action: 'findCopies.use' },
  { to: '/tasks', label: 'Tasks', action: 'tasks.read' },
  { to: '/api-tokens', label: 'API tokens', action: 'apiTokens.manage' },
  { to: '/admin', label: 'Admin', action: 'users.manage' },
  { to: '/outbox', label: 'Outbox', action: 'outbox.read' },
];

/**
 * The navigation a role may use (the server enforces the same matrix; this only hides).
 *
 * @example
 * navigationFor('viewer').map((i) => i.label) // no 'Find copies', no 'Admin'
 */
export function navigationFor(role: Role): NavItem[] {
  return NAV_ITEMS.filter((item) => !item.action || can(role, item.action));
}
