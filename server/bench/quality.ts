/**
 * `npm run bench:quality`: how well Doublet finds copied-and-edited functions in real code.
 * Real functions from published packages under node_modules (and Python from the CPython
 * standard library that Debian installs) are copied with one kind of edit each, planted beside
 * the unedited corpus in memory, analysed and joined with the product's own code; the output is
 * recall per edit kind × threshold × shingle size, the other pairs the copies bring in, and the
 * pairs the unedited corpus already holds (with a sample to read). Markdown tables, so they can
 * go into the README as printed. Prints figures; asserts nothing.
 *
 * Options: --functions N (JavaScript/TypeScript functions, default 200), --python-functions N
 * (default 60), --seed S (default 20261202), --workers N.
 */
import os from 'node:os';
import { parseArgs } from 'node:util';
import { JS_PACKAGES, loadPackages, loadPythonStdlib, type CorpusSource } from './quality/corpus';
import { JS_EDIT_DESCRIPTIONS, JS_EDIT_KINDS } from './quality/js-edits';
import { measureQuality, SIZE_BUCKETS, type MeasureResult } from './quality/measure';
import { PY_EDIT_KINDS } from './quality/python-edits';

const THRESHOLDS = [0.6, 0.7, 0.8, 0.9];
const SHINGLE_SIZES = [2, 3, 4, 5];

const load = () => os.loadavg().map((l) => l.toFixed(2)).join(', ');
const percent = (found: number, planted: number) => (planted === 0 ? '–' : `${((100 * found) / planted).toFixed(1)} %`);

function describeSources(sources: readonly CorpusSource[]): string {
  return sources.map((s) => `${s.name}@${s.version} (${s.files} files, ${(s.bytes / 1e6).toFixed(2)} MB)`).join(', ');
}

function printResult(title: string, result: MeasureResult): void {
  console.log(`\n## ${title}\n`);
  console.log(
    `${result.corpusFragments} fragments in the corpus; ${result.candidates} functions of 50–800 tokens could be copied; ` +
      `copied: ${Object.entries(result.selected).map(([s, n]) => `${n} from ${s}`).join(', ')}; median size ${result.medianTokens} tokens.`,
  );
  const planted = result.kinds.reduce((sum, k) => sum + k.planted, 0);
  const failed = result.kinds.reduce((sum, k) => sum + k.failed, 0);
  console.log(`${planted} copies planted, ${failed} edits failed to parse.`);
  console.log(`time: edits ${result.seconds.edit.toFixed(1)} s, analysis ${result.seconds.analyze.toFixed(1)} s, joins ${result.seconds.join.toFixed(1)} s\n`);

  console.log('| edit | tried | planted | skipped (main reason) |');
  console.log('| --- | ---: | ---: | --- |');
  for (const k of result.kinds) {
    const skipped = Object.values(k.skipped).reduce((a, b) => a + b, 0);
    const main = Object.entries(k.skipped).sort((a, b) => b[1] - a[1])[0];
    console.log(`| ${k.kind} | ${k.tried} | ${k.planted} | ${skipped}${main ? ` (${main[0]})` : ''}${k.failed ? `; ${k.failed} failed` : ''} |`);
  }

  for (const size of SHINGLE_SIZES) {
    if (!result.kinds[0]?.cells[`${size}:${THRESHOLDS[0]}`]) continue;
    console.log(`\nShingle size ${size}: recall (copy paired with its original) · new other pairs (inherited in brackets)\n`);
    console.log(`| edit | ${THRESHOLDS.map((t) => `t = ${t}`).join(' | ')} | below 50 tokens |`);
    console.log(`| --- | ${THRESHOLDS.map(() => '---:').join(' | ')} | ---: |`);
    for (const k of result.kinds) {
      const cells = THRESHOLDS.map((t) => {
        const c = k.cells[`${size}:${t}`]!;
        return `${percent(c.found, k.planted)} · ${c.newPairs} (${c.inheritedPairs})`;
      });
      console.log(`| ${k.kind} | ${cells.join(' | ')} | ${k.belowMinimum[size] ?? 0} |`);
    }
  }

  console.log('\nRecall at t = 0.8 (the default before 0.7), shingle size 3, by the size of the original function, in tokens:\n');
  const buckets = SIZE_BUCKETS.map(([lo, hi]) => (hi === Infinity ? `${lo}+` : `${lo}-${hi}`));
  console.log(`| edit | ${buckets.join(' | ')} |`);
  console.log(`| --- | ${buckets.map(() => '---:').join(' | ')} |`);
  for (const k of result.kinds) {
    console.log(`| ${k.kind} | ${buckets.map((b) => (k.bySize[b] ? `${percent(k.bySize[b]![0], k.bySize[b]![1])} of ${k.bySize[b]![1]}` : '–')).join(' | ')} |`);
  }

  console.log('\nPairs the unedited corpus already holds:\n');
  console.log(`| shingle size | ${THRESHOLDS.map((t) => `t = ${t}`).join(' | ')} |`);
  console.log(`| ---: | ${THRESHOLDS.map(() => '---:').join(' | ')} |`);
  for (const size of SHINGLE_SIZES) {
    if (result.corpusPairs[`${size}:${THRESHOLDS[0]}`] === undefined) continue;
    console.log(`| ${size} | ${THRESHOLDS.map((t) => result.corpusPairs[`${size}:${t}`]).join(' | ')} |`);
  }
  for (const t of THRESHOLDS) {
    const sample = result.corpusSamples[String(t)] ?? [];
    console.log(`\nA sample of ten corpus pairs at t = ${t} (shingle size 3), to read:`);
    for (const p of sample) console.log(`  ${p.similarity.toFixed(3)}  ${p.a}  ↔  ${p.b}`);
    const band = result.corpusBandSamples[String(t)];
    if (band) {
      console.log(`…and ten of those below the next threshold up (what lowering the threshold to ${t} would add):`);
      for (const p of band) console.log(`  ${p.similarity.toFixed(3)}  ${p.a}  ↔  ${p.b}`);
    }
  }
}

