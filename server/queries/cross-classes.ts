/**
 * Reads and writes of the clone pairs and classes that span repositories (see README.md): the
 * pairs a load finds against the other repositories' latest snapshots, and the organisation's
 * classes rebuilt from them.
 */
import type { Transaction } from 'sequelize';
import { splitLines } from '../../analyzers/lines';
import { clonePairsWithin, type FragmentPair, type SnapshotFragment } from '../clone-index/snapshot-pairs';
import { execute, select } from '../clone-index/sql';
import { parseThreshold } from '../matching/threshold';

/** A fragment as it stands in one snapshot: its snapshot file and fragment ids. */
export interface MemberKey {
  snapshotFileId: number;
  fragmentId: number;
}

/** A stored pair between a fragment of one snapshot and one of another repository's snapshot. */
export interface CrossPairRow {
  snapshotId: number;
  snapshotFileId: number;
  fragmentId: number;
  otherSnapshotId: number;
  otherSnapshotFileId: number;
  otherFragmentId: number;
  similarity: number;
  cloneType: 1 | 2 | 3;
}

/** Stores a load's pairs with other repositories' latest snapshots (one statement). */
export async function storeCrossPairs(tx: Transaction, rows: CrossPairRow[]): Promise<void> {
  if (rows.length === 0) return;
  await execute(
    tx,
    `insert into cross_pairs (snapshot_id, snapshot_file_id, fragment_id, other_snapshot_id, other_snapshot_file_id, other_fragment_id, similarity, clone_type)
     select * from unnest($1::int[], $2::int[], $3::int[], $4::int[], $5::int[], $6::int[], $7::float8[], $8::int[])`,
    [
      rows.map((r) => r.snapshotId),
      rows.map((r) => r.snapshotFileId),
      rows.map((r) => r.fragmentId),
      rows.map((r) => r.otherSnapshotId),
      rows.map((r) => r.otherSnapshotFileId),
      rows.map((r) => r.otherFragmentId),
      rows.map((r) => r.similarity),
      rows.map((r) => r.cloneType),
    ],
  );
}

/** The latest ready snapshot of each repository of the organisation, as (repository, snapshot) rows. */
const LATEST_OF_ORGANISATION = `select l.repository_id, l.snapshot_id from latest_ready_snapshots l
  join repositories r on r.id = l.repository_id where r.organisation_id = $1`;

/** The stored cross pairs whose two snapshots are both the latest ready snapshot of their repository. */
export function crossPairsOfLatest(tx: Transaction | undefined, organisationId: string): Promise<CrossPairRow[]> {
  return select<CrossPairRow>(
    tx,
    `with latest as (${LATEST_OF_ORGANISATION})
     select p.snapshot_id as "snapshotId", p.snapshot_file_id as "snapshotFileId", p.fragment_id as "fragmentId",
            p.other_snapshot_id as "otherSnapshotId", p.other_snapshot_file_id as "otherSnapshotFileId",
            p.other_fragment_id as "otherFragmentId", p.similarity, p.clone_type as "cloneType"
       from cross_pairs p
      where p.snapshot_id in (select snapshot_id from latest) and p.other_snapshot_id in (select snapshot_id from latest)`,
    [organisationId],
  );
}

/** A repository's class holding one of the given fragments, with every member and its figures. */
export interface HoldingClassRow extends MemberKey {
  classId: number;
  minSimilarity: number;
  maxSimilarity: number;
  cloneType: 1 | 2 | 3;
}

/** The classes (of the snapshots named) that hold any of the given fragments, one row a member of theirs. */
export function classesHolding(tx: Transaction | undefined, keys: MemberKey[]): Promise<HoldingClassRow[]> {
  if (keys.length === 0) return Promise.resolve([]);
  return select<HoldingClassRow>(
    tx,
    `with held as (
       select distinct m.class_id from clone_class_members m
         join unnest($1::int[], $2::int[]) as k(file, fragment) on m.snapshot_file_id = k.file and m.fragment_id = k.fragment)
     select c.id as "classId", c.min_similarity as "minSimilarity", c.max_similarity as "maxSimilarity", c.clone_type as "cloneType",
            m.snapshot_file_id as "snapshotFileId", m.fragment_id as "fragmentId"
       from held h join clone_classes c on c.id = h.class_id join clone_class_members m on m.class_id = c.id
      order by c.id, m.snapshot_file_id, m.fragment_id`,
    [keys.map((k) => k.snapshotFileId), keys.map((k) => k.fragmentId)],
  );
}

