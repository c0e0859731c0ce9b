import type { Transaction } from 'sequelize';
import { chunks, copyRows, execute, parseIntArray, select } from './sql';

const LOOKUP_CHUNK = 50_000;

/**
 * Ranks of the given distinct shingles, adding the unknown ones to the dictionary.
 * New shingles get ranks below every known rank (they are rarer than anything indexed, and no
 * stored set contains them, so no stored array changes order). Among themselves the rarer in this
 * batch comes first. Call under the index write lock.
 */
export async function resolveShingles(
  tx: Transaction,
  counts: Map<string, number>,
): Promise<Map<string, number>> {
  const ranks = await lookupManyShingles(tx, [...counts.keys()]);
  const unknown = [...counts.keys()].filter((s) => !ranks.has(s));
  if (unknown.length === 0) return ranks;
  // most frequent first, so it gets the highest of the new ranks; ties by text for determinism
  unknown.sort((a, b) => counts.get(b)! - counts.get(a)! || (a < b ? -1 : a > b ? 1 : 0));
  const newRanks = await ranksBelowKnown(tx, unknown.length);
  await copyRows(tx, 'shingles', ['text', 'rank'], [
    { type: 'text', values: unknown },
    { type: 'int4', values: newRanks },
  ]);
  unknown.forEach((s, i) => ranks.set(s, newRanks[i]));
  return ranks;
}

/**
 * `count` ranks below every rank in the dictionary, descending (min − 1, min − 2, …): the ranks
 * of new shingles, which are rarer than anything indexed, so no stored set changes order. A
 * probe with shingles the dictionary lacks uses them too, without storing them.
 */
export async function ranksBelowKnown(tx: Transaction | undefined, count: number): Promise<number[]> {
  const [{ min }] = await select<{ min: number | null }>(tx, 'select min(rank) as min from shingles');
  const top = (min ?? 0) - 1;
  return Array.from({ length: count }, (_, i) => top - i);
}

/** Ranks of the known shingles among `texts` (unknown ones are absent from the map). */
export async function lookupShingles(tx: Transaction | undefined, texts: string[]): Promise<Map<string, number>> {
  const ranks = new Map<string, number>();
  for (const [start, end] of chunks(texts.length, LOOKUP_CHUNK)) {
    const rows = await select<{ text: string; rank: number }>(
      tx,
      'select text, rank from shingles where text = any($1::text[])',
      [texts.slice(start, end)],
    );
    for (const row of rows) ranks.set(row.text, row.rank);
  }
  return ranks;
}

/** Lookups of more shingles than this go through a temporary table. */
const BULK_LOOKUP = 2_000;

/**
 * lookupShingles for a load's many shingles: the texts go in by binary COPY with their ordinals,
 * and the ranks of the known ones come back as two integer arrays. As a text[] parameter each
 * text would be quoted and escaped into an array literal, then parsed again by PostgreSQL, and
 * each row returned would cost an object.
 */
async function lookupManyShingles(tx: Transaction, texts: string[]): Promise<Map<string, number>> {
  if (texts.length < BULK_LOOKUP) return lookupShingles(tx, texts);
  await execute(tx, 'create temp table wanted_shingles (ordinal int, text text) on commit drop');
  await copyRows(tx, 'wanted_shingles', ['ordinal', 'text'], [
    { type: 'int4', values: Int32Array.from(texts, (_, i) => i) },
    { type: 'text', values: texts },
  ]);
  const [row] = await select<{ ordinals: string | null; ranks: string | null }>(
    tx,
    `select array_agg(w.ordinal)::text as ordinals, array_agg(s.rank)::text as ranks
       from wanted_shingles w join shingles s on s.text = w.text`,
  );
  await execute(tx, 'drop table wanted_shingles');
  const ranks = new Map<string, number>();
  if (row.ordinals === null) return ranks;
  const ordinals = parseIntArray(row.ordinals);
  const found = parseIntArray(row.ranks!);
  for (let i = 0; i < ordinals.length; i++) ranks.set(texts[ordinals[i]], found[i]);
  return ranks;
}

/** Turns a shingle set into its ascending rank array. */
export function toRankArray(shingles: string[], ranks: Map<string, number>): Int32Array {
  const out = new Int32Array(shingles.length);
  shingles.forEach((s, i) => {
    const rank = ranks.get(s);
    if (rank === undefined) throw new Error(`shingle missing from the dictionary`);
    out[i] = rank;
  });
  return out.sort();
}
