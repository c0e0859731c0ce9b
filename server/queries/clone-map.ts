/** Per-file token figures of a snapshot, for the clone map (see README.md). */
import { select } from '../clone-index/sql';

/** A file's tokens inside fragments and, of those, tokens in at least one clone pair. */
export interface FileFiguresRow {
  path: string;
  tokens: number;
  clonedTokens: number;
}

/**
 * Each analysed file of a snapshot with its tokens, counted as the clone ratio counts them: each
 * token once by its position (nested fragments overlap), cloned when it lies in a fragment that
 * belongs to a clone class (a fragment is in a class exactly when it is in a clone pair).
 */
export function fileFigures(snapshotId: number): Promise<FileFiguresRow[]> {
  return select<FileFiguresRow>(
    undefined,
    `with spans as (
       select sf.id, sf.path, int4range(f.token_start, f.token_end) as span,
              exists (select 1 from clone_class_members m where m.snapshot_file_id = sf.id and m.fragment_id = f.id) as cloned
         from snapshot_files sf join fragments f on f.analysis_id = sf.analysis_id
        where sf.snapshot_id = $1),
     per_file as (
       select id, path, range_agg(span) as covered, coalesce(range_agg(span) filter (where cloned), '{}'::int4multirange) as cloned
         from spans group by id, path)
     select path,
            (select coalesce(sum(upper(r) - lower(r)), 0) from unnest(covered) r)::int as tokens,
            (select coalesce(sum(upper(r) - lower(r)), 0) from unnest(cloned) r)::int as "clonedTokens"
       from per_file order by path`,
    [snapshotId],
  );
}
