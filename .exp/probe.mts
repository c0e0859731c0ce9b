import { Collection } from '../server/bench/synthetic';
import { GrowingIndex, type GrowingIndexMatch } from '../server/matching/growing-index';
import { parseThreshold } from '../server/matching/threshold';
import { setHash } from '../server/clone-index/sets';
const T = parseThreshold('0.6');
const N = Number(process.argv[2] ?? 200000);
const c = new Collection(7);
const dict = new Map<string, number>();
let min = 0;
const index = new GrowingIndex(T);
const seen = new Set<string>();
function rank(batch: string[][]) {
  const df = new Map<string, number>();
  for (const s of batch) for (const x of s) if (!dict.has(x)) df.set(x, (df.get(x) ?? 0) + 1);
  const unknown = [...df.keys()].sort((a, b) => df.get(b)! - df.get(a)! || (a < b ? -1 : 1));
  for (const u of unknown) dict.set(u, --min);
  return batch.map((s) => Int32Array.from(s, (x) => dict.get(x)!).sort());
}
let t0 = performance.now();
for (let start = 0; start < N; start += 25000) {
  const batch: string[][] = [];
  for (let i = start; i < Math.min(N, start + 25000); i++) { const s = c.set(i); const h = setHash(s); if (!seen.has(h)) { seen.add(h); batch.push(s); } }
  const ranked = rank(batch);
  const first = index.append(ranked);
  const m: GrowingIndexMatch[] = [];
  ranked.forEach((x, k) => { m.length = 0; index.probe(x, T, first + k, m); });
}
console.log('built', N, 'sets', index.size, 'ids', index.totalIds, 'entries', index.totalEntries, 'segments', index.segmentCount, ((performance.now() - t0) / 1000).toFixed(1), 's', 'rss', (process.memoryUsage().rss / 2**20).toFixed(0));
const release = rank(Array.from({ length: 10000 }, (_, q) => c.releaseSet(q, N)));
for (let round = 0; round < 3; round++) {
  t0 = performance.now();
  const first = index.append(release);
  let cand = 0, pairs = 0;
  const m: GrowingIndexMatch[] = [];
  release.forEach((x, k) => { m.length = 0; cand += index.probe(x, T, first + k, m); pairs += m.length; });
  const ms = performance.now() - t0;
  index.truncate(first);
  console.log('probe 10k', ms.toFixed(0), 'ms', (10000 / ms * 1000).toFixed(0), 'sets/s', 'candidates', cand, 'pairs', pairs);
}
