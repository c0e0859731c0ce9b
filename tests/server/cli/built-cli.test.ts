import { execFileSync, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { run as scan } from '../../../server/cli/scan';
import { projectRoot } from '../../../server/config';
import { captureIo } from './io';

/**
 * The compiled command line (scripts/build.mjs → dist/server): built into a temporary folder here,
 * then run as a plain `node` process with no TypeScript loader, from another working directory.
 * The folder sits inside the checkout's dist/, as dist/server does: the bundle leaves npm packages
 * external, so they must resolve from node_modules above it.
 */
let dir: string;
let outdir: string;

beforeAll(() => {
  fs.mkdirSync(path.join(projectRoot, 'dist'), { recursive: true });
  dir = fs.mkdtempSync(path.join(projectRoot, 'dist', 'test-build-'));
  outdir = path.join(dir, 'server');
  execFileSync(process.execPath, [path.join(projectRoot, 'scripts/build.mjs'), outdir], { cwd: projectRoot, stdio: ['ignore', 'ignore', 'pipe'] });
}, 120_000);
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

function built(args: string[]) {
  return spawnSync(process.execPath, [path.join(outdir, 'cli.mjs'), ...args], { cwd: os.tmpdir(), encoding: 'utf8', env: { ...process.env, NODE_OPTIONS: '' } });
}

/** Every module specifier the bundle imports, statically or dynamically. */
function importsOf(file: string): string[] {
  const text = fs.readFileSync(file, 'utf8').replace(/^\s*\/\/.*$/gm, ''); // comments name source files
  return [...text.matchAll(/(?:\bfrom\s*|\bimport\s*\(\s*|\bimport\s+)["']([^"']+)["']/g)].map((m) => m[1]);
}

describe('the compiled command line', () => {
  it('joins, from another working directory, and names a malformed line without printing pairs', () => {
    const input = path.join(dir, 'sets.txt');
    fs.writeFileSync(input, '1 2 3 4 5\n1 2 3 4 5 6\n7 8\n\n8 7 7\n');
    const good = built(['join', '--input', input]);
    expect(good.status, good.stderr).toBe(0);
    expect(good.stdout).toBe('0 1 0.833333\n2 4 1\n');
    fs.writeFileSync(input, '1 2\n3 4\n5 six\n');
    const bad = built(['join', '--input', input]);
    expect(bad.status).toBe(1);
    expect(bad.stdout).toBe('');
    expect(bad.stderr).toContain('sets.txt line 3 (set 2): "six" is not an integer');
  });

  it('imports only compiled JavaScript, node built-ins and npm packages: no TypeScript file', () => {
    const files = fs.readdirSync(outdir).filter((f) => f.endsWith('.mjs'));
    expect(files).toEqual(expect.arrayContaining(['cli.mjs', 'start.mjs', 'analyzer-worker.mjs']));
    const specifiers = files.flatMap((f) => importsOf(path.join(outdir, f)));
    expect(specifiers.length).toBeGreaterThan(10);
    for (const specifier of specifiers) {
      if (specifier.startsWith('.')) expect(specifier, specifier).toMatch(/^\.\/[\w-]+\.mjs$/);
      else expect(specifier, specifier).not.toMatch(/\.tsx?$/);
    }
  });

  it('scans with its compiled analyzer threads (tree-sitter grammars included) exactly as the sources do', async () => {
    const fixture = path.join(projectRoot, 'tests/fixtures/scan/larkspur-freight');
    const compiled = built(['scan', '--format', 'json', fixture]);
    expect(compiled.status, compiled.stderr).toBe(0);
    const io = captureIo();
    expect(await scan(['--format', 'json', fixture], io)).toBe(0);
    const withoutDuration = (text: string) => {
      const report = JSON.parse(text) as { stats: Record<string, unknown> };
      delete report.stats.durationMs;
      return report;
    };
    const report = withoutDuration(compiled.stdout);
    expect(report).toEqual(withoutDuration(io.stdout()));
    expect(JSON.stringify(report)).toContain('.py');
  }, 120_000);

  it('knows whether a build is current: fresh after building, stale for other inputs', () => {
    const fresh = (folder: string) =>
      execFileSync(process.execPath, ['--input-type=module', '-e', `import { isFresh } from ${JSON.stringify(path.join(projectRoot, 'scripts/build.mjs'))}; console.log(isFresh(${JSON.stringify(folder)}))`], {
        encoding: 'utf8',
      }).trim();
    expect(fresh(outdir)).toBe('true');
    const stamp = path.join(outdir, 'build-stamp.json');
    const kept = fs.readFileSync(stamp, 'utf8');
    fs.writeFileSync(stamp, JSON.stringify({ inputs: '0 files, 0 bytes, changed 0' }));
    expect(fresh(outdir)).toBe('false');
    fs.writeFileSync(stamp, kept);
    expect(fresh(path.join(dir, 'nothing-built-here'))).toBe('false');
  });
});
