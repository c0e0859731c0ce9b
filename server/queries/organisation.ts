/** Reads across every repository of an organisation: the latest loads and the figures for its trend (see README.md). */
import type { SnapshotStatus } from '../../shared/api/snapshots';
import { select } from '../clone-index/sql';

/** A snapshot of the organisation as the latest loads list shows it. */
export interface LoadRow {
  id: number;
  label: string;
  status: SnapshotStatus;
  error: string | null;
  cloneRatio: number | null;
  createdAt: Date;
  updatedAt: Date;
  repositoryId: number;
  repositoryName: string;
}

/** The organisation's most recent snapshots, whatever their status, newest first. */
export function latestLoads(organisationId: string, limit: number): Promise<LoadRow[]> {
  return select<LoadRow>(
    undefined,
    `select s.id, s.label, s.status, s.error, s.clone_ratio as "cloneRatio", s.created_at as "createdAt", s.updated_at as "updatedAt",
            r.id as "repositoryId", r.name as "repositoryName"
       from snapshots s join repositories r on r.id = s.repository_id
      where r.organisation_id = $1 order by s.id desc limit $2`,
    [organisationId, limit],
  );
}

/** A ready snapshot's token counts, for the organisation's trend (bigint counts as text). */
export interface ReadyFiguresRow {
  snapshotId: number;
  repositoryId: number;
  repositoryName: string;
  label: string;
  createdAt: Date;
  fragmentTokens: string;
  clonedTokens: string;
}

/** Every ready snapshot of the organisation's repositories with its token counts, in load order. */
export function readySnapshotFigures(organisationId: string): Promise<ReadyFiguresRow[]> {
  return select<ReadyFiguresRow>(
    undefined,
    `select s.id as "snapshotId", r.id as "repositoryId", r.name as "repositoryName", s.label, s.created_at as "createdAt",
            m.fragment_tokens as "fragmentTokens", m.cloned_tokens as "clonedTokens"
       from snapshots s join repositories r on r.id = s.repository_id join snapshot_metrics m on m.snapshot_id = s.id
      where r.organisation_id = $1 and s.status = 'ready' order by s.id`,
    [organisationId],
  );
}
