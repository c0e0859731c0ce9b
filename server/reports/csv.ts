import type { CloneReport } from '../../shared/api/clone-report';
import { fragmentIndex } from './format';

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
export function writeCsv(report: CloneReport): string {
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
