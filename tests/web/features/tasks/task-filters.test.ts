import { describe, expect, it } from 'vitest';
import { DEFAULT_TASK_QUERY, changeTaskFilters, readTaskFilters, toggleTaskSort, writeTaskFilters } from '@/features/tasks/lib/task-filters';

const read = (search: string) => readTaskFilters(new URLSearchParams(search));

describe('the task list query in the URL', () => {
  it('reads what the server accepts and drops what it rejects, one parameter at a time', () => {
    expect(read('assignee=me&status=active&overdue=1&repositoryId=7&page=2')).toEqual({ ...DEFAULT_TASK_QUERY, assignee: 'me', status: 'active', overdue: '1', repositoryId: 7, page: 2 });
    expect(read('status=sideways&assignee=me')).toEqual({ ...DEFAULT_TASK_QUERY, assignee: 'me' });
    expect(read('pageSize=500&sort=due')).toEqual({ ...DEFAULT_TASK_QUERY, sort: 'due' });
    expect(read('repositoryId=0x1&assignee=nobody')).toEqual(DEFAULT_TASK_QUERY);
  });

  it('writes only what differs from the defaults, and reads back what it wrote', () => {
    expect(writeTaskFilters(DEFAULT_TASK_QUERY).toString()).toBe('');
    const query = { ...DEFAULT_TASK_QUERY, assignee: 'me' as const, status: 'in_review' as const, sort: 'due' as const, order: 'desc' as const, page: 3 };
    const written = writeTaskFilters(query);
    expect(written.toString()).toBe('assignee=me&status=in_review&sort=due&order=desc&page=3');
    expect(readTaskFilters(written)).toEqual(query);
  });

  it('goes back to page 1 on any change but the page, and clears a filter set to undefined', () => {
    const on3 = { ...DEFAULT_TASK_QUERY, status: 'open' as const, page: 3 };
    expect(changeTaskFilters(on3, { page: 4 }).page).toBe(4);
    expect(changeTaskFilters(on3, { overdue: '1' })).toMatchObject({ page: 1, status: 'open', overdue: '1' });
    expect(changeTaskFilters(on3, { status: undefined })).toEqual(DEFAULT_TASK_QUERY);
  });

  it('flips the order of the sorted column from its own default, and starts another column at its default', () => {
    expect(toggleTaskSort({ ...DEFAULT_TASK_QUERY, sort: 'due' }, 'due')).toEqual({ order: 'desc' });
    expect(toggleTaskSort({ ...DEFAULT_TASK_QUERY, sort: 'updated' }, 'updated')).toEqual({ order: 'asc' });
    expect(toggleTaskSort({ ...DEFAULT_TASK_QUERY, sort: 'due', order: 'desc' }, 'due')).toEqual({ order: 'asc' });
    expect(toggleTaskSort({ ...DEFAULT_TASK_QUERY, sort: 'due', order: 'desc' }, 'title')).toEqual({ sort: 'title', order: undefined });
  });
});
