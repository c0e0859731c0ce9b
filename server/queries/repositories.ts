/** Reads of repositories: by id within an organisation, lists, latest snapshots, the trend (see README.md). */
import type { Transaction } from 'sequelize';
import { select } from '../clone-index/sql';
import { Repository } from '../models/Repository';

/** A repository of the organisation, or null (another organisation's repositories do not exist for it). */
export function findRepository(organisationId: string, id: number, transaction?: Transaction): Promise<Repository | null> {
  return Repository.findOne({ where: { id, organisationId }, transaction });
}

/** A repository of the organisation by name, or null. */
export function findRepositoryByName(organisationId: string, name: string): Promise<Repository | null> {
  return Repository.findOne({ where: { organisationId, name } });
}

/** The organisation's repositories by name. */
export function listRepositories(organisationId: string): Promise<Repository[]> {
  return Repository.findAll({ where: { organisationId }, order: [['name', 'ASC']] });
}

/** The latest ready snapshot of a repository, with the token counts its budget verdict needs. */
export interface LatestSnapshot {
  id: number;
  label: string;
  cloneRatio: number | null;
  /** tokens inside fragments, and those in at least one clone pair (null only without figures) */
  fragmentTokens: number | null;
  clonedTokens: number | null;
  /** cloned tokens without the classes whose lineage is waived (the budget verdict's figure) */
  unwaivedClonedTokens: number | null;
  createdAt: Date;
}

/** The latest ready snapshot of each of the repositories, by repository id (absent: none ready). */
export async function latestReadySnapshots(repositoryIds: number[]): Promise<Map<number, LatestSnapshot>> {
  type Row = Omit<LatestSnapshot, 'fragmentTokens' | 'clonedTokens' | 'unwaivedClonedTokens'> & {
    repositoryId: number;
    fragmentTokens: string | null;
    clonedTokens: string | null;
    unwaivedClonedTokens: string | null;
  };
  const rows = await select<Row>(
    undefined,
    `select l.repository_id as "repositoryId", s.id, s.label, s.clone_ratio as "cloneRatio",
            m.fragment_tokens as "fragmentTokens", m.cloned_tokens as "clonedTokens",
            m.unwaived_cloned_tokens as "unwaivedClonedTokens", s.created_at as "createdAt"
       from latest_ready_snapshots l join snapshots s on s.id = l.snapshot_id left join snapshot_metrics m on m.snapshot_id = s.id
      where l.repository_id = any($1::int[])`,
    [repositoryIds],
  );
  // bigint columns arrive as text
  const count = (value: string | null) => (value === null ? null : Number(value));
  return new Map(
    rows.map(({ repositoryId, fragmentTokens, clonedTokens, unwaivedClonedTokens, ...rest }) => [
      repositoryId,
      { ...rest, fragmentTokens: count(fragmentTokens), clonedTokens: count(clonedTokens), unwaivedClonedTokens: count(unwaivedClonedTokens) },
    ]),
  );
}

/** The latest ready snapshot of one repository, or null. */
export async function latestReadySnapshot(repositoryId: number): Promise<LatestSnapshot | null> {
  return (await latestReadySnapshots([repositoryId])).get(repositoryId) ?? null;
}

/** One point of a repository's trend: a ready snapshot's figures (bigint counts as text). */
export interface TrendRow {
  snapshotId: number;
  label: string;
  createdAt: Date;
  cloneRatio: number;
  fragmentTokens: string;
  clonedTokens: string;
  pairCount: number;
  classCount: number;
  crossPairCount: number;
  newClassCount: number;
  driftedClassCount: number;
  goneClassCount: number;
}

/** The figures of every ready snapshot of a repository, oldest first. */
export function repositoryTrend(repositoryId: number): Promise<TrendRow[]> {
  return select<TrendRow>(
    undefined,
    `select s.id as "snapshotId", s.label, s.created_at as "createdAt", m.clone_ratio as "cloneRatio",
            m.fragment_tokens as "fragmentTokens", m.cloned_tokens as "clonedTokens", m.pair_count as "pairCount",
            m.class_count as "classCount", m.cross_pair_count as "crossPairCount", m.new_class_count as "newClassCount",
            m.drifted_class_count as "driftedClassCount", m.gone_class_count as "goneClassCount"
       from snapshots s join snapshot_metrics m on m.snapshot_id = s.id
      where s.repository_id = $1 and s.status = 'ready' order by s.id`,
    [repositoryId],
  );
}

/** The organisation's repositories grouped by the shingle size they analyze with. */
export function repositoriesByShingleSize(organisationId: string): Promise<{ shingleSize: number; repositoryIds: number[] }[]> {
  return select(
    undefined,
    `select shingle_size as "shingleSize", array_agg(id) as "repositoryIds" from repositories
      where organisation_id = $1 group by shingle_size`,
    [organisationId],
  );
}