async function main() {
  const { values } = parseArgs({
    options: {
      functions: { type: 'string', default: '200' },
      'python-functions': { type: 'string', default: '60' },
      seed: { type: 'string', default: '20261202' },
      workers: { type: 'string' },
    },
  });
  const functions = Number(values.functions);
  const pythonFunctions = Number(values['python-functions']);
  const seed = Number(values.seed);
  const workers = values.workers === undefined ? undefined : Number(values.workers);
  for (const [name, value] of [['--functions', functions], ['--python-functions', pythonFunctions], ['--seed', seed]] as const) {
    if (!Number.isInteger(value) || value < 0) throw new Error(`${name} must be a non-negative integer`);
  }
  const started = performance.now();
  console.log(`# npm run bench:quality -- --functions ${functions} --python-functions ${pythonFunctions} --seed ${seed}`);
  console.log(`load average before: ${load()} on ${os.availableParallelism()} cores; Node ${process.version}`);
  console.log('analyzer defaults kept: min tokens 50, identifiers and literals normalised, TypeScript types dropped');
  console.log('\nEdit kinds (JavaScript/TypeScript):');
  for (const kind of JS_EDIT_KINDS) console.log(`  ${kind}: ${JS_EDIT_DESCRIPTIONS[kind]}`);

  const js = loadPackages(JS_PACKAGES);
  console.log(`\nJavaScript/TypeScript corpus: ${describeSources(js.sources)}`);
  const jsResult = await measureQuality({
    language: 'js', files: js.files, kinds: JS_EDIT_KINDS, functions, thresholds: THRESHOLDS, shingleSizes: SHINGLE_SIZES, seed, workers,
  });
  printResult('JavaScript and TypeScript', jsResult);

  const python = loadPythonStdlib();
  if ('missing' in python) {
    console.log(`\nPython: skipped, ${python.missing}. No package under node_modules ships Python sources.`);
  } else {
    console.log(`\nPython corpus (no package under node_modules ships .py files): ${describeSources(python.sources)}`);
    const pyResult = await measureQuality({
      language: 'python', files: python.files, kinds: PY_EDIT_KINDS, functions: pythonFunctions, thresholds: THRESHOLDS,
      shingleSizes: SHINGLE_SIZES, seed, workers,
    });
    printResult('Python', pyResult);
  }
  console.log(`\nelapsed ${((performance.now() - started) / 1000).toFixed(1)} s; load average after: ${load()}`);
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : String(error));
  process.exitCode = 1;
});
