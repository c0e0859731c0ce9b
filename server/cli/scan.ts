import { readFileSync } from 'node:fs';
import { writeFile } from 'node:fs/promises';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { analyzeFiles } from '../../analyzers';
import type { FileAnalysis, SourceFile } from '../../analyzers/types';
import { readFolder } from '../ingest/folder';
import { jaccard, newJoinStats, selfJoin } from '../matching/join';
import { rankShingles } from '../matching/order';
import { DEFAULT_REPOSITORY_SETTINGS as DEFAULTS } from '../../shared/constants';
import { thresholdValue } from '../matching/threshold';
import { buildReport, type ReportFragmentInput } from '../reports/build';
import { exceedsBudget, parseBudget } from '../reports/budget';
import { REPORT_FORMATS, writeReport, type ReportFormat } from '../reports/write';
import { elapsed, guarded, InputError, positiveIntegerOption, processIo, UsageError, type CommandIo } from './command';
import { thresholdOption } from './join';

const USAGE = `usage: doublet scan PATH... [--threshold T] [--min-tokens N] [--shingle K]
                   [--format ${REPORT_FORMATS.join('|')}] [--out FILE] [--budget R]

Analyses the folders in memory (no database), finds every pair of functions whose shingle sets
have Jaccard similarity ≥ T (default ${DEFAULTS.threshold}), groups them into clone classes and reports them.
  --min-tokens N  ignore functions with fewer than N tokens (default ${DEFAULTS.minTokens})
  --shingle K     shingle size (default ${DEFAULTS.shingleSize})
  --format F      text (default), json, csv or sarif
  --out FILE      write the report to FILE instead of stdout
  --budget R      exit 1 when the clone ratio is above R (0.05 or 5%)
With one PATH, file paths in the report are relative to it; with several, each starts with the
folder's name.
`;

/** A progress line is drawn in a terminal, or printed once a run has taken this long. */
const QUIET_MS = 2000;

/**
 * Progress on stderr: redrawn in place on a terminal; elsewhere (CI logs) a plain line per phase,
 * but only once the run has lasted a couple of seconds, so short runs stay silent.
 */
class Progress {
  private drawn = false;
  private timer: NodeJS.Timeout | undefined;
  private phase = '';
  private phaseStart = 0;

  constructor(
    private readonly io: CommandIo,
    private readonly start: number,
  ) {}

  step(phase: string): void {
    this.phase = phase;
    this.phaseStart = performance.now();
    if (this.io.errIsTTY) {
      this.draw();
      clearInterval(this.timer);
      this.timer = setInterval(() => this.draw(), 500);
      this.timer.unref();
    } else if (performance.now() - this.start > QUIET_MS) {
      this.io.err(`${phase}…\n`);
    }
  }

  private draw(): void {
    const seconds = ((performance.now() - this.phaseStart) / 1000).toFixed(0);
    this.io.err(`\r${this.phase}… ${seconds} s\x1b[K`);
    this.drawn = true;
  }

  done(): void {
    clearInterval(this.timer);
    if (this.drawn) this.io.err('\r\x1b[K');
  }
}

/** Labels for several roots: each folder's base name, made unique with ~2, ~3… when two repeat. */
function rootLabels(roots: string[]): string[] {
  if (roots.length === 1) return [''];
  const seen = new Map<string, number>();
  return roots.map((root) => {
    const base = path.basename(path.resolve(root)) || 'root';
    const n = (seen.get(base) ?? 0) + 1;
    seen.set(base, n);
    return n === 1 ? base : `${base}~${n}`;
  });
}

function toolVersion(): string | undefined {
  try {
    const pkg = JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')) as { version?: string };
    return pkg.version;
  } catch {
    return undefined;
  }
}

