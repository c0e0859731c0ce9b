/**
 * The organisation's clone classes in one list (see README.md): the classes of the latest ready
 * snapshot of every repository, and the classes that span repositories, filtered, sorted and
 * paged in SQL.
 */
import type { ClassScope, ClassRepositoryDTO, OrganisationClassQuery } from '../../shared/api/clone-classes';
import type { ClassStatus } from '../../shared/api/snapshots';
import { select } from '../clone-index/sql';

/** A row of the list as the query gives it (dates as PostgreSQL's JSON text). */
export interface OrganisationClassRow {
  scope: ClassScope;
  id: number;
  size: number;
  tokens: number;
  minSimilarity: number;
  maxSimilarity: number;
  cloneType: number;
  language: string;
  status: ClassStatus | null;
  repositories: ClassRepositoryDTO[];
  snapshotId: number | null;
  snapshotLabel: string | null;
  paths: string[] | null;
  waiver: { reason: string; untilLabel: string | null; createdByName: string | null; createdAt: string } | null;
  acrossClassId: number | null;
}

const WAIVED = 'exists (select 1 from waivers w where w.lineage_id = c.lineage_id and w.ended_at is null)';

const SORT_COLUMNS: Record<OrganisationClassQuery['sort'], string> = {
  tokens: 'tokens',
  size: 'size',
  similarity: 'max_similarity',
  type: 'clone_type',
  repository: 'repository_name',
};

/**
 * The two halves of the list with every filter but the waived one, as one `rows` CTE: $1 is the
 * organisation; each filter's value is bound once and used by both halves.
 */
function rowsCte(organisationId: string, query: OrganisationClassQuery): { sql: string; bind: unknown[] } {
  const bind: unknown[] = [organisationId];
  const param = (value: unknown) => {
    bind.push(value);
    return `$${bind.length}`;
  };
  const within = ['r.organisation_id = $1'];
  const across = ['x.organisation_id = $1'];
  if (query.repository !== undefined) {
    const p = param(query.repository);
    within.push(`r.id = ${p}`);
    across.push(`exists (select 1 from cross_class_members xm join snapshots s on s.id = xm.snapshot_id where xm.cross_class_id = x.id and s.repository_id = ${p})`);
  }
  if (query.language !== undefined && query.language !== '') {
    const p = param(query.language);
    within.push(`c.language = ${p}`);
    across.push(`x.language = ${p}`);
  }
  if (query.type !== undefined) {
    const p = param(query.type);
    within.push(`c.clone_type = ${p}`);
    across.push(`x.clone_type = ${p}`);
  }
  if (query.minMembers !== undefined) {
    const p = param(query.minMembers);
    within.push(`c.size >= ${p}`);
    across.push(`x.size >= ${p}`);
  }
  if (query.minTokens !== undefined) {
    const p = param(query.minTokens);
    within.push(`c.tokens >= ${p}`);
    across.push(`x.tokens >= ${p}`);
  }
  if (query.path !== undefined && query.path !== '') {
    const p = param(query.path);
    within.push(`exists (select 1 from clone_class_members m join snapshot_files sf on sf.id = m.snapshot_file_id
                          where m.class_id = c.id and strpos(lower(sf.path), lower(${p})) > 0)`);
    across.push(`exists (select 1 from cross_class_members xm join snapshot_files sf on sf.id = xm.snapshot_file_id
                          where xm.cross_class_id = x.id and strpos(lower(sf.path), lower(${p})) > 0)`);
  }
  if (query.name !== undefined && query.name !== '') {
    const p = param(query.name);
    within.push(`exists (select 1 from clone_class_members m join fragments f on f.id = m.fragment_id
                          where m.class_id = c.id and strpos(lower(f.name), lower(${p})) > 0)`);
    across.push(`exists (select 1 from cross_class_members xm join fragments f on f.id = xm.fragment_id
                          where xm.cross_class_id = x.id and strpos(lower(f.name), lower(${p})) > 0)`);
  }
  // a class across repositories has no status of its own: a status filter leaves them out
  if (query.status !== undefined) {
    within.push(`c.status = ${param(query.status)}`);
    across.push('false');
  }
  if (query.scope === 'across') within.push('false');
  if (query.scope === 'within') across.push('false');
  const sql = `rows as (
      select 'within' as scope, c.id, c.size, c.tokens, c.min_similarity, c.max_similarity, c.clone_type, c.language, c.status,
             c.snapshot_id, s.label as snapshot_label, r.name as repository_name, ${WAIVED} as waived, c.lineage_id
        from latest_ready_snapshots l
        join repositories r on r.id = l.repository_id
        join snapshots s on s.id = l.snapshot_id
        join clone_classes c on c.snapshot_id = l.snapshot_id
       where ${within.join(' and ')}
      union all
      select 'across', x.id, x.size, x.tokens, x.min_similarity, x.max_similarity, x.clone_type, x.language, null,
             null, null,
             (select min(r.name) from cross_class_members xm join snapshots s on s.id = xm.snapshot_id
                join repositories r on r.id = s.repository_id where xm.cross_class_id = x.id),
             false, null
        from cross_classes x
       where ${across.join(' and ')})`;
  return { sql, bind };
}

