import { describe, expect, it } from 'vitest';
import { allows, authorize } from '../../../server/policies';
import type { User } from '../../../server/models/User';
import { ACTIONS, actionsOf, can, rolesAllowed, type Action } from '../../../shared/permissions';
import { ROLES, type Role } from '../../../shared/roles';

/**
 * The expected matrix, written out by hand from the product brief (issue 2), not derived from
 * shared/permissions.ts: admin = users, roles, organisation settings and everything below; lead =
 * repositories, settings, budgets, waiving clone classes, creating and assigning refactor tasks,
 * API tokens; engineer = upload snapshots, comment, work on their assigned tasks, find copies;
 * viewer = read only.
 */
const EXPECTED: Record<Action, Role[]> = {
  'users.manage': ['admin'],
  'organisation.update': ['admin'],
  'repositories.read': ['admin', 'lead', 'engineer', 'viewer'],
  'repositories.create': ['admin', 'lead'],
  'repositories.update': ['admin', 'lead'],
  'repositories.delete': ['admin', 'lead'],
  'snapshots.read': ['admin', 'lead', 'engineer', 'viewer'],
  'snapshots.upload': ['admin', 'lead', 'engineer'],
  'snapshots.cancel': ['admin', 'lead', 'engineer'],
  'cloneClasses.read': ['admin', 'lead', 'engineer', 'viewer'],
  'cloneClasses.waive': ['admin', 'lead'],
  'tasks.read': ['admin', 'lead', 'engineer', 'viewer'],
  'tasks.create': ['admin', 'lead'],
  'tasks.assign': ['admin', 'lead'],
  'tasks.work': ['admin', 'lead', 'engineer'],
  'tasks.comment': ['admin', 'lead', 'engineer'],
  'findCopies.use': ['admin', 'lead', 'engineer'],
  'apiTokens.manage': ['admin', 'lead'],
  'outbox.read': ['admin'],
};

const ORG = 'org-1';

function actor(role: Role, overrides: Partial<{ id: string; organisationId: string; isActive: boolean }> = {}): User {
  return { id: `${role}-id`, role, organisationId: ORG, isActive: true, ...overrides } as unknown as User;
}

describe('can (the role → action matrix)', () => {
  it('covers exactly the actions listed in the brief', () => {
    expect([...ACTIONS].sort()).toEqual(Object.keys(EXPECTED).sort());
  });

  for (const role of ROLES) {
    for (const action of ACTIONS) {
      const expected = EXPECTED[action].includes(role);
      it(`${expected ? 'allows' : 'forbids'} ${role} → ${action}`, () => {
        expect(can(role, action)).toBe(expected);
        expect(allows(actor(role), action)).toBe(expected);
      });
    }
  }

  it('gives the viewer read actions only', () => {
    expect(actionsOf('viewer').every((a) => a.endsWith('.read'))).toBe(true);
  });

  it('lists allowed roles most powerful first', () => {
    expect(rolesAllowed('snapshots.upload')).toEqual(['admin', 'lead', 'engineer']);
  });
});

describe('record rules', () => {
  const ownTask = { organisationId: ORG, assigneeId: 'engineer-id' };
  const otherTask = { organisationId: ORG, assigneeId: 'someone-else' };
  const unassigned = { organisationId: ORG, assigneeId: null };

  it('lets an engineer work only on tasks assigned to them', () => {
    expect(allows(actor('engineer'), 'tasks.work', ownTask)).toBe(true);
    expect(allows(actor('engineer'), 'tasks.work', otherTask)).toBe(false);
    expect(allows(actor('engineer'), 'tasks.work', unassigned)).toBe(false);
  });

  it('lets leads and admins work on any task of their organisation', () => {
    for (const role of ['lead', 'admin'] as const) {
      expect(allows(actor(role), 'tasks.work', otherTask)).toBe(true);
      expect(allows(actor(role), 'tasks.work', unassigned)).toBe(true);
    }
  });

  it('lets leads cancel any load of their organisation, an engineer only the loads they started', () => {
    const theirs = { organisationId: ORG, repositoryId: 1, startedBy: 'engineer-id' };
    const someoneElses = { organisationId: ORG, repositoryId: 1, startedBy: 'someone-else' };
    const fromCli = { organisationId: ORG, repositoryId: 1, startedBy: null };
    expect(allows(actor('engineer'), 'snapshots.cancel', theirs)).toBe(true);
    expect(allows(actor('engineer'), 'snapshots.cancel', someoneElses)).toBe(false);
    expect(allows(actor('engineer'), 'snapshots.cancel', fromCli)).toBe(false);
    for (const role of ['lead', 'admin'] as const) {
      expect(allows(actor(role), 'snapshots.cancel', someoneElses)).toBe(true);
      expect(allows(actor(role), 'snapshots.cancel', fromCli)).toBe(true);
      expect(allows(actor(role), 'snapshots.cancel', { ...theirs, organisationId: 'org-2' })).toBe(false);
    }
    expect(allows(actor('viewer'), 'snapshots.cancel', { ...theirs, startedBy: 'viewer-id' })).toBe(false);
  });

  it('never lets a viewer work on a task, even one assigned to them', () => {
    expect(allows(actor('viewer'), 'tasks.work', { organisationId: ORG, assigneeId: 'viewer-id' })).toBe(false);
  });

  it('keeps every role inside its own organisation', () => {
    const foreignRepository = { organisationId: 'org-2' };
    for (const role of ROLES) {
      expect(allows(actor(role), 'repositories.read', foreignRepository)).toBe(false);
    }
    expect(allows(actor('admin'), 'users.manage', { organisationId: 'org-2' })).toBe(false);
    expect(allows(actor('admin'), 'users.manage', { organisationId: ORG })).toBe(true);
    expect(allows(actor('admin'), 'organisation.update', { id: ORG })).toBe(true);
    expect(allows(actor('admin'), 'organisation.update', { id: 'org-2' })).toBe(false);
  });
});

describe('authorize', () => {
  it('throws 403 for a forbidden action and 401 without a user', () => {
    expect(() => authorize(actor('viewer'), 'snapshots.upload')).toThrowError(
      expect.objectContaining({ status: 403, code: 'forbidden' }),
    );
    expect(() => authorize(null, 'repositories.read')).toThrowError(expect.objectContaining({ status: 401 }));
    expect(() => authorize(actor('lead'), 'cloneClasses.waive', { organisationId: ORG })).not.toThrow();
  });

  describe('edge cases', () => {
    it('refuses a deactivated user every action', () => {
      for (const action of ACTIONS) expect(allows(actor('admin', { isActive: false }), action)).toBe(false);
    });

    it('refuses record rules on null or non-object records', () => {
      expect(allows(actor('admin'), 'users.manage', null)).toBe(false);
      expect(allows(actor('admin'), 'users.manage', 'org-1')).toBe(false);
    });
  });
});