/** `doublet scan`: see USAGE. */
export async function run(args: string[], io: CommandIo = processIo()): Promise<number> {
  return guarded(io, USAGE, async () => {
    const { values, positionals } = parseArgs({
      args,
      allowPositionals: true,
      strict: true,
      options: {
        threshold: { type: 'string', short: 't' },
        'min-tokens': { type: 'string' },
        shingle: { type: 'string' },
        format: { type: 'string', short: 'f' },
        out: { type: 'string', short: 'o' },
        budget: { type: 'string' },
        help: { type: 'boolean', short: 'h' },
      },
    });
    if (values.help) {
      io.out(USAGE);
      return 0;
    }
    if (positionals.length === 0) throw new UsageError('give at least one folder to scan');
    const t = thresholdOption(values.threshold);
    const minTokens = positiveIntegerOption(values['min-tokens'], '--min-tokens') ?? DEFAULTS.minTokens;
    const shingleSize = positiveIntegerOption(values.shingle, '--shingle') ?? DEFAULTS.shingleSize;
    const format = (values.format ?? 'text') as ReportFormat;
    if (!REPORT_FORMATS.includes(format)) throw new UsageError(`--format must be one of ${REPORT_FORMATS.join(', ')} (got "${values.format}")`);
    let budget;
    try {
      budget = values.budget === undefined ? undefined : parseBudget(values.budget);
    } catch (error) {
      throw new UsageError(`--budget: ${(error as Error).message}`);
    }

    const start = performance.now();
    const progress = new Progress(io, start);
    try {
      // Read every folder first (bad paths fail before any analysis starts).
      progress.step('reading folders');
      const labels = rootLabels(positionals);
      const files: SourceFile[] = [];
      let skipped = 0;
      for (const [r, root] of positionals.entries()) {
        let read;
        try {
          read = await readFolder(root);
        } catch (error) {
          throw new InputError(`cannot scan ${root}: ${(error as Error).message}`);
        }
        skipped += read.skipped.length;
        for (const file of read.files) files.push({ path: labels[r] ? `${labels[r]}/${file.path}` : file.path, content: file.content });
      }

      progress.step(`analysing ${files.length.toLocaleString('en-US')} files`);
      const analyzed = await analyzeFiles(files, { minTokens, shingleSize });
      skipped += analyzed.skipped.length;
      const failed = analyzed.files.filter((f: FileAnalysis) => f.error !== undefined).length;
      const fragments: ReportFragmentInput[] = [];
      const shingleSets: string[][] = [];
      for (const file of analyzed.files) {
        for (const fragment of file.fragments) {
          fragments.push({
            file: file.path,
            name: fragment.name,
            startLine: fragment.startLine,
            endLine: fragment.endLine,
            tokens: fragment.tokens,
            tokenStart: fragment.tokenStart,
            tokenEnd: fragment.tokenEnd,
            rawHash: fragment.rawHash,
            normalizedHash: fragment.normalizedHash,
          });
          shingleSets.push(fragment.shingles);
        }
      }

      progress.step(`joining ${fragments.length.toLocaleString('en-US')} fragments`);
      const { ranked } = rankShingles(shingleSets);
      const stats = newJoinStats();
      const pairs = selfJoin(ranked, t, { stats }).map(({ a, b, overlap }) => ({
        a,
        b,
        similarity: jaccard(overlap, ranked[a].length, ranked[b].length),
      }));

      const report = buildReport({
        settings: { threshold: thresholdValue(t), minTokens, shingleSize, roots: positionals },
        fragments,
        pairs,
        files: { analyzed: analyzed.files.length, skipped, failed },
        join: { candidates: stats.candidates, verified: stats.verified },
        durationMs: performance.now() - start,
      });
      progress.done();
      const text = writeReport(report, format, { toolVersion: toolVersion() });
      if (values.out) await writeFile(values.out, text);
      else io.out(text);

      const ratio = `${(report.stats.cloneRatio * 100).toFixed(1)}%`;
      if (values.out || format !== 'text') {
        io.err(`${report.stats.fragmentCount} fragments, ${report.stats.pairCount} clone pairs, ${report.stats.classCount} clone classes, clone ratio ${ratio} (${elapsed(start)} ms)\n`);
      }
      if (budget && exceedsBudget(report.stats, budget)) {
        io.err(`clone ratio ${ratio} is above the budget ${budget.text}\n`);
        return 1;
      }
      return 0;
    } finally {
      progress.done();
    }
  });
}
