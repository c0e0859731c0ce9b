/**
 * The quality benchmark's real code: JavaScript and TypeScript from published packages under
 * node_modules, and Python from the CPython standard library that Debian's libpython3 package
 * installs (no npm package ships Python sources). Also how one function is cut out of its file
 * so that it parses alone.
 */
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import type { Fragment } from '../../../analyzers';
import { dialectForPath, findFunction, parseStrict, type Snippet } from './syntax';
import type { PySnippet } from './python-edits';

const requireFromHere = createRequire(import.meta.url);

/** A source file of the corpus, keyed by `package/relative/path`. */
export interface CorpusFile {
  path: string;
  text: string;
  /** `name@version` of the package it came from. */
  source: string;
}

/** Where a corpus came from: package name, version and size. */
export interface CorpusSource {
  name: string;
  version: string;
  files: number;
  bytes: number;
}

/** Which files of a package are read. */
export interface PackageSpec {
  pkg: string;
  /** Folders (relative to the package root) walked for sources. */
  dirs: string[];
  /** File suffixes taken; declaration files and tests are left out. */
  suffixes: string[];
}

/** The JavaScript/TypeScript packages of `npm run bench:quality` and `npm run bench:analyze`. */
export const JS_PACKAGES: PackageSpec[] = [
  { pkg: 'react-dom', dirs: ['cjs'], suffixes: ['.development.js'] },
  { pkg: '@babel/parser', dirs: ['lib'], suffixes: ['index.js'] },
  { pkg: 'sequelize', dirs: ['lib'], suffixes: ['.js'] },
  { pkg: 'express', dirs: ['lib'], suffixes: ['.js'] },
  { pkg: 'zod', dirs: ['src'], suffixes: ['.ts'] },
];

function walk(dir: string, out: string[]): void {
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) walk(full, out);
    else if (entry.isFile()) out.push(full);
  }
}

/** Reads the packages' sources from node_modules, with each package's version. */
export function loadPackages(specs: readonly PackageSpec[]): { files: CorpusFile[]; sources: CorpusSource[] } {
  const files: CorpusFile[] = [];
  const sources: CorpusSource[] = [];
  for (const spec of specs) {
    const manifest = requireFromHere.resolve(`${spec.pkg}/package.json`);
    const root = path.dirname(manifest);
    const version = (JSON.parse(fs.readFileSync(manifest, 'utf8')) as { version: string }).version;
    const found: string[] = [];
    for (const dir of spec.dirs) walk(path.join(root, dir), found);
    const picked = found
      .filter((f) => spec.suffixes.some((s) => f.endsWith(s)) && !/\.d\.[cm]?ts$/.test(f) && !/[/\\](tests?|__tests__)[/\\]/.test(f))
      .sort();
    let bytes = 0;
    for (const file of picked) {
      const text = fs.readFileSync(file, 'utf8');
      bytes += Buffer.byteLength(text);
      files.push({ path: `${spec.pkg}/${path.relative(root, file).split(path.sep).join('/')}`, text, source: `${spec.pkg}@${version}` });
    }
    sources.push({ name: spec.pkg, version, files: picked.length, bytes });
  }
  return { files, sources };
}

/** Modules of the CPython standard library read for the Python part: plain code, no tests. */
export const PYTHON_MODULES = [
  'argparse.py', 'difflib.py', 'textwrap.py', 'configparser.py', 'csv.py', 'calendar.py', 'pprint.py', 'shlex.py',
  'fractions.py', 'statistics.py', 'heapq.py', 'smtplib.py', 'ftplib.py', 'tarfile.py', 'zipfile.py', 'gettext.py',
  'json', 'email', 'http', 'logging',
];

/**
 * The Python corpus: CPython's standard library as Debian's libpython3.X-stdlib installs it under
 * /usr/lib/python3.X. Returns the reason instead when it is not installed.
 */