/** What a class across repositories needs to know of each member. */
export interface MemberFactsRow extends MemberKey {
  snapshotId: number;
  repositoryId: number;
  repositoryName: string;
  path: string;
  startLine: number;
  tokens: number;
  language: string;
}

/** The facts of the given fragments (in any order). */
export function memberFacts(tx: Transaction | undefined, keys: MemberKey[]): Promise<MemberFactsRow[]> {
  if (keys.length === 0) return Promise.resolve([]);
  return select<MemberFactsRow>(
    tx,
    `select sf.id as "snapshotFileId", f.id as "fragmentId", sf.snapshot_id as "snapshotId", r.id as "repositoryId",
            r.name as "repositoryName", sf.path, f.start_line as "startLine", f.tokens, sf.language
       from unnest($1::int[], $2::int[]) as k(file, fragment)
       join snapshot_files sf on sf.id = k.file
       join fragments f on f.id = k.fragment
       join snapshots s on s.id = sf.snapshot_id
       join repositories r on r.id = s.repository_id`,
    [keys.map((k) => k.snapshotFileId), keys.map((k) => k.fragmentId)],
  );
}

/** One class across repositories as it is stored. */
export interface CrossClassToStore {
  size: number;
  tokens: number;
  repositoryCount: number;
  minSimilarity: number;
  maxSimilarity: number;
  cloneType: number;
  language: string;
  members: (MemberKey & { snapshotId: number; classId: number | null })[];
}

/** Replaces the organisation's classes across repositories with these (three statements). */
export async function replaceCrossClasses(tx: Transaction, organisationId: string, classes: CrossClassToStore[]): Promise<void> {
  await execute(tx, 'delete from cross_classes where organisation_id = $1', [organisationId]);
  if (classes.length === 0) return;
  const ids = await select<{ id: number; ordinal: number }>(
    tx,
    `insert into cross_classes (organisation_id, ordinal, size, tokens, repository_count, min_similarity, max_similarity, clone_type, language)
     select $1, * from unnest($2::int[], $3::int[], $4::int[], $5::int[], $6::float8[], $7::float8[], $8::int[], $9::text[])
     returning id, ordinal`,
    [
      organisationId,
      classes.map((_, i) => i),
      classes.map((c) => c.size),
      classes.map((c) => c.tokens),
      classes.map((c) => c.repositoryCount),
      classes.map((c) => c.minSimilarity),
      classes.map((c) => c.maxSimilarity),
      classes.map((c) => c.cloneType),
      classes.map((c) => c.language),
    ],
  );
  const idOf = new Map(ids.map((r) => [r.ordinal, r.id]));
  const members = classes.flatMap((c, ordinal) => c.members.map((m) => ({ crossClassId: idOf.get(ordinal)!, ...m })));
  await execute(
    tx,
    `insert into cross_class_members (cross_class_id, snapshot_id, snapshot_file_id, fragment_id, class_id)
     select * from unnest($1::int[], $2::int[], $3::int[], $4::int[], $5::int[])`,
    [
      members.map((m) => m.crossClassId),
      members.map((m) => m.snapshotId),
      members.map((m) => m.snapshotFileId),
      members.map((m) => m.fragmentId),
      members.map((m) => m.classId),
    ],
  );
}

/** The organisation a repository belongs to (null once the repository is deleted). */
export async function organisationOfRepository(tx: Transaction | undefined, repositoryId: number): Promise<string | null> {
  const [row] = await select<{ organisationId: string }>(tx, 'select organisation_id as "organisationId" from repositories where id = $1', [repositoryId]);
  return row?.organisationId ?? null;
}

/** A class across repositories as its page shows it (without members). */
export interface CrossClassRow {
  id: number;
  size: number;
  tokens: number;
  minSimilarity: number;
  maxSimilarity: number;
  cloneType: number;
  language: string;
}

