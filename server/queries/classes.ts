/** Reads of a snapshot's clone classes: lists, one class with its members' code, gone classes (see README.md). */
import type { Transaction } from 'sequelize';
import type { ClassListQuery, CloneClassSummaryDTO } from '../../shared/api/snapshots';
import { splitLines } from '../../analyzers/lines';
import { clonePairsWithin, type FragmentPair, type SnapshotFragment } from '../clone-index/snapshot-pairs';
import { select } from '../clone-index/sql';
import { parseThreshold } from '../matching/threshold';

/** A class row with its member paths, as lists show it: the columns the API's summary has (dates as PostgreSQL's JSON text). */
export type ClassRow = CloneClassSummaryDTO;

/** Whether the class's lineage has an active waiver. */
const WAIVED = 'exists (select 1 from waivers w where w.lineage_id = c.lineage_id and w.ended_at is null)';

const SORT_COLUMNS: Record<ClassListQuery['sort'], string> = {
  size: 'c.size',
  tokens: 'c.tokens',
  similarity: 'c.max_similarity',
  type: 'c.clone_type',
};

const CLASS_COLUMNS = `c.id, c.snapshot_id as "snapshotId", c.size, c.tokens, c.min_similarity as "minSimilarity",
  c.max_similarity as "maxSimilarity", c.clone_type as "cloneType", c.language, c.status, c.lineage_id as "lineageId",
  (select array_agg(distinct sf.path) from clone_class_members m join snapshot_files sf on sf.id = m.snapshot_file_id
    where m.class_id = c.id) as paths,
  (select json_build_object('reason', w.reason, 'untilLabel', w.until_label, 'createdByName', u.name, 'createdAt', w.created_at)
     from waivers w left join users u on u.id = w.created_by where w.lineage_id = c.lineage_id and w.ended_at is null) as waiver,
  (select json_build_object('reason', w.ended_reason, 'snapshotLabel', es.label)
     from waivers w join snapshots es on es.id = w.ended_snapshot_id
    where w.lineage_id = c.lineage_id and w.ended_snapshot_id = c.snapshot_id order by w.ended_at desc, w.id desc limit 1) as "waiverEnded"`;

/**
 * One page of a snapshot's classes, sorted and filtered in SQL. The path filter matches any
 * member whose path contains the text (case-insensitive); waivedCount counts the waived classes
 * the other filters match.
 */
export async function listSnapshotClasses(snapshotId: number, query: ClassListQuery): Promise<{ rows: ClassRow[]; total: number; waivedCount: number }> {
  const where = ['c.snapshot_id = $1'];
  const bind: unknown[] = [snapshotId];
  const add = (sql: string, value: unknown) => {
    bind.push(value);
    where.push(sql.replace('?', `$${bind.length}`));
  };
  if (query.type !== undefined) add('c.clone_type = ?', query.type);
  if (query.language !== undefined) add('c.language = ?', query.language);
  if (query.status !== undefined) add('c.status = ?', query.status);
  if (query.path !== undefined && query.path !== '') {
    add(
      `exists (select 1 from clone_class_members m join snapshot_files sf on sf.id = m.snapshot_file_id
                where m.class_id = c.id and strpos(lower(sf.path), lower(?)) > 0)`,
      query.path,
    );
  }
  const [counts] = await select<{ all: number; waived: number }>(
    undefined,
    `select count(*)::int as "all", (count(*) filter (where ${WAIVED}))::int as waived from clone_classes c where ${where.join(' and ')}`,
    bind,
  );
  if (query.waived === 'only') where.push(WAIVED);
  if (query.waived === 'exclude') where.push(`not ${WAIVED}`);
  const total = query.waived === 'only' ? counts.waived : query.waived === 'exclude' ? counts.all - counts.waived : counts.all;
  const filter = where.join(' and ');
  const order = `${SORT_COLUMNS[query.sort]} ${query.order === 'asc' ? 'asc' : 'desc'}, c.ordinal asc`;
  const rows = await select<ClassRow>(
    undefined,
    `select ${CLASS_COLUMNS} from clone_classes c where ${filter} order by ${order}
      limit ${query.pageSize} offset ${(query.page - 1) * query.pageSize}`,
    bind,
  );
  return { rows: rows.map(sortPaths), total, waivedCount: counts.waived };
}

const sortPaths = <T extends ClassRow>(row: T): T => ({ ...row, paths: [...(row.paths ?? [])].sort().slice(0, 5) });