export function loadPythonStdlib(root = '/usr/lib'): { files: CorpusFile[]; sources: CorpusSource[] } | { missing: string } {
  let dir: string | undefined;
  try {
    dir = fs.readdirSync(root).filter((d) => /^python3\.\d+$/.test(d)).sort((a, b) => Number(b.slice(8)) - Number(a.slice(8)))[0];
  } catch {
    dir = undefined;
  }
  if (!dir) return { missing: `no CPython standard library under ${root} (Debian package libpython3-stdlib)` };
  const base = path.join(root, dir);
  const version = debianVersion(`lib${dir}-stdlib`) ?? dir.slice(6);
  const files: CorpusFile[] = [];
  let bytes = 0;
  for (const name of PYTHON_MODULES) {
    const full = path.join(base, name);
    if (!fs.existsSync(full)) continue;
    const found: string[] = [];
    if (fs.statSync(full).isDirectory()) walk(full, found);
    else found.push(full);
    for (const file of found.filter((f) => f.endsWith('.py') && !/[/\\]tests?[/\\]/.test(f)).sort()) {
      const text = fs.readFileSync(file, 'utf8');
      bytes += Buffer.byteLength(text);
      files.push({ path: `${dir}/${path.relative(base, file).split(path.sep).join('/')}`, text, source: `lib${dir}-stdlib ${version}` });
    }
  }
  if (files.length === 0) return { missing: `none of the chosen modules under ${base}` };
  return { files, sources: [{ name: `lib${dir}-stdlib (CPython standard library, Debian)`, version, files: files.length, bytes }] };
}

function debianVersion(pkg: string): string | undefined {
  try {
    return execFileSync('dpkg-query', ['-W', '-f=${Version}', pkg], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'] }).trim() || undefined;
  } catch {
    return undefined;
  }
}

/** Offsets of line starts, with the analyzer's line breaks (`\n`, `\r\n`, a lone `\r`). */
export function lineStarts(text: string): number[] {
  const starts = [0];
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 10 || (c === 13 && text.charCodeAt(i + 1) !== 10)) starts.push(i + 1);
  }
  return starts;
}

/** The source range [start, end) of a fragment (its columns are 1-based, its end inclusive). */
export function fragmentRange(starts: readonly number[], fragment: Fragment): [number, number] {
  return [starts[fragment.startLine - 1]! + fragment.startColumn - 1, starts[fragment.endLine - 1]! + fragment.endColumn];
}

/** Wrappers that let a function parse alone, by fragment kind; tried in order. */
const IN_CLASS: [string, string] = ['class Plant extends PlantBase {\n', '\n}\n'];
const IN_OBJECT: [string, string] = ['({\n', '\n});\n'];
const WRAPPERS = new Map<string, Array<[string, string]>>([
  ['function', [['', '\n'], ['(', ');\n'], IN_OBJECT]],
  ['arrow', [['(', ');\n']]],
  ['method', [IN_CLASS, IN_OBJECT]],
  ['constructor', [IN_CLASS]],
  ['getter', [IN_CLASS, IN_OBJECT]],
  ['setter', [IN_CLASS, IN_OBJECT]],
]);

/**
 * A JavaScript/TypeScript function cut out of its file and wrapped so that it parses alone
 * (a method in a class, a function expression in parentheses); undefined when no wrapper works.
 */
export function jsSnippet(file: CorpusFile, starts: readonly number[], fragment: Fragment): Snippet | undefined {
  const [start, end] = fragmentRange(starts, fragment);
  const body = file.text.slice(start, end);
  const dialect = dialectForPath(file.path);
  for (const [prefix, suffix] of WRAPPERS.get(fragment.kind) ?? []) {
    const lines = prefix.split('\n');
    const snippet: Snippet = { text: prefix + body + suffix, line: lines.length, column: lines[lines.length - 1]!.length, dialect };
    try {
      if (findFunction(parseStrict(snippet.text, dialect), snippet)) return snippet;
    } catch {
      // try the next wrapper
    }
  }
  return undefined;
}

/**
 * A Python function's lines (from its first decorator or `def` to its end), under `if True:`
 * when indented, so it keeps its own indentation and still parses.
 */
export function pySnippet(file: CorpusFile, starts: readonly number[], fragment: Fragment): PySnippet {
  const from = starts[fragment.startLine - 1]!;
  const to = fragment.endLine < starts.length ? starts[fragment.endLine]! : file.text.length;
  let body = file.text.slice(from, to);
  if (!body.endsWith('\n')) body += '\n';
  return /^[ \t]/.test(body) ? { text: `if True:\n${body}`, line: 2 } : { text: body, line: 1 };
}
