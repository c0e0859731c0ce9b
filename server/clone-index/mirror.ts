/**
 * The index's in-memory mirror: every stored set's rank array and prefix lists, held by a process
 * between loads, so a load probes its new sets in memory (server/matching/growing-index.ts)
 * instead of through prefix_entries. PostgreSQL stays the system of record: the mirror is only a
 * copy, checked and brought up to date under the index write lock before every use.
 *
 * Why the copy stays right: sets are only ever appended (under the write lock, with growing ids),
 * so the mirror holds every stored set with an id up to `maxId`, in id order, and catches up by
 * reading the sets above it. A rebuild re-ranks every set and bumps clone_index_state.epoch; a
 * database dropped and created again (or another database behind the same connection) has another
 * `instance`: either empties the mirror. A load's own sets join the mirror as pending and count
 * as stored only once its transaction commits; pending sets left by a transaction that rolled back
 * are dropped at the next use.
 */
import type { Sequelize, Transaction } from 'sequelize';
import { loadConfig } from '../config';
import { db } from '../db/connection';
import { GrowingIndex } from '../matching/growing-index';
import { indexThreshold } from './options';
import { parseIntArray, select } from './sql';

/** Bytes a mirrored id costs: its rank (4), and 40 % of ids sit in a prefix entry of 12 bytes at 0.6, with slack. */
const BYTES_PER_ID = 10;
/** Sets read per query when catching up. */
const READ_CHUNK = 50_000;
/**
 * A cold mirror is filled only when that costs less than probing through PostgreSQL: reading a
 * stored set costs about as much as probing 1/READS_PER_PROBE of a new one (bench:index).
 */
export const READS_PER_PROBE = 100;

class Mirror {
  readonly index = new GrowingIndex(indexThreshold);
  /** set number → set id */
  ids = new Int32Array(1024);
  /** sets and largest id of committed transactions */
  committed = 0;
  maxId = 0;
  instance = '';
  epoch = -1;
  /** changes with every use, so a late commit hook of an older use does nothing */
  generation = 0;

  pushIds(ids: ArrayLike<number>) {
    const from = this.index.size;
    if (from + ids.length > this.ids.length) {
      const grown = new Int32Array(Math.max(from + ids.length, this.ids.length * 2));
      grown.set(this.ids.subarray(0, from));
      this.ids = grown;
    }
    this.ids.set(ids, from);
  }
}

const mirrors = new WeakMap<Sequelize, Mirror>();

/** How a load should probe: with the mirror (up to date, the load's sets appended) or through PostgreSQL. */
export type MirrorUse = { mirror: MirrorSession } | { mirror: undefined; reason: string };

/** The mirror during one load, under the write lock. */
export interface MirrorSession {
  index: GrowingIndex;
  /** the set number of each stored id, for the sets of this session */
  setId(n: number): number;
  /** appends the load's new sets (ascending ids, all above every stored id) as pending */
  appendPending(sets: { id: number; ranks: Int32Array }[]): number;
}

/**
 * Brings the process's mirror up to date for a load that will probe `newSets` sets, or says why
 * the load should probe through PostgreSQL instead (the mirror is off, would pass its memory
 * limit, or is cold and reading it would cost more than probing). Call under the index write lock,
 * before the load stores its sets.
 */
export async function useMirror(tx: Transaction, newSets: number, mode: 'auto' | 'memory'): Promise<MirrorUse> {
  const limitBytes = loadConfig().indexMemoryMb * 2 ** 20;
  if (limitBytes === 0) return { mirror: undefined, reason: 'off' };
  const sequelize = db();
  let mirror = mirrors.get(sequelize);
  const [state] = await select<{ instance: string; epoch: number; maxId: number }>(
    tx,
    'select instance::text as instance, epoch, (select coalesce(max(id), 0) from shingle_sets)::int as "maxId" from clone_index_state',
  );
  if (!mirror || mirror.instance !== state.instance || mirror.epoch !== state.epoch || state.maxId < mirror.maxId) {
    mirror = new Mirror();
    mirror.instance = state.instance;
    mirror.epoch = state.epoch;
    mirrors.set(sequelize, mirror);
  }
  mirror.generation++;
  // pending sets of a transaction whose commit was never seen: the database has them or not, and
  // either way reading above maxId gives the truth
  if (mirror.index.size > mirror.committed) mirror.index.truncate(mirror.committed);
  if (state.maxId > mirror.maxId) {
    const [behind] = await select<{ sets: number; ids: number }>(
      tx,
      'select count(*)::int as sets, coalesce(sum(size), 0)::float8 as ids from shingle_sets where id > $1',
      [mirror.maxId],
    );
    if ((mirror.index.totalIds + behind.ids) * BYTES_PER_ID > limitBytes) {
      mirrors.delete(sequelize);
      return { mirror: undefined, reason: 'memory' };
    }
    if (mode === 'auto' && behind.sets > READS_PER_PROBE * newSets) return { mirror: undefined, reason: 'cold' };
    await catchUp(tx, mirror, state.maxId);
  }
  const session = mirror;
  const generation = mirror.generation;
  return {
    mirror: {
      index: session.index,
      setId: (n) => session.ids[n],
      appendPending(sets) {
        session.pushIds(sets.map((s) => s.id));
        const first = session.index.append(sets.map((s) => s.ranks), false);
        const maxId = sets.length > 0 ? sets[sets.length - 1].id : session.maxId;
        tx.afterCommit(() => {
          if (session.generation !== generation || session.index.size !== first + sets.length) return;
          session.committed = session.index.size;
          session.maxId = Math.max(session.maxId, maxId);
          session.index.compact();
        });
        return first;
      },
    },
  };
}

/** Reads every stored set with an id in (mirror.maxId, upTo] into the mirror, in id order. */
async function catchUp(tx: Transaction, mirror: Mirror, upTo: number) {
  let after = mirror.maxId;
  while (after < upTo) {
    // one row per chunk, as in loadSets: ids, sizes and every rank concatenated, parsed into typed arrays
    const [row] = await select<{ ids: string | null; sizes: string | null; ranks: string | null }>(
      tx,
      `select array_agg(id)::text as ids, array_agg(size)::text as sizes,
              '{' || coalesce(string_agg(nullif(array_to_string(ranks, ','), ''), ','), '') || '}' as ranks
         from (select id, size, ranks from shingle_sets where id > $1 and id <= $2 order by id limit ${READ_CHUNK}) as s`,
      [after, upTo],
    );
    if (row.ids === null) break;
    const ids = parseIntArray(row.ids);
    const sizes = parseIntArray(row.sizes!);
    const ranks = parseIntArray(row.ranks!);
    const sets: Int32Array[] = [];
    let offset = 0;
    for (const size of sizes) {
      sets.push(ranks.subarray(offset, offset + size));
      offset += size;
    }
    if (offset !== ranks.length) throw new Error(`read ${ranks.length} ranks for sets totalling ${offset}`);
    mirror.pushIds(ids);
    mirror.index.append(sets);
    after = ids[ids.length - 1];
    mirror.committed = mirror.index.size;
    mirror.maxId = after;
  }
  mirror.maxId = Math.max(mirror.maxId, upTo);
}

/** Forgets every process mirror of the current database connection (tests; a rebuild also does it through the epoch). */
export function dropMirror(): void {
  mirrors.delete(db());
}
