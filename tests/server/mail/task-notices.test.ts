import { describe, expect, it } from 'vitest';
import { taskAssignedNotice, taskAutoChangedNotice } from '../../../server/mail';

const ana = { id: 'u', organisationId: 'o', email: 'ana@brackenfold.example', name: 'Ana Reyes', role: 'engineer' };
const task = { title: 'Merge the <tariff> rules', repositoryName: 'freight-platform', taskUrl: 'http://127.0.0.1:3030/tasks/7' };

describe('task notice mails', () => {
  it('names who assigned what, when it is due, and links the task; the title is escaped in HTML', () => {
    const mail = taskAssignedNotice(ana, { ...task, assignedByName: 'Ines Marlow', dueOn: '2026-12-18' });
    expect(mail.subject).toBe('Task assigned to you: Merge the <tariff> rules');
    expect(mail.text).toContain('Ines Marlow assigned you a refactor task in freight-platform: "Merge the <tariff> rules", due on 2026-12-18.');
    expect(mail.text).toContain('Open the task: http://127.0.0.1:3030/tasks/7');
    expect(mail.html).toContain('Merge the &#60;tariff&#62; rules');
    expect(mail.html).not.toContain('<tariff>');
    expect(taskAssignedNotice(ana, { ...task, assignedByName: 'Ines Marlow' }).text).not.toContain('due on');
  });

  it('says which release marked the task done, or reopened it', () => {
    const done = taskAutoChangedNotice(ana, { ...task, change: 'done', snapshotLabel: '2026.11' });
    expect(done.subject).toBe('Task done by release 2026.11: Merge the <tariff> rules');
    expect(done.text).toContain('no longer has the copies of your task');
    const reopened = taskAutoChangedNotice(ana, { ...task, change: 'reopened', snapshotLabel: '2026.12' });
    expect(reopened.subject).toBe('Task reopened by release 2026.12: Merge the <tariff> rules');
    expect(reopened.text).toContain('has the copies of your task "Merge the <tariff> rules" again, so it was reopened.');
  });
});
