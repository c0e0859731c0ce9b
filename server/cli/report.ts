import type { ReportClass, ReportFragment, ReportPair, ScanReport, ScanSettings } from '../../shared/api/scan-report';
import { cloneClasses, clonedTokens, cloneType } from '../matching/classes';

/**
 * The clone report: built once from fragments and clone pairs (by `doublet scan` from folders in
 * memory, by `doublet classes` from the database), then written as text, JSON, CSV or SARIF.
 * Pure functions: the caller decides where the text goes. Source text never enters a report,
 * only paths, names, lines and counts.
 */

/** A fragment as the report needs it; `id` defaults to its index in the input. */
export interface ReportFragmentInput {
  id?: number;
  /** Relative to the folder scanned, with `/`. */
  file: string;
  name: string;
  startLine: number;
  endLine: number;
  tokens: number;
  /** The fragment's token range in its file (Fragment.tokenStart/tokenEnd): the clone ratio counts each token once. */
  tokenStart: number;
  tokenEnd: number;
  rawHash: string;
  normalizedHash: string;
}

/** A clone pair by INDEX into the fragments array, with its Jaccard similarity. */
export interface ReportPairInput {
  a: number;
  b: number;
  similarity: number;
}

/** Everything buildReport needs. */
export interface BuildReportInput {
  settings: ScanSettings;
  fragments: readonly ReportFragmentInput[];
  pairs: readonly ReportPairInput[];
  /** File counts: analysed (parsed or failed), skipped, failed. */
  files?: { analysed: number; skipped: number; failed: number };
  /** Join counters, when the join ran here. */
  join?: { candidates: number; verified: number };
  durationMs?: number;
}

/**
 * Builds the report: clone types from the hashes, clone classes (connected components, largest
 * first, ids 1, 2, … in that order) with their similarity range, and the clone ratio.
 *
 * @example
 * buildReport({ settings: { threshold: 0.8, minTokens: 50, shingleSize: 3 }, fragments, pairs: [{ a: 0, b: 2, similarity: 0.9 }] })
 * // { stats: { pairs: 1, classes: 1, … }, classes: [{ id: 1, members: [0, 2], minSimilarity: 0.9, maxSimilarity: 0.9 }], … }
 * @throws when a pair names a fragment outside the list or fragment ids repeat
 */
export function buildReport(input: BuildReportInput): ScanReport {
  const { settings, fragments: inputs, pairs: inputPairs } = input;
  const ids = inputs.map((fragment, index) => fragment.id ?? index);
  if (new Set(ids).size !== ids.length) throw new Error('buildReport: fragment ids must be unique');
  const fragments: ReportFragment[] = inputs.map((f, index) => ({
    id: ids[index],
    file: f.file,
    name: f.name,
    startLine: f.startLine,
    endLine: f.endLine,
    tokens: f.tokens,
  }));

  const classesByIndex = cloneClasses(inputs.length, inputPairs);
  const classOf = new Int32Array(inputs.length).fill(-1);
  classesByIndex.forEach((members, c) => {
    for (const m of members) classOf[m] = c;
  });
  const low = new Array<number>(classesByIndex.length).fill(Infinity);
  const high = new Array<number>(classesByIndex.length).fill(-Infinity);
  const pairs: ReportPair[] = [];
  for (const { a, b, similarity } of inputPairs) {
    if (a === b) continue;
    const c = classOf[a];
    low[c] = Math.min(low[c], similarity);
    high[c] = Math.max(high[c], similarity);
    const [x, y] = ids[a] < ids[b] ? [a, b] : [b, a];
    pairs.push({ a: ids[x], b: ids[y], similarity, type: cloneType(inputs[x], inputs[y]) });
  }
  pairs.sort((p, q) => p.a - q.a || p.b - q.b);
  const classes: ReportClass[] = classesByIndex.map((members, c) => ({
    id: c + 1,
    members: members.map((m) => ids[m]).sort((x, y) => x - y),
    minSimilarity: low[c],
    maxSimilarity: high[c],
  }));

  const { cloned, total } = clonedTokens(
    inputs,
    inputPairs.filter(({ a, b }) => a !== b),
  );
  return {
    settings,
    stats: {
      files: input.files?.analysed ?? new Set(inputs.map((f) => f.file)).size,
      skippedFiles: input.files?.skipped ?? 0,
      failedFiles: input.files?.failed ?? 0,
      fragments: fragments.length,
      tokens: total,
      clonedTokens: cloned,
      cloneRatio: total === 0 ? 0 : cloned / total,
      pairs: pairs.length,
      classes: classes.length,
      ...(input.join ? { candidates: input.join.candidates, verified: input.join.verified } : {}),
      ...(input.durationMs !== undefined ? { durationMs: Math.round(input.durationMs) } : {}),
    },
    fragments,
    pairs,
    classes,
  };
}

