import type { CloneReport } from '../../shared/api/clone-report';
import { fragmentIndex, percent, similarityRange } from './format';

/** A summary for a terminal: totals, then every clone class, largest first. */
export function writeText(report: CloneReport): string {
  const { settings, stats } = report;
  const n = (value: number) => value.toLocaleString('en-US');
  const where = settings.roots?.join(', ') ?? [settings.repository, settings.snapshot].filter(Boolean).join(' @ ');
  const lines: string[] = [];
  lines.push(`Clone report${where ? ` for ${where}` : ''} (threshold ${settings.threshold}, shingle size ${settings.shingleSize}, min tokens ${settings.minTokens})`);
  lines.push(
    `  ${n(stats.files)} files analysed, ${n(stats.skippedFiles)} skipped, ${n(stats.failedFiles)} failed; ` +
      `${n(stats.fragmentCount)} fragments, ${n(stats.fragmentTokens)} tokens`,
  );
  lines.push(
    `  clone ratio ${percent(stats.cloneRatio)}: ${n(stats.clonedTokens)} tokens in ${n(stats.pairCount)} clone pairs, ` +
      `${n(stats.classCount)} clone classes`,
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
