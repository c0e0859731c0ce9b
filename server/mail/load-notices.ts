import type { Transaction } from 'sequelize';
import { rolesAllowed } from '../../shared/permissions';
import { appUrl } from '../config';
import { db } from '../db/connection';
import { send } from '../jobs/queue';
import {
  activeUserIdsWithRole,
  claimLoadNotices,
  driftedClasses,
  loadNoticeFacts,
  openTaskAssigneesOfLineages,
  type DriftedClassRow,
  type LoadNoticeFacts,
} from '../queries/notices';
import { exceedsBudget, parseBudget } from '../reports/budget';
import { sendNotice, type NoticeContent, type NoticeRecipient } from './notices';
import { escapeHtml } from './html';

/** A drift notice lists at most this many classes; the snapshot page has the rest. */
export const DRIFT_NOTICE_CLASS_LIMIT = 20;

function percent(part: number, whole: number): string {
  return whole === 0 ? '0.00%' : `${((100 * part) / whole).toFixed(2)}%`;
}

/** A ratio over its budget, with as many decimals as it takes not to read as the budget itself (at most 6). */
function percentOver(part: number, whole: number, stored: string): string {
  const value = (100 * part) / whole;
  let digits = 2;
  while (digits < 6 && Number(value.toFixed(digits)) <= Number(stored) * 100) digits++;
  return `${value.toFixed(digits)}%`;
}

/** "0.050000" → "5%". */
function budgetPercent(stored: string): string {
  return `${Number((Number(stored) * 100).toFixed(4))}%`;
}

/**
 * Whether the snapshot's unwaived clone ratio is over its repository's budget: the exact verdict
 * of server/reports/budget.ts (a ratio right at the budget passes), as the web API's overBudget.
 */
export function isOverBudget(facts: LoadNoticeFacts): boolean {
  if (facts.cloneBudget === null) return false;
  return exceedsBudget({ clonedTokens: facts.unwaivedClonedTokens, fragmentTokens: facts.fragmentTokens }, parseBudget(facts.cloneBudget));
}

/** Whether a load calls for any notice. */
function noticesDue(facts: LoadNoticeFacts): boolean {
  return isOverBudget(facts) || facts.driftedClassCount > 0;
}

/**
 * The hook a load calls once its snapshot is ready, inside the load's transaction: when the
 * snapshot is over its budget or has drifted classes, queues a `load.notices` job that exists only
 * if the load commits. A load with nothing to say queues nothing.
 *
 * @example
 * await markSnapshotReady(tx, snapshotId, counts);
 * await queueLoadNotices(tx, snapshotId);
 */
export async function queueLoadNotices(tx: Transaction, snapshotId: number): Promise<void> {
  const facts = await loadNoticeFacts(tx, snapshotId);
  if (facts && noticesDue(facts)) await send('load.notices', { snapshotId }, { transaction: tx });
}

/** The unwaived clone ratio as the notices write it. */
function unwaivedPercent(facts: LoadNoticeFacts): string {
  return facts.cloneBudget !== null && isOverBudget(facts)
    ? percentOver(facts.unwaivedClonedTokens, facts.fragmentTokens, facts.cloneBudget)
    : percent(facts.unwaivedClonedTokens, facts.fragmentTokens);
}

/** The lines every load notice starts with: which snapshot, its figures, where to look. */
function figures(facts: LoadNoticeFacts): string[] {
  return [
    `Repository: ${facts.repositoryName}`,
    `Release: ${facts.label}`,
    `Clone ratio without waived classes: ${unwaivedPercent(facts)}` +
      (facts.cloneBudget === null ? '' : ` (budget ${budgetPercent(facts.cloneBudget)})`),
    `Clone ratio of all clones: ${percent(facts.clonedTokens, facts.fragmentTokens)}`,
    `Clone classes: ${facts.classCount} (${facts.newClassCount} new, ${facts.driftedClassCount} drifted)`,
  ];
}

function figuresHtml(facts: LoadNoticeFacts): string {
  return `<ul>${figures(facts)
    .map((line) => {
      const [name, ...rest] = line.split(': ');
      return `<li>${escapeHtml(name)}: <strong>${escapeHtml(rest.join(': '))}</strong></li>`;
    })
    .join('')}</ul>`;
}

