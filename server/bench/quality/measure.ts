/**
 * The quality benchmark's measurement: sample real functions, make edited copies of each, plant
 * them beside the unedited corpus (in memory), analyse everything with the project's analyzers,
 * join the copies against the corpus, and count per edit kind × threshold × shingle size whether
 * each copy pairs with its own original, and which other pairs it brings in.
 */
import { analyzeFiles, type Fragment } from '../../../analyzers';
import { joinAgainst, selfJoin } from '../../matching/join';
import { rankShingles } from '../../matching/order';
import { parseThreshold, reaches } from '../../matching/threshold';
import { mix, random } from '../synthetic';
import { jsSnippet, lineStarts, pySnippet, type CorpusFile } from './corpus';
import { applyJsEdit, type EditResult, type JsEditKind } from './js-edits';
import { applyPyEdit, type PyEditKind, type PySnippet } from './python-edits';
import { parseStrict, type Snippet } from './syntax';

/** Options of one measurement; every list is in the order the tables print it. */
export interface MeasureOptions {
  language: 'js' | 'python';
  files: readonly CorpusFile[];
  kinds: readonly (JsEditKind | PyEditKind)[];
  /** How many functions to copy (fewer when the corpus has fewer). */
  functions: number;
  thresholds: readonly number[];
  shingleSizes: readonly number[];
  seed: number;
  /** The analyzer's minimum fragment size. Default 50 (the product's default). */
  minTokens?: number;
  /** Functions above this many tokens are not copied (they would dilute every edit). Default 800. */
  maxTokens?: number;
  /** Analysis threads. Default: the analyzer's (one per core). */
  workers?: number;
}

/** Counts of one edit kind at one threshold and shingle size. */
export interface Cell {
  /** Copies that paired with their own original. */
  found: number;
  /** Pairs of a copy with a corpus fragment other than its original that its original does not have. */
  newPairs: number;
  /** Pairs of a copy with a fragment its original already pairs with (a copy of a function that has copies). */
  inheritedPairs: number;
}

/** One edit kind's copies. */
export interface KindResult {
  kind: string;
  /** Functions tried (= planted + skipped + failed). */
  tried: number;
  /** Copies made and planted. */
  planted: number;
  /** Functions too small or without what the edit needs, by reason. */
  skipped: Record<string, number>;
  /** Edits whose result did not parse (a bug in an operator; expected 0). */
  failed: number;
  /** Planted copies that fell below minTokens (no fragment, so not found), per shingle size. */
  belowMinimum: Record<number, number>;
  /** `${shingleSize}:${threshold}` → counts. */
  cells: Record<string, Cell>;
  /** Recall at t = 0.8 (the default before 0.7) and the default shingle size by the original's size, `lo-hi` → [found, planted]. */
  bySize: Record<string, [number, number]>;
}

/** A pair the unedited corpus already holds, for a person to read. */
export interface CorpusPairSample {
  a: string;
  b: string;
  similarity: number;
}

/** Everything one measurement found. */
export interface MeasureResult {
  /** Functions in the corpus that could be copied (fragments within the size limits that parse alone). */
  candidates: number;
  /** Functions copied, by package. */
  selected: Record<string, number>;
  /** Median size of the copied functions, in tokens. */
  medianTokens: number;
  kinds: KindResult[];
  /** `${shingleSize}:${threshold}` → pairs among the unedited corpus's fragments. */
  corpusPairs: Record<string, number>;
  /** Per threshold, up to ten corpus pairs at the default shingle size (3, or the first size given). */
  corpusSamples: Record<string, CorpusPairSample[]>;
  /** Per threshold t, up to ten corpus pairs at or above t but below the next threshold given (default shingle size). */
  corpusBandSamples: Record<string, CorpusPairSample[]>;
  corpusFragments: number;
  seconds: { edit: number; analyze: number; join: number };
}

/** Size buckets of the by-size breakdown (tokens of the original). */
export const SIZE_BUCKETS: ReadonlyArray<[number, number]> = [[50, 99], [100, 199], [200, 399], [400, Infinity]];

interface Selected {
  file: CorpusFile;
  fragment: Fragment;
  snippet: Snippet | PySnippet;
}