/** A clone budget as an exact fraction: "0.05" → 5/100. */
export interface CloneBudget {
  numerator: number;
  denominator: number;
  text: string;
}

/**
 * Parses a clone budget: a decimal in [0, 1] with at most six decimals ("0.05"), or a percentage
 * ("5%"). Kept exact so that a ratio right at the budget passes.
 *
 * @example parseBudget('5%') // { numerator: 5, denominator: 100, text: '5%' }
 * @throws when the text is not such a number
 */
export function parseBudget(text: string): CloneBudget {
  const match = /^(\d+)(?:\.(\d{1,6}))?(%?)$/.exec(text.trim());
  if (!match) throw new Error(`budget "${text}" is not a ratio in [0, 1] (like 0.05) or a percentage (like 5%)`);
  const decimals = match[2] ?? '';
  let denominator = 10 ** decimals.length;
  const numerator = Number(match[1]) * denominator + Number(decimals || '0');
  if (match[3] === '%') denominator *= 100;
  if (numerator > denominator) throw new Error(`budget "${text}" is above 100%`);
  return { numerator, denominator, text: text.trim() };
}

/** Whether the report's clone ratio is above the budget (compared in integers: at the budget passes). */
export function overBudget(report: ScanReport, budget: CloneBudget): boolean {
  return report.stats.clonedTokens * budget.denominator > budget.numerator * report.stats.tokens;
}

/** Output formats of every report writer. */
export const REPORT_FORMATS = ['text', 'json', 'csv', 'sarif'] as const;
export type ReportFormat = (typeof REPORT_FORMATS)[number];

/** Options of writeReport. */
export interface WriteReportOptions {
  /** Version shown in SARIF's tool.driver. */
  toolVersion?: string;
}

/**
 * The report in one of the formats, as text ending with a newline.
 *
 * @example process.stdout.write(writeReport(report, 'sarif', { toolVersion: '0.1.0' }))
 */
export function writeReport(report: ScanReport, format: ReportFormat, options: WriteReportOptions = {}): string {
  switch (format) {
    case 'text':
      return writeText(report);
    case 'json':
      return `${JSON.stringify(report, null, 2)}\n`;
    case 'csv':
      return writeCsv(report);
    case 'sarif':
      return `${JSON.stringify(toSarif(report, options), null, 2)}\n`;
  }
}

function percent(ratio: number): string {
  return `${(ratio * 100).toFixed(1)}%`;
}

function similarityRange(c: ReportClass): string {
  return c.minSimilarity === c.maxSimilarity ? c.minSimilarity.toFixed(2) : `${c.minSimilarity.toFixed(2)}–${c.maxSimilarity.toFixed(2)}`;
}

function fragmentIndex(report: ScanReport): Map<number, ReportFragment> {
  return new Map(report.fragments.map((f) => [f.id, f]));
}

/** A summary for a terminal: totals, then every clone class, largest first. */
export function writeText(report: ScanReport): string {
  const { settings, stats } = report;
  const n = (value: number) => value.toLocaleString('en-US');
  const where = settings.roots?.join(', ') ?? [settings.repository, settings.snapshot].filter(Boolean).join(' @ ');
  const lines: string[] = [];
  lines.push(`Clone report${where ? ` for ${where}` : ''} (threshold ${settings.threshold}, shingle size ${settings.shingleSize}, min tokens ${settings.minTokens})`);
  lines.push(
    `  ${n(stats.files)} files analysed, ${n(stats.skippedFiles)} skipped, ${n(stats.failedFiles)} failed; ` +
      `${n(stats.fragments)} fragments, ${n(stats.tokens)} tokens`,
  );
  lines.push(
    `  clone ratio ${percent(stats.cloneRatio)}: ${n(stats.clonedTokens)} tokens in ${n(stats.pairs)} clone pairs, ` +
      `${n(stats.classes)} clone classes`,
  );
  const byId = fragmentIndex(report);
  const typesOf = new Map<number, Set<number>>();
  for (const pair of report.pairs) {
    for (const id of [pair.a, pair.b]) {
      if (!typesOf.has(id)) typesOf.set(id, new Set());
      typesOf.get(id)!.add(pair.type);
    }
  }
  for (const c of report.classes) {
    lines.push('');
    const types = new Set(c.members.flatMap((id) => [...(typesOf.get(id) ?? [])]));
    lines.push(`Clone class ${c.id}: ${c.members.length} fragments, similarity ${similarityRange(c)}, type ${[...types].sort().join('/')}`);
    for (const id of c.members) {
      const f = byId.get(id)!;
      lines.push(`  ${f.file}:${f.startLine}-${f.endLine}  ${f.name}  (${n(f.tokens)} tokens)`);
    }
  }
  if (report.classes.length === 0) lines.push('', 'No clone pairs at this threshold.');
  return `${lines.join('\n')}\n`;
}

