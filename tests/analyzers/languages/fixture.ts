import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { analyzeFile } from '../../../analyzers';
import type { FileAnalysis } from '../../../analyzers/types';

const dir = path.join(path.dirname(fileURLToPath(import.meta.url)), '../../fixtures/analyzers');

/** Reads an invented fixture file (tests/fixtures/analyzers/<name>). */
export function readFixture(name: string): string {
  return fs.readFileSync(path.join(dir, name), 'utf8');
}

/** Analyses a fixture with every fragment kept (minTokens 1); `as` is the path the analyzer sees. */
export function analyzeFixture(name: string, as = name): Promise<FileAnalysis> {
  return analyzeFile(as, readFixture(name), { minTokens: 1 });
}

/** [name, kind, startLine, startColumn, endLine, endColumn] of every fragment, in order. */
export function outline(result: FileAnalysis): Array<[string, string, number, number, number, number]> {
  return result.fragments.map((f) => [f.name, f.kind, f.startLine, f.startColumn, f.endLine, f.endColumn]);
}
