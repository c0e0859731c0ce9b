/**
 * Writes and reads of what a load stores per file: contents (once per sha-256), analyses (once per
 * content and analyzer options) with their fragments, and a snapshot's file list. Bulk writes are
 * binary COPY (texts and fragments) or `unnest` batches: one statement per batch, never one per
 * row (see README.md).
 */
import type { Transaction } from 'sequelize';
import type { FileAnalysis } from '../../analyzers/types';
import { chunks, copyRows, execute, select } from '../clone-index/sql';

/**
 * Stores file texts not stored yet, by content hash (the bytes are UTF-8 text by the time they get
 * here). The texts go in by binary COPY, through a temporary table so that a text another load
 * stores meanwhile is skipped (on conflict) instead of failing this one: as text[] parameters they
 * cost an array literal with every quote escaped, built here and parsed again by PostgreSQL.
 */
export async function storeContents(tx: Transaction, contents: Map<string, Uint8Array>): Promise<void> {
  const known = new Set<string>();
  const hashes = [...contents.keys()];
  for (const [start, end] of chunks(hashes.length, 20_000)) {
    const rows = await select<{ hash: string }>(tx, 'select hash from file_contents where hash = any($1::text[])', [hashes.slice(start, end)]);
    for (const row of rows) known.add(row.hash);
  }
  const missing = hashes.filter((h) => !known.has(h));
  if (missing.length === 0) return;
  await execute(tx, 'create temp table incoming_contents (hash text, text text, byte_size int) on commit drop');
  await copyRows(tx, 'incoming_contents', ['hash', 'text', 'byte_size'], [
    { type: 'text', values: missing },
    { type: 'text', values: missing.map((h) => Buffer.from(contents.get(h)!).toString('utf8')) },
    { type: 'int4', values: missing.map((h) => contents.get(h)!.byteLength) },
  ]);
  await execute(tx, 'insert into file_contents (hash, text, byte_size) select * from incoming_contents on conflict do nothing');
  await execute(tx, 'drop table incoming_contents');
}

/** The analysis id of each content hash already analyzed under the options key. */
export async function findAnalyses(tx: Transaction | undefined, hashes: string[], optionsKey: string): Promise<Map<string, number>> {
  const rows = await select<{ id: number; contentHash: string }>(
    tx,
    'select id, content_hash as "contentHash" from analyses where options_key = $1 and content_hash = any($2::text[])',
    [optionsKey, hashes],
  );
  return new Map(rows.map((r) => [r.contentHash, r.id]));
}

/** The language and parse error (if any) of each analysis, by id. */
export async function analysisOutcomes(tx: Transaction, ids: number[]): Promise<Map<number, { language: string; error: string | null }>> {
  const rows = await select<{ id: number; language: string; error: string | null }>(
    tx,
    'select id, language, error from analyses where id = any($1::int[])',
    [ids],
  );
  return new Map(rows.map((r) => [r.id, r]));
}

/**
 * Stores fresh analyses and their fragments; each fragment gets the shingle set id at its place
 * in `setIds` (the fragments of all analyses in order). Adds the new analysis ids to `analysisIds`.
 */
