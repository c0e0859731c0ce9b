import type { Transaction } from 'sequelize';
import { releaseReached } from '../../shared/release-labels';
import { coveredTokens } from '../matching/classes';
import { latestReadySnapshot } from '../queries/repositories';
import { snapshotLabel } from '../queries/snapshots';
import {
  activeWaiversUntilRelease,
  endWaivers,
  insertWaiver,
  liftWaiver,
  unwaivedMemberSpans,
  updateUnwaivedTokens,
  type WaiverRow,
} from '../queries/waivers';
import { ConflictError, NotFoundError, ValidationError } from '../errors';

/**
 * Waives a class lineage (see README.md "Waivers"): the class is left out of the clone budget
 * verdict until a new member joins it, the release it was waived until is loaded, or a lead lifts
 * the waiver. The repository's latest ready snapshot gets its unwaived figure again, since the
 * verdict is read from it; earlier snapshots keep the figure their load computed.
 *
 * @throws ValidationError when the release it would run until is already loaded (the latest
 *   snapshot is that release or a later one): such a waiver would end at once
 * @throws ConflictError when the lineage is already waived
 */
export async function waiveLineage(
  where: { lineageId: number; repositoryId: number },
  input: { reason: string; untilLabel: string | null; createdBy: string },
): Promise<WaiverRow> {
  const latest = input.untilLabel === null ? null : await latestReadySnapshot(where.repositoryId);
  if (latest && input.untilLabel !== null && releaseReached(input.untilLabel, latest.label)) {
    throw new ValidationError(
      `Until release: "${input.untilLabel}" is already loaded (the latest snapshot is ${latest.label}); name a later release, or leave it out.`,
      'untilLabel',
    );
  }
  const waiver = await insertWaiver(where.lineageId, input);
  if (!waiver) throw new ConflictError('This clone class is already waived.');
  await refreshLatestUnwaived(where.repositoryId);
  return waiver;
}

/**
 * Lifts a lineage's active waiver: the class counts in the verdict again from the latest snapshot on.
 *
 * @throws NotFoundError when the lineage has no active waiver
 */
export async function liftLineageWaiver(where: { lineageId: number; repositoryId: number }): Promise<void> {
  if (!(await liftWaiver(where.lineageId))) throw new NotFoundError('Active waiver of this clone class');
  await refreshLatestUnwaived(where.repositoryId);
}

async function refreshLatestUnwaived(repositoryId: number): Promise<void> {
  const latest = await latestReadySnapshot(repositoryId);
  if (!latest) return;
  await updateUnwaivedTokens(undefined, latest.id, coveredTokens(await unwaivedMemberSpans(undefined, latest.id)));
}

/**
 * Ends, by itself, each active waiver of the repository's lineages that ran "until release …" a
 * release this load reaches: the loaded label is that release or a later version of it (see
 * shared/release-labels.ts). The class page then shows that its waiver ended in this snapshot and
 * why. Called in the load's transaction before the unwaived figure is counted, so the class counts
 * again from this snapshot on. Returns the lineages whose waiver ended.
 */
export async function endWaiversReachingRelease(tx: Transaction, snapshotId: number, repositoryId: number): Promise<number[]> {
  const label = await snapshotLabel(tx, snapshotId);
  if (label === undefined) return [];
  const due = (await activeWaiversUntilRelease(tx, repositoryId)).filter((w) => releaseReached(w.untilLabel, label));
  await endWaivers(
    tx,
    snapshotId,
    due.map((w) => ({ lineageId: w.lineageId, reason: `it was waived until release ${w.untilLabel}` })),
  );
  return due.map((w) => w.lineageId);
}