interface Plant {
  function: number;
  kind: number;
  path: string;
  text: string;
  /** Where the copy starts in the plant's text (1-based line). */
  line: number;
}

function fragmentKey(path: string, f: Fragment): string {
  return `${path}:${f.startLine}:${f.startColumn}:${f.endLine}:${f.endColumn}`;
}

function extension(path: string): string {
  return /\.[^./]+$/.exec(path)?.[0] ?? '';
}

function encode(files: ReadonlyArray<{ path: string; text: string }>) {
  const encoder = new TextEncoder();
  return files.map((f) => ({ path: f.path, content: encoder.encode(f.text) }));
}

/**
 * Runs one measurement (one language). Deterministic for a seed: the same functions, edits and counts.
 *
 * @example
 * const result = await measureQuality({ language: 'js', files, kinds: ['layout', 'insert-1'], functions: 50,
 *   thresholds: [0.8], shingleSizes: [3], seed: 1 });
 * result.kinds[0].cells['3:0.8'].found; // copies found with their original at t = 0.8, k = 3
 */
export async function measureQuality(options: MeasureOptions): Promise<MeasureResult> {
  const minTokens = options.minTokens ?? 50;
  const maxTokens = options.maxTokens ?? 800;
  const thresholds = options.thresholds.map((t) => ({ value: t, parsed: parseThreshold(t) }));
  const lowest = thresholds.reduce((a, b) => (b.value < a.value ? b : a)).parsed;
  const defaultK = options.shingleSizes.includes(3) ? 3 : options.shingleSizes[0]!;
  const seconds = { edit: 0, analyze: 0, join: 0 };

  // 1. The corpus as the product sees it (fragments do not depend on the shingle size).
  let started = performance.now();
  const analyse = async (k: number, files: ReadonlyArray<{ path: string; text: string }>) => {
    if (files.length === 0) return [];
    const result = await analyzeFiles(encode(files), { shingleSize: k, minTokens, workers: options.workers, maxFileBytes: 16 * 1024 * 1024 });
    return result.files;
  };
  const first = await analyse(options.shingleSizes[0]!, options.files);
  seconds.analyze += (performance.now() - started) / 1000;

  // 2. Functions that can be copied, sampled with the seed, spread evenly over the packages.
  started = performance.now();
  const byPackage = new Map<string, Selected[]>();
  const starts = new Map<string, number[]>();
  const fileByPath = new Map(options.files.map((f) => [f.path, f]));
  let candidates = 0;
  for (const analysis of first) {
    const file = fileByPath.get(analysis.path);
    if (!file || analysis.error) continue;
    const lines = lineStarts(file.text);
    starts.set(file.path, lines);
    for (const fragment of analysis.fragments) {
      if (fragment.kind === 'lambda' || fragment.tokens > maxTokens) continue;
      const snippet = options.language === 'js' ? jsSnippet(file, lines, fragment) : pySnippet(file, lines, fragment);
      if (!snippet) continue;
      candidates++;
      const list = byPackage.get(file.source) ?? [];
      list.push({ file, fragment, snippet });
      byPackage.set(file.source, list);
    }
  }
  const rng = random(options.seed);
  const pools = [...byPackage.entries()].sort(([a], [b]) => a.localeCompare(b)).map(([source, list]) => {
    // Fisher–Yates with the seeded stream.
    for (let i = list.length - 1; i > 0; i--) {
      const j = Math.floor(rng() * (i + 1));
      [list[i], list[j]] = [list[j]!, list[i]!];
    }
    return { source, list };
  });
  const selected: Selected[] = [];
  const perPackage: Record<string, number> = {};
  // Round robin over the packages until enough functions (or every candidate) are taken.
  for (let round = 0; selected.length < options.functions; round++) {
    let took = false;
    for (const pool of pools) {
      if (selected.length >= options.functions) break;
      const item = pool.list[round];
      if (!item) continue;
      selected.push(item);
      perPackage[pool.source] = (perPackage[pool.source] ?? 0) + 1;
      took = true;
    }
    if (!took) break;
  }

  // 3. One copy per function and edit kind.
  const kinds: KindResult[] = options.kinds.map((kind) => ({
    kind, tried: 0, planted: 0, skipped: {}, failed: 0, belowMinimum: {}, cells: {}, bySize: {},
  }));
  const plants: Plant[] = [];
  for (let f = 0; f < selected.length; f++) {
    const { file, snippet } = selected[f]!;
    for (let k = 0; k < options.kinds.length; k++) {
      const result = kinds[k]!;
      result.tried++;
      // A stream per (function, kind): a copy does not depend on which other copies were made.
      const stream = random(mix(options.seed, k, f));
      let edited: EditResult;
      try {
        edited = options.language === 'js'
          ? applyJsEdit(options.kinds[k] as JsEditKind, snippet as Snippet, stream)
          : await applyPyEdit(options.kinds[k] as PyEditKind, snippet as PySnippet, stream);
      } catch {
        result.failed++;
        continue;
      }
      if ('skipped' in edited) {
        result.skipped[edited.skipped] = (result.skipped[edited.skipped] ?? 0) + 1;
        continue;
      }
      if (edited.text === snippet.text) {
        result.skipped['the edit changed nothing'] = (result.skipped['the edit changed nothing'] ?? 0) + 1;
        continue;
      }
      if (options.language === 'js') {
        try {
          parseStrict(edited.text, (snippet as Snippet).dialect);
        } catch {
          result.failed++;
          continue;
        }
      }
      plants.push({ function: f, kind: k, path: `plants/${f}-${options.kinds[k]}${extension(file.path)}`, text: edited.text, line: snippet.line });
    }
  }
  seconds.edit += (performance.now() - started) / 1000;

  // 4. Per shingle size: analyse corpus + copies, join copies against the corpus and the corpus with itself.
  const corpusPairs: Record<string, number> = {};
  const corpusSamples: Record<string, CorpusPairSample[]> = {};
  const corpusBandSamples: Record<string, CorpusPairSample[]> = {};
  let corpusFragments = 0;
  const failedPlants = new Set<number>();
  for (const k of options.shingleSizes) {
    started = performance.now();
    const corpusFiles = k === options.shingleSizes[0] ? first : await analyse(k, options.files);
    const plantFiles = await analyse(k, plants);
    seconds.analyze += (performance.now() - started) / 1000;
    started = performance.now();
    const corpus: Array<{ path: string; fragment: Fragment }> = [];
    const byKey = new Map<string, number>();
    for (const analysis of corpusFiles) {
      for (const fragment of analysis.fragments) {
        byKey.set(fragmentKey(analysis.path, fragment), corpus.length);
        corpus.push({ path: analysis.path, fragment });
      }
    }
    corpusFragments = corpus.length;
    const probe: Array<{ plant: Plant; original: number; fragment: Fragment }> = [];
    for (let i = 0; i < plants.length; i++) {
      const plant = plants[i]!;
      const analysis = plantFiles[i]!;
      if (analysis.path !== plant.path) throw new Error('analysis results out of order');
      const original = byKey.get(fragmentKey(selected[plant.function]!.file.path, selected[plant.function]!.fragment));
      if (original === undefined) throw new Error('an original function is missing from the corpus analysis');
      const result = kinds[plant.kind]!;
      if (k === options.shingleSizes[0]) {
        // A copy the analyzer cannot parse cleanly is an operator's failure, not a miss.
        if (analysis.error || analysis.syntaxErrors) {
          failedPlants.add(i);
          result.failed++;
        } else {
          result.planted++;
        }
      }
      if (failedPlants.has(i)) continue;
      // The copy is the outermost fragment that starts where the function starts.
      const fragment = analysis.fragments.filter((x) => x.startLine === plant.line).sort((a, b) => b.tokens - a.tokens)[0];
      if (!fragment) {
        result.belowMinimum[k] = (result.belowMinimum[k] ?? 0) + 1;
        continue;
      }
      probe.push({ plant, original, fragment });
    }
    const { ranked } = rankShingles([...corpus.map((c) => c.fragment.shingles), ...probe.map((p) => p.fragment.shingles)]);
    const corpusSets = ranked.slice(0, corpus.length);
    const probeSets = ranked.slice(corpus.length);

    const own = selfJoin(corpusSets, lowest);
    const corpusPairKeys = thresholds.map(() => new Set<number>());
    const sampleRng = random(options.seed + k);
    for (let t = 0; t < thresholds.length; t++) {
      const at = own.filter((p) => reaches(thresholds[t]!.parsed, corpusSets[p.a]!.length, corpusSets[p.b]!.length, p.overlap));
      corpusPairs[`${k}:${thresholds[t]!.value}`] = at.length;
      for (const p of at) corpusPairKeys[t]!.add(p.a * corpus.length + p.b);
      if (k === defaultK) {
        const label = (i: number) => `${corpus[i]!.path}:${corpus[i]!.fragment.startLine}-${corpus[i]!.fragment.endLine} ${corpus[i]!.fragment.name}`;
        const sample = (pairs: typeof own) => {
          const pool = [...pairs];
          const take: CorpusPairSample[] = [];
          while (take.length < 10 && pool.length > 0) {
            const p = pool.splice(Math.floor(sampleRng() * pool.length), 1)[0]!;
            take.push({ a: label(p.a), b: label(p.b), similarity: p.overlap / (corpusSets[p.a]!.length + corpusSets[p.b]!.length - p.overlap) });
          }
          return take;
        };
        corpusSamples[String(thresholds[t]!.value)] = sample(at);
        // What lowering the threshold to t from the next one up would add.
        const next = thresholds.filter((x) => x.value > thresholds[t]!.value).sort((a, b) => a.value - b.value)[0];
        if (next) {
          corpusBandSamples[String(thresholds[t]!.value)] = sample(
            at.filter((p) => !reaches(next.parsed, corpusSets[p.a]!.length, corpusSets[p.b]!.length, p.overlap)),
          );
        }
      }
    }
    const isCorpusPair = (t: number, x: number, y: number) => corpusPairKeys[t]!.has(Math.min(x, y) * corpus.length + Math.max(x, y));

    const cells = kinds.map(() => thresholds.map((): Cell => ({ found: 0, newPairs: 0, inheritedPairs: 0 })));
    for (const pair of joinAgainst(probeSets, corpusSets, lowest)) {
      const { plant, original } = probe[pair.a]!;
      for (let t = 0; t < thresholds.length; t++) {
        if (!reaches(thresholds[t]!.parsed, probeSets[pair.a]!.length, corpusSets[pair.b]!.length, pair.overlap)) continue;
        const cell = cells[plant.kind]![t]!;
        if (pair.b === original) {
          cell.found++;
          if (k === defaultK && thresholds[t]!.value === 0.8) bucketOf(kinds[plant.kind]!, selected[plant.function]!.fragment.tokens, 1);
        } else if (isCorpusPair(t, original, pair.b)) cell.inheritedPairs++;
        else cell.newPairs++;
      }
    }
    if (k === defaultK && thresholds.some((t) => t.value === 0.8)) {
      plants.forEach((plant, i) => !failedPlants.has(i) && bucketOf(kinds[plant.kind]!, selected[plant.function]!.fragment.tokens, 0));
    }
    kinds.forEach((kind, i) => thresholds.forEach((t, j) => (kind.cells[`${k}:${t.value}`] = cells[i]![j]!)));
    seconds.join += (performance.now() - started) / 1000;
  }

  const sizes = selected.map((s) => s.fragment.tokens).sort((a, b) => a - b);
  return {
    candidates,
    selected: perPackage,
    medianTokens: sizes.length > 0 ? sizes[Math.floor(sizes.length / 2)]! : 0,
    kinds,
    corpusPairs,
    corpusSamples,
    corpusBandSamples,
    corpusFragments,
    seconds,
  };
}

/** Adds a copy to its size bucket: `found` 1 adds a find, 0 adds a planted copy. */
function bucketOf(kind: KindResult, tokens: number, found: 0 | 1): void {
  const [lo, hi] = SIZE_BUCKETS.find(([l, h]) => tokens >= l && tokens <= h) ?? SIZE_BUCKETS[SIZE_BUCKETS.length - 1]!;
  const key = hi === Infinity ? `${lo}+` : `${lo}-${hi}`;
  const entry = kind.bySize[key] ?? [0, 0];
  if (found) entry[0]++;
  else entry[1]++;
  kind.bySize[key] = entry;
}