/** Every class of a snapshot (the comparison view), largest first. */
export async function allSnapshotClasses(snapshotId: number): Promise<ClassRow[]> {
  const rows = await select<ClassRow>(undefined, `select ${CLASS_COLUMNS} from clone_classes c where c.snapshot_id = $1 order by c.ordinal`, [snapshotId]);
  return rows.map(sortPaths);
}

/** A class row with where it stands: its repository (and organisation), snapshot label and threshold. */
export type ClassDetailRow = ClassRow & { organisationId: string; repositoryId: number; snapshotLabel: string; threshold: string };

/** A class of a repository of the organisation, or undefined. */
export async function findClass(organisationId: string, id: number): Promise<ClassDetailRow | undefined> {
  const [row] = await select<ClassDetailRow>(
    undefined,
    `select ${CLASS_COLUMNS}, r.organisation_id as "organisationId", s.repository_id as "repositoryId", s.label as "snapshotLabel",
            (s.settings->>'threshold') as threshold
       from clone_classes c join snapshots s on s.id = c.snapshot_id join repositories r on r.id = s.repository_id
      where c.id = $1 and r.organisation_id = $2`,
    [id, organisationId],
  );
  return row && sortPaths(row);
}

/** A member of a class with its code and change flag. */
export interface MemberRow extends SnapshotFragment {
  startColumn: number;
  endColumn: number;
  codeChanged: boolean;
  code: string;
}

/**
 * The members of a class with their source lines, and the clone pairs among them (recomputed
 * from the stored set pairs at the snapshot's threshold).
 */
export async function classMembers(classId: number, threshold: string): Promise<{ members: MemberRow[]; pairs: FragmentPair[] }> {
  const members = await select<MemberRow & { text: string }>(
    undefined,
    `select sf.id as "snapshotFileId", f.id as "fragmentId", f.set_id as "setId", ss.size as "setSize", sf.path, sf.language,
            f.name, f.kind, f.start_line as "startLine", f.end_line as "endLine", f.start_column as "startColumn",
            f.end_column as "endColumn", f.tokens, f.token_start as "tokenStart", f.token_end as "tokenEnd",
            f.raw_hash as "rawHash", f.normalized_hash as "normalizedHash",
            m.code_changed as "codeChanged", fc.text
       from clone_class_members m
       join snapshot_files sf on sf.id = m.snapshot_file_id
       join fragments f on f.id = m.fragment_id
       join shingle_sets ss on ss.id = f.set_id
       join file_contents fc on fc.hash = sf.content_hash
      where m.class_id = $1
      order by sf.path, f.start_line`,
    [classId],
  );
  const withCode: MemberRow[] = members.map(({ text, ...m }) => ({
    ...m,
    code: splitLines(text).slice(m.startLine - 1, m.endLine).join('\n'),
  }));
  const pairs = await clonePairsWithin(undefined, withCode, parseThreshold(threshold));
  return { members: withCode, pairs };
}

/** The classes of the previous snapshot that no class of this snapshot continues. */
export async function goneClasses(snapshotId: number, previousId: number): Promise<ClassRow[]> {
  const rows = await select<ClassRow>(
    undefined,
    `select ${CLASS_COLUMNS} from clone_classes c
      where c.snapshot_id = $2
        and not exists (select 1 from clone_classes n where n.snapshot_id = $1 and n.previous_class_id = c.id)
      order by c.ordinal`,
    [snapshotId, previousId],
  );
  return rows.map(sortPaths);
}

/** The lineage of each class of a snapshot, by class id. */
export async function classLineageIds(tx: Transaction | undefined, snapshotId: number): Promise<Map<number, number>> {
  const rows = await select<{ id: number; lineageId: number }>(tx, 'select id, lineage_id as "lineageId" from clone_classes where snapshot_id = $1', [snapshotId]);
  return new Map(rows.map((r) => [r.id, r.lineageId]));
}

/** The members of each class of a snapshot, as (snapshot file, fragment) ids, classes in order. */
export async function classMemberIds(
  tx: Transaction | undefined,
  snapshotId: number,
): Promise<Map<number, { snapshotFileId: number; fragmentId: number }[]>> {
  const rows = await select<{ classId: number; snapshotFileId: number; fragmentId: number }>(
    tx,
    `select m.class_id as "classId", m.snapshot_file_id as "snapshotFileId", m.fragment_id as "fragmentId"
       from clone_class_members m join clone_classes c on c.id = m.class_id where c.snapshot_id = $1 order by c.ordinal`,
    [snapshotId],
  );
  const grouped = new Map<number, { snapshotFileId: number; fragmentId: number }[]>();
  for (const { classId, ...member } of rows) {
    const list = grouped.get(classId) ?? [];
    list.push(member);
    grouped.set(classId, list);
  }
  return grouped;
}