/**
 * One page of the organisation's classes. The path and name filters match any member whose path
 * or function name contains the text (case-insensitive); waivedCount counts the waived classes the
 * other filters match. Ties in the sort keep a fixed order (within before across, then by id).
 */
export async function listOrganisationClasses(
  organisationId: string,
  query: OrganisationClassQuery,
): Promise<{ rows: OrganisationClassRow[]; total: number; waivedCount: number }> {
  const { sql: rows, bind } = rowsCte(organisationId, query);
  const [counts] = await select<{ all: number; waived: number }>(
    undefined,
    `with ${rows} select count(*)::int as "all", (count(*) filter (where waived))::int as waived from rows`,
    bind,
  );
  const waivedFilter = query.waived === 'only' ? 'where waived' : query.waived === 'exclude' ? 'where not waived' : '';
  const total = query.waived === 'only' ? counts.waived : query.waived === 'exclude' ? counts.all - counts.waived : counts.all;
  const direction = query.order === 'asc' ? 'asc' : 'desc';
  const page = await select<OrganisationClassRow>(
    undefined,
    `with ${rows}, page as (
       select * from rows ${waivedFilter}
        order by ${SORT_COLUMNS[query.sort]} ${direction}, scope desc, id asc
        limit ${query.pageSize} offset ${(query.page - 1) * query.pageSize})
     select p.scope, p.id, p.size, p.tokens, p.min_similarity as "minSimilarity", p.max_similarity as "maxSimilarity",
            p.clone_type as "cloneType", p.language, p.status, p.snapshot_id as "snapshotId", p.snapshot_label as "snapshotLabel",
            case when p.scope = 'within' then
              (select json_agg(json_build_object('id', r.id, 'name', r.name)) from snapshots s join repositories r on r.id = s.repository_id where s.id = p.snapshot_id)
            else
              (select json_agg(json_build_object('id', q.id, 'name', q.name) order by q.name) from (
                 select distinct r.id, r.name from cross_class_members xm join snapshots s on s.id = xm.snapshot_id
                   join repositories r on r.id = s.repository_id where xm.cross_class_id = p.id) q)
            end as repositories,
            case when p.scope = 'within' then
              (select array_agg(distinct sf.path) from clone_class_members m join snapshot_files sf on sf.id = m.snapshot_file_id where m.class_id = p.id)
            else
              (select array_agg(distinct sf.path) from cross_class_members xm join snapshot_files sf on sf.id = xm.snapshot_file_id where xm.cross_class_id = p.id)
            end as paths,
            (select json_build_object('reason', w.reason, 'untilLabel', w.until_label, 'createdByName', u.name, 'createdAt', w.created_at)
               from waivers w left join users u on u.id = w.created_by where p.scope = 'within' and w.lineage_id = p.lineage_id and w.ended_at is null) as waiver,
            (select min(xm.cross_class_id) from cross_class_members xm where p.scope = 'within' and xm.class_id = p.id) as "acrossClassId"
       from page p
      order by p.${SORT_COLUMNS[query.sort]} ${direction}, p.scope desc, p.id asc`,
    bind,
  );
  return { rows: page, total, waivedCount: counts.waived };
}

/** The languages and repositories that have classes in the latest ready snapshots (the filters' choices). */
export async function organisationClassChoices(organisationId: string): Promise<{ languages: string[]; repositories: ClassRepositoryDTO[] }> {
  const languages = await select<{ language: string }>(
    undefined,
    `select distinct c.language from latest_ready_snapshots l join repositories r on r.id = l.repository_id
       join clone_classes c on c.snapshot_id = l.snapshot_id where r.organisation_id = $1
     union select distinct x.language from cross_classes x where x.organisation_id = $1
     order by 1`,
    [organisationId],
  );
  const repositories = await select<ClassRepositoryDTO>(
    undefined,
    `select r.id, r.name from repositories r join latest_ready_snapshots l on l.repository_id = r.id where r.organisation_id = $1 order by r.name`,
    [organisationId],
  );
  return { languages: languages.map((l) => l.language), repositories };
}