export async function storeAnalyses(
  tx: Transaction,
  optionsKey: string,
  fresh: { hash: string; analysis: FileAnalysis }[],
  setIds: number[],
  analysisIds: Map<string, number>,
): Promise<void> {
  if (fresh.length === 0) return;
  // Another load may have stored the same content's analysis meanwhile (loads analyse outside any
  // lock): that one is kept, and it is the same, since analysis is a pure function of the content.
  const rows = await select<{ id: number; contentHash: string }>(
    tx,
    `insert into analyses (content_hash, options_key, language, error)
     select h, $1, l, e from unnest($2::text[], $3::text[], $4::text[]) as t(h, l, e)
     on conflict (content_hash, options_key) do nothing
     returning id, content_hash as "contentHash"`,
    [optionsKey, fresh.map((f) => f.hash), fresh.map((f) => f.analysis.language), fresh.map((f) => f.analysis.error ?? null)],
  );
  const inserted = new Set<string>();
  for (const r of rows) {
    analysisIds.set(r.contentHash, r.id);
    inserted.add(r.contentHash);
  }
  const theirs = fresh.filter((f) => !inserted.has(f.hash)).map((f) => f.hash);
  if (theirs.length > 0) for (const [hash, id] of await findAnalyses(tx, theirs, optionsKey)) analysisIds.set(hash, id);
  const columns: unknown[][] = Array.from({ length: 14 }, () => []);
  let setIndex = 0;
  for (const { hash, analysis } of fresh) {
    if (!inserted.has(hash)) {
      setIndex += analysis.fragments.length;
      continue;
    }
    analysis.fragments.forEach((f, ordinal) => {
      const values = [analysisIds.get(hash), ordinal, f.name, f.kind, f.startLine, f.startColumn, f.endLine, f.endColumn, f.tokens, f.tokenStart, f.tokenEnd, f.rawHash, f.normalizedHash, setIds[setIndex++]];
      values.forEach((v, i) => columns[i].push(v));
    });
  }
  const [analysisId, ordinal, name, kind, startLine, startColumn, endLine, endColumn, tokens, tokenStart, tokenEnd, rawHash, normalizedHash, setId] = columns;
  const int = (values: unknown[]) => ({ type: 'int4' as const, values: values as number[] });
  const text = (values: unknown[]) => ({ type: 'text' as const, values: values as string[] });
  await copyRows(
    tx,
    'fragments',
    ['analysis_id', 'ordinal', 'name', 'kind', 'start_line', 'start_column', 'end_line', 'end_column', 'tokens', 'token_start', 'token_end', 'raw_hash', 'normalized_hash', 'set_id'],
    [int(analysisId), int(ordinal), text(name), text(kind), int(startLine), int(startColumn), int(endLine), int(endColumn), int(tokens), int(tokenStart), int(tokenEnd), text(rawHash), text(normalizedHash), int(setId)],
  );
}

/** One file of a snapshot: analyzed (content and analysis), or skipped or failed with the reason. */
export interface SnapshotFileRow {
  path: string;
  contentHash: string | null;
  analysisId: number | null;
  language: string | null;
  skipReason: string | null;
  error: string | null;
}

/** Stores a snapshot's files. */
export async function storeSnapshotFiles(tx: Transaction, snapshotId: number, rows: SnapshotFileRow[]): Promise<void> {
  for (const [start, end] of chunks(rows.length, 10_000)) {
    const slice = rows.slice(start, end);
    await execute(
      tx,
      `insert into snapshot_files (snapshot_id, path, content_hash, analysis_id, language, skip_reason, error)
       select $1, * from unnest($2::text[], $3::text[], $4::int[], $5::text[], $6::text[], $7::text[])`,
      [snapshotId, slice.map((r) => r.path), slice.map((r) => r.contentHash), slice.map((r) => r.analysisId), slice.map((r) => r.language), slice.map((r) => r.skipReason), slice.map((r) => r.error)],
    );
  }
}

/** Advisory lock key between loads storing a snapshot's files (shared) and deletions of unheld file texts (exclusive). */
const CONTENTS_LOCK = 0x646f75636f;

/**
 * Taken (shared) by a load's last transaction before it relies on stored texts and analyses, and
 * (exclusive) by a deletion of unheld texts: a deletion never removes what a load in flight is
 * about to hold, and loads never wait for each other.
 */
export function lockContents(tx: Transaction, mode: 'load' | 'delete'): Promise<void> {
  return execute(tx, mode === 'load' ? 'select pg_advisory_xact_lock_shared($1)' : 'select pg_advisory_xact_lock($1)', [CONTENTS_LOCK]);
}

/**
 * Deletes every stored file text that no snapshot of any repository holds any more (its analyses
 * and fragments go with it, by cascade).
 */
export function deleteUnheldContents(tx: Transaction): Promise<void> {
  return execute(tx, `delete from file_contents fc where not exists (select 1 from snapshot_files sf where sf.content_hash = fc.hash)`);
}
