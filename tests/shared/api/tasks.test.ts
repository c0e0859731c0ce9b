import { describe, expect, it } from 'vitest';
import { dueOnSchema, isLeadMove, mayMoveTask, TASK_STATUSES, updateTaskSchema } from '../../../shared/api/tasks';

describe('the task workflow', () => {
  it('moves work one step forward or back, reopens done and won\'t-do tasks, and closes as won\'t do only what is active', () => {
    const allowed = TASK_STATUSES.flatMap((from) => TASK_STATUSES.filter((to) => mayMoveTask(from, to)).map((to) => `${from}→${to}`));
    expect(allowed.sort()).toEqual(
      [
        'open→in_progress',
        'open→wont_do',
        'in_progress→open',
        'in_progress→in_review',
        'in_progress→wont_do',
        'in_review→in_progress',
        'in_review→done',
        'in_review→wont_do',
        'done→open',
        'wont_do→open',
      ].sort(),
    );
    expect(isLeadMove('in_review', 'wont_do')).toBe(true);
    expect(isLeadMove('wont_do', 'open')).toBe(true);
    expect(isLeadMove('done', 'open')).toBe(false);
  });

  it('takes real calendar days as due dates and a reason only with won\'t do', () => {
    expect(dueOnSchema.safeParse('2028-02-29').success).toBe(true);
    expect(dueOnSchema.safeParse('2027-02-29').success).toBe(false);
    expect(dueOnSchema.safeParse('1999-12-31').success).toBe(false);
    expect(dueOnSchema.safeParse('2027-1-5').success).toBe(false);
    expect(updateTaskSchema.safeParse({ status: 'wont_do', reason: 'Retired next year' }).success).toBe(true);
    expect(updateTaskSchema.safeParse({ status: 'wont_do' }).success).toBe(false);
    expect(updateTaskSchema.safeParse({ status: 'done', reason: 'why' }).success).toBe(false);
    expect(updateTaskSchema.safeParse({}).success).toBe(false);
  });
});