/**
 * One CSV field. Quoted when it holds a comma, quote or line break; a leading = + - @ gets a
 * quote mark first so that a spreadsheet does not run it as a formula.
 */
function csvField(value: string | number): string {
  let text = String(value);
  if (typeof value === 'string' && /^[=+\-@\t\r]/.test(text)) text = `'${text}`;
  return /[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

/** One row per clone pair, grouped by clone class (largest first). */
export function writeCsv(report: ScanReport): string {
  const byId = fragmentIndex(report);
  const classOf = new Map<number, number>();
  for (const c of report.classes) for (const id of c.members) classOf.set(id, c.id);
  const rows = [
    ['class', 'similarity', 'type', 'file_a', 'name_a', 'start_line_a', 'end_line_a', 'file_b', 'name_b', 'start_line_b', 'end_line_b'].join(','),
  ];
  const order = new Map(report.classes.map((c, i) => [c.id, i]));
  const pairs = [...report.pairs].sort((p, q) => order.get(classOf.get(p.a)!)! - order.get(classOf.get(q.a)!)! || p.a - q.a || p.b - q.b);
  for (const pair of pairs) {
    const a = byId.get(pair.a)!;
    const b = byId.get(pair.b)!;
    rows.push(
      [classOf.get(pair.a)!, Number(pair.similarity.toFixed(6)), pair.type, a.file, a.name, a.startLine, a.endLine, b.file, b.name, b.startLine, b.endLine]
        .map(csvField)
        .join(','),
    );
  }
  return `${rows.join('\r\n')}\r\n`;
}

/** SARIF 2.1.0 identifiers (from the OASIS standard). */
export const SARIF_VERSION = '2.1.0';
export const SARIF_SCHEMA = 'https://docs.oasis-open.org/sarif/sarif/v2.1.0/errata01/os/schemas/sarif-schema-2.1.0.json';
/** The one rule every result belongs to. */
export const CLONE_RULE_ID = 'clone-class-member';

function physicalLocation(f: ReportFragment) {
  return {
    artifactLocation: { uri: f.file.split('/').map(encodeURIComponent).join('/'), uriBaseId: 'SRCROOT' },
    region: { startLine: f.startLine, endLine: f.endLine },
  };
}

/**
 * The report as a SARIF 2.1.0 log: one result per clone class member, located at the member,
 * with its clone pair partners as relatedLocations.
 */
export function toSarif(report: ScanReport, options: WriteReportOptions = {}) {
  const byId = fragmentIndex(report);
  const partners = new Map<number, { id: number; similarity: number; type: number }[]>();
  for (const pair of report.pairs) {
    for (const [self, other] of [[pair.a, pair.b], [pair.b, pair.a]]) {
      if (!partners.has(self)) partners.set(self, []);
      partners.get(self)!.push({ id: other, similarity: pair.similarity, type: pair.type });
    }
  }
  const results = report.classes.flatMap((c) =>
    c.members.map((id) => {
      const f = byId.get(id)!;
      const mine = partners.get(id) ?? [];
      return {
        ruleId: CLONE_RULE_ID,
        ruleIndex: 0,
        level: 'warning' as const,
        message: {
          text:
            `${f.name} is one of ${c.members.length} fragments in clone class ${c.id} ` +
            `(similarity ${similarityRange(c)}); it is similar to ${mine.length} of them at or above ${report.settings.threshold}.`,
        },
        locations: [{ physicalLocation: physicalLocation(f) }],
        relatedLocations: mine.map((partner, index) => {
          const other = byId.get(partner.id)!;
          return {
            id: index + 1,
            physicalLocation: physicalLocation(other),
            message: { text: `${other.name}: similarity ${partner.similarity.toFixed(2)}, clone type ${partner.type}` },
          };
        }),
        properties: { cloneClass: c.id, tokens: f.tokens },
      };
    }),
  );
  return {
    $schema: SARIF_SCHEMA,
    version: SARIF_VERSION,
    runs: [
      {
        tool: {
          driver: {
            name: 'doublet',
            ...(options.toolVersion ? { version: options.toolVersion } : {}),
            rules: [
              {
                id: CLONE_RULE_ID,
                name: 'CloneClassMember',
                shortDescription: { text: 'Function has near copies elsewhere' },
                fullDescription: {
                  text: 'This function belongs to a clone class: its token shingle set has a Jaccard similarity at or above the threshold with at least one other function. A fix made in one copy is likely needed in the others.',
                },
                defaultConfiguration: { level: 'warning' },
              },
            ],
          },
        },
        columnKind: 'unicodeCodePoints',
        results,
        properties: { cloneRatio: report.stats.cloneRatio, cloneClasses: report.stats.classes, clonePairs: report.stats.pairs },
      },
    ],
  };
}
