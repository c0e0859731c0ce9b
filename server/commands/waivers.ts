import { coveredTokens } from '../matching/classes';
import { latestReadySnapshot } from '../queries/repositories';
import { insertWaiver, liftWaiver, unwaivedMemberSpans, updateUnwaivedTokens, type WaiverRow } from '../queries/waivers';
import { ConflictError, NotFoundError } from '../errors';

/**
 * Waives a class lineage (see README.md "Waivers"): the class is left out of the clone budget
 * verdict until a new member joins it or a lead lifts the waiver. The repository's latest ready
 * snapshot gets its unwaived figure again, since the verdict is read from it; earlier snapshots
 * keep the figure their load computed.
 *
 * @throws ConflictError when the lineage is already waived
 */
export async function waiveLineage(
  where: { lineageId: number; repositoryId: number },
  input: { reason: string; untilLabel: string | null; createdBy: string },
): Promise<WaiverRow> {
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