/** A class across repositories of the organisation, or undefined. */
export async function findCrossClass(organisationId: string, id: number): Promise<CrossClassRow | undefined> {
  const [row] = await select<CrossClassRow>(
    undefined,
    `select id, size, tokens, min_similarity as "minSimilarity", max_similarity as "maxSimilarity", clone_type as "cloneType", language
       from cross_classes where id = $1 and organisation_id = $2`,
    [id, organisationId],
  );
  return row;
}

/** A member of a class across repositories, with where it stands and its code. */
export interface CrossMemberRow extends SnapshotFragment {
  repositoryId: number;
  repositoryName: string;
  snapshotId: number;
  snapshotLabel: string;
  threshold: string;
  classId: number | null;
  code: string;
}

/**
 * The members of a class across repositories with their source lines (by repository, path and
 * line), and the pairs among them: those within each repository, recomputed from stored set pairs
 * at that snapshot's threshold, and the stored pairs across repositories.
 */
export async function crossClassMembers(crossClassId: number): Promise<{ members: CrossMemberRow[]; pairs: FragmentPair[] }> {
  const rows = await select<Omit<CrossMemberRow, 'code'> & { text: string }>(
    undefined,
    `select sf.id as "snapshotFileId", f.id as "fragmentId", f.set_id as "setId", ss.size as "setSize", sf.path, sf.language,
            f.name, f.kind, f.start_line as "startLine", f.end_line as "endLine", f.tokens, f.token_start as "tokenStart",
            f.token_end as "tokenEnd", f.raw_hash as "rawHash", f.normalized_hash as "normalizedHash",
            r.id as "repositoryId", r.name as "repositoryName", s.id as "snapshotId", s.label as "snapshotLabel",
            (s.settings->>'threshold') as threshold, xm.class_id as "classId", fc.text
       from cross_class_members xm
       join snapshot_files sf on sf.id = xm.snapshot_file_id
       join fragments f on f.id = xm.fragment_id
       join shingle_sets ss on ss.id = f.set_id
       join file_contents fc on fc.hash = sf.content_hash
       join snapshots s on s.id = xm.snapshot_id
       join repositories r on r.id = s.repository_id
      where xm.cross_class_id = $1
      order by r.name, sf.path, f.start_line, f.id`,
    [crossClassId],
  );
  const members: CrossMemberRow[] = rows.map(({ text, ...m }) => ({ ...m, code: splitLines(text).slice(m.startLine - 1, m.endLine).join('\n') }));
  const indexOf = new Map(members.map((m, i) => [`${m.snapshotFileId}:${m.fragmentId}`, i]));
  const pairs: FragmentPair[] = [];
  const bySnapshot = new Map<number, number[]>();
  members.forEach((m, i) => {
    const indexes = bySnapshot.get(m.snapshotId);
    if (indexes) indexes.push(i);
    else bySnapshot.set(m.snapshotId, [i]);
  });
  for (const indexes of bySnapshot.values()) {
    const own = indexes.map((i) => members[i]);
    for (const p of await clonePairsWithin(undefined, own, parseThreshold(own[0].threshold))) {
      pairs.push({ ...p, a: indexes[p.a], b: indexes[p.b] });
    }
  }
  const across = await select<CrossPairRow>(
    undefined,
    `select p.snapshot_file_id as "snapshotFileId", p.fragment_id as "fragmentId", p.other_snapshot_file_id as "otherSnapshotFileId",
            p.other_fragment_id as "otherFragmentId", p.similarity, p.clone_type as "cloneType"
       from cross_pairs p
       join cross_class_members a on a.cross_class_id = $1 and a.snapshot_file_id = p.snapshot_file_id and a.fragment_id = p.fragment_id
       join cross_class_members b on b.cross_class_id = $1 and b.snapshot_file_id = p.other_snapshot_file_id and b.fragment_id = p.other_fragment_id`,
    [crossClassId],
  );
  for (const p of across) {
    const x = indexOf.get(`${p.snapshotFileId}:${p.fragmentId}`)!;
    const y = indexOf.get(`${p.otherSnapshotFileId}:${p.otherFragmentId}`)!;
    pairs.push({ a: Math.min(x, y), b: Math.max(x, y), similarity: p.similarity, type: p.cloneType });
  }
  return { members, pairs: pairs.sort((x, y) => x.a - y.a || x.b - y.b) };
}