/** The budget notice to one lead. Figures and links only: never code. */
export function budgetNotice(user: NoticeRecipient, facts: LoadNoticeFacts): NoticeContent {
  const link = appUrl(`/snapshots/${facts.snapshotId}`);
  const budget = facts.cloneBudget === null ? '' : budgetPercent(facts.cloneBudget);
  const ratio = unwaivedPercent(facts);
  const subject = `${facts.repositoryName} ${facts.label} is over its clone budget: ${ratio} (budget ${budget})`;
  const lead = `The snapshot ${facts.label} of ${facts.repositoryName} is over its clone budget: its clone ratio without waived classes is ${ratio}, the budget ${budget}.`;
  return {
    subject,
    text: [`Hello ${user.name},`, '', lead, '', ...figures(facts), '', `Open the snapshot: ${link}`].join('\n'),
    html:
      `<p>Hello ${escapeHtml(user.name)},</p><p>${escapeHtml(lead)}</p>${figuresHtml(facts)}` +
      `<p><a href="${escapeHtml(link)}">Open the snapshot</a></p>`,
  };
}

/** The drift notice to one person, naming the drifted classes they should see. Never code. */
export function driftNotice(user: NoticeRecipient, facts: LoadNoticeFacts, classes: DriftedClassRow[], total: number): NoticeContent {
  const link = appUrl(`/snapshots/${facts.snapshotId}`);
  const subject = `${facts.repositoryName} ${facts.label}: ${total} drifted clone ${total === 1 ? 'class' : 'classes'}`;
  const lead =
    `In the snapshot ${facts.label} of ${facts.repositoryName}, some copies of ${total === 1 ? 'a clone class were' : `${total} clone classes were`} ` +
    'changed while others were not: a fix may have reached only part of them.';
  const line = (c: DriftedClassRow) => `Class #${c.id}: ${c.size} copies, ${c.tokens} tokens, ${c.language}`;
  const more = total > classes.length ? [`…and ${total - classes.length} more on the snapshot page.`] : [];
  return {
    subject,
    text: [
      `Hello ${user.name},`,
      '',
      lead,
      '',
      ...figures(facts),
      '',
      ...classes.map((c) => `${line(c)}: ${appUrl(`/clone-classes/${c.id}`)}`),
      ...more,
      '',
      `Open the snapshot: ${link}`,
    ].join('\n'),
    html:
      `<p>Hello ${escapeHtml(user.name)},</p><p>${escapeHtml(lead)}</p>${figuresHtml(facts)}` +
      `<ul>${classes.map((c) => `<li><a href="${escapeHtml(appUrl(`/clone-classes/${c.id}`))}">${escapeHtml(line(c))}</a></li>`).join('')}</ul>` +
      more.map((m) => `<p>${escapeHtml(m)}</p>`).join('') +
      `<p><a href="${escapeHtml(link)}">Open the snapshot</a></p>`,
  };
}

/**
 * What the `load.notices` job does for a ready snapshot, once (a retried job finds the snapshot
 * claimed and sends nothing again): the budget notice to the organisation's leads (and admins)
 * when the unwaived clone ratio is over the budget, and the drift notice to them and to the
 * assignees of open tasks on the drifted lineages (an assignee hears of their own lineages only).
 * Recipients who turned a kind off are dropped by sendNotice. Resolves with how many were mailed.
 */
export async function sendLoadNotices(snapshotId: number): Promise<{ budget: number; drift: number }> {
  return db().transaction(async (tx) => {
    const facts = await loadNoticeFacts(tx, snapshotId);
    if (!facts || !(await claimLoadNotices(tx, snapshotId))) return { budget: 0, drift: 0 };
    const leads = await activeUserIdsWithRole(tx, facts.organisationId, rolesAllowed('cloneClasses.waive'));
    let budget = 0;
    let drift = 0;
    if (isOverBudget(facts)) {
      budget = (await sendNotice({ kind: 'budgetExceeded', recipientIds: leads, compose: (user) => budgetNotice(user, facts) }, tx)).length;
    }
    if (facts.driftedClassCount > 0) {
      const shown = await driftedClasses(tx, snapshotId, DRIFT_NOTICE_CLASS_LIMIT);
      const all = facts.driftedClassCount > shown.length ? await driftedClasses(tx, snapshotId, facts.driftedClassCount) : shown;
      const lineageIds = all.flatMap((c) => (c.lineageId === null ? [] : [c.lineageId]));
      const assignees = await openTaskAssigneesOfLineages(tx, lineageIds);
      const leadSet = new Set(leads);
      const compose = (user: NoticeRecipient) => {
        if (leadSet.has(user.id)) return driftNotice(user, facts, shown, facts.driftedClassCount);
        const theirs = all.filter((c) => c.lineageId !== null && assignees.get(user.id)?.has(c.lineageId));
        return driftNotice(user, facts, theirs.slice(0, DRIFT_NOTICE_CLASS_LIMIT), theirs.length);
      };
      drift = (await sendNotice({ kind: 'classesDrifted', recipientIds: [...leads, ...assignees.keys()], compose }, tx)).length;
    }
    return { budget, drift };
  });
}
