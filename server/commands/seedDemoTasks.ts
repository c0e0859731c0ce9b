import { db } from '../db/connection';
import type { Organisation } from '../models/Organisation';
import { findClass } from '../queries/classes';
import { listUsers } from '../queries/people';
import { findTask, goneClassesOfOrganisation, latestClassesOfOrganisation } from '../queries/tasks';
import { settleTasks } from './settleTasks';
import { changeTask, commentOnTask, createTask } from './tasks';

const day = (offsetDays: number) => new Date(Date.now() + offsetDays * 86_400_000).toISOString().slice(0, 10);

/**
 * Two refactor tasks in different states for the demo organisation, picked the same way from the
 * same data every time (repositories by name, classes in their order):
 *
 * - on the first class of the latest snapshots: in progress, with the engineer's comment and the
 *   lead's answer;
 * - on the first class of a previous snapshot whose copies the latest one no longer has: closed by
 *   the automatic check, naming the latest snapshot, as a load would have closed it; failing such
 *   a class, on the second class of the latest snapshots, open and overdue.
 *
 * Made through the same commands as the API (history entries and notice mails included). Seeds
 * what it can: nothing without a lead, an engineer or a class. Returns lines to print.
 */
export async function seedDemoTasks(organisation: Organisation): Promise<string[]> {
  const people = (await listUsers(organisation.id)).filter((u) => u.isActive);
  const lead = people.find((u) => u.role === 'lead');
  const engineer = people.find((u) => u.role === 'engineer');
  if (!lead || !engineer) return [];
  const live = await latestClassesOfOrganisation(organisation.id, 2);
  const [gone] = await goneClassesOfOrganisation(organisation.id, 1);
  const create = async (cloneClass: { id: number; size: number; memberName: string }, title: string, description: string, dueOn: string, allowGoneCopies = false) => {
    const row = (await findClass(organisation.id, cloneClass.id))!;
    return createTask(lead, row, { cloneClassId: cloneClass.id, assigneeId: engineer.id, title, description, dueOn }, { allowGoneCopies });
  };
  const task = async (id: number) => (await findTask(organisation.id, id))!;
  const made: number[] = [];

  if (live[0]) {
    const id = await create(live[0], `Merge the ${live[0].size} copies of ${live[0].memberName}`, 'Keep one copy in a shared module and call it from the other places; the tests of each caller stay as they are.', day(21));
    await changeTask(engineer, await task(id), { status: 'in_progress' });
    await commentOnTask(engineer, await task(id), 'Started: the copy with the newest fix stays, the others will call it. Two callers need a small adapter.');
    await commentOnTask(lead, await task(id), 'Sounds right. Mention the adapters in the review so the depot team sees them.');
    made.push(id);
  }
  if (gone) {
    const id = await create(gone, `Fold the ${gone.size} copies of ${gone.memberName} into one`, 'The copies differ only in names; one function with a parameter covers all of them.', day(7), true);
    await changeTask(engineer, await task(id), { status: 'in_progress' });
    await db().transaction((tx) => settleTasks(tx, gone.latestSnapshotId, gone.repositoryId));
    made.push(id);
  } else if (live[1]) {
    made.push(await create(live[1], `Fold the ${live[1].size} copies of ${live[1].memberName} into one`, 'The copies differ only in names; one function with a parameter covers all of them.', day(-3)));
  }
  return made.length === 0 ? [] : [`  ${made.length} refactor task${made.length === 1 ? '' : 's'} assigned to ${engineer.name}`];
}
