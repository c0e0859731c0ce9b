import type { Transaction } from 'sequelize';
import { chunks, copyRows, execute, parseIntArray, select } from './sql';

const LOOKUP_CHUNK = 50_000;

/**
 * Ranks of the given distinct shingles, adding the unknown ones to the dictionary.
 * New shingles get ranks below every known rank (they are rarer than anything indexed, and no
 * stored set contains them, so no stored array changes order). Among themselves the rarer in this
 * batch comes first. Call under the index write lock.
 *
 * One round trip whatever the number: the texts go in once, by binary COPY with their ordinals and
 * counts, and one statement finds the known ranks, ranks and stores the new shingles, and returns
 * every rank as two integer arrays (as text[] parameters each text would be quoted into an array
 * literal and parsed again, and each returned row would cost an object).
 */
export async function resolveShingles(tx: Transaction, counts: Map<string, number>): Promise<Map<string, number>> {
  const texts = [...counts.keys()];
  const ranks = new Map<string, number>();
  if (texts.length === 0) return ranks;
  await execute(tx, 'create temp table incoming_shingles (ordinal int, text text, count int) on commit drop');
  await copyRows(tx, 'incoming_shingles', ['ordinal', 'text', 'count'], [
    { type: 'int4', values: Int32Array.from(texts, (_, i) => i) },
    { type: 'text', values: texts },
    { type: 'int4', values: Int32Array.from(texts, (t) => counts.get(t)!) },
  ]);
  // new shingles: most frequent first, so it gets the highest of the new ranks; ties in the order given
  const [row] = await select<{ ordinals: string | null; ranks: string | null }>(
    tx,
    `with known as (
       select i.ordinal, s.rank from incoming_shingles i join shingles s on s.text = i.text
     ), fresh as (
       select i.ordinal, i.text,
              ((select coalesce(min(rank), 0) from shingles) - row_number() over (order by i.count desc, i.ordinal))::int as rank
         from incoming_shingles i
        where not exists (select 1 from shingles s where s.text = i.text)
     ), stored as (
       insert into shingles (text, rank) select text, rank from fresh
     )
     select array_agg(ordinal)::text as ordinals, array_agg(rank)::text as ranks
       from (select ordinal, rank from known union all select ordinal, rank from fresh) as r`,
  );
  await execute(tx, 'drop table incoming_shingles');
  if (row.ordinals === null) return ranks;
  const ordinals = parseIntArray(row.ordinals);
  const found = parseIntArray(row.ranks!);
  for (let i = 0; i < ordinals.length; i++) ranks.set(texts[ordinals[i]], found[i]);
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
