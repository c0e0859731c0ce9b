// The server build: TypeScript in server/, analyzers/ and shared/ → compiled JavaScript in
// dist/server (next to the client's dist/web). Plain JavaScript on purpose: the launchers
// (server/doublet.mjs, scripts/start.mjs) check and run the build before any TypeScript loader
// exists. `node scripts/build.mjs [OUTDIR]` builds unconditionally (`npm run build`).
//
// esbuild bundles three entries, ESM with code splitting, every npm package left external (they
// load from node_modules as they do from the sources):
//   cli.mjs              the `doublet` command line (server/cli.ts); each command stays a lazy chunk
//   start.mjs            `npm start` (server/start.ts)
//   analyzer-worker.mjs  the analyzer pool threads (analyzers/worker-task.ts), named by the two
//                        entries above through analyzers/worker-location.ts
// Modules that find files relative to themselves (import.meta.url: the project root in
// server/config.ts, tree-sitter's wasm files) keep seeing their source location:
// the bundle rewrites each module's import.meta.url to its source file, as a path relative to the
// bundle, so a build still works when the checkout moves. Migrations are bundled by
// server/db/migrate.ts's import pattern.
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

/** The checkout. */
export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
/** Where the compiled server goes by default. */
export const defaultOutdir = path.join(root, 'dist', 'server');

/** What the build reads: a change in any of these makes a build stale. */
const INPUT_DIRS = ['server', 'analyzers', 'shared'];
/** Not built at all (benchmarks run from the sources): no rebuild when they change. */
const NOT_BUILT = new Set(['server/bench']);
const INPUT_FILES = ['package.json', 'package-lock.json', 'tsconfig.json', 'scripts/build.mjs'];
const STAMP = 'build-stamp.json';

/**
 * A cheap fingerprint of the build's inputs: file count, total size and the latest change time
 * (ctime, which a rename changes too). One stat a file, a few milliseconds for the whole tree.
 */
export function inputFingerprint() {
  let files = 0;
  let bytes = 0;
  let latest = 0;
  const visit = (file) => {
    const stat = fs.statSync(file, { throwIfNoEntry: false });
    if (!stat) return;
    files++;
    bytes += stat.size;
    latest = Math.max(latest, stat.ctimeMs, stat.mtimeMs);
  };
  const walk = (dir, relative) => {
    for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
      const rel = `${relative}/${entry.name}`;
      if (NOT_BUILT.has(rel)) continue;
      if (entry.isDirectory()) walk(path.join(dir, entry.name), rel);
      else visit(path.join(dir, entry.name));
    }
  };
  for (const dir of INPUT_DIRS) walk(path.join(root, dir), dir);
  for (const file of INPUT_FILES) visit(path.join(root, file));
  return `${files} files, ${bytes} bytes, changed ${latest}`;
}

/** Whether `outdir` holds a build of the current inputs. */
export function isFresh(outdir = defaultOutdir) {
  try {
    const stamp = JSON.parse(fs.readFileSync(path.join(outdir, STAMP), 'utf8'));
    return stamp.inputs === inputFingerprint();
  } catch {
    return false;
  }
}

const SOURCE = /\.(ts|tsx|mts|js|mjs)$/;

/** Rewrites each bundled source module's import.meta.url to its own file (see the top). */
function sourceLocations(outdir) {
  return {
    name: 'doublet-source-locations',
    setup(build) {
      build.onLoad({ filter: SOURCE }, async (args) => {
        if (args.namespace !== 'file' || args.path.includes(`${path.sep}node_modules${path.sep}`)) return undefined;
        const text = await fs.promises.readFile(args.path, 'utf8');
        if (!text.includes('import.meta.url')) return undefined;
        const relative = path.relative(outdir, args.path).split(path.sep).join('/');
        const extension = path.extname(args.path).slice(1);
        return {
          contents: text.replaceAll('import.meta.url', `new URL(${JSON.stringify(relative)}, import.meta.url).href`),
          loader: extension === 'mjs' ? 'js' : extension === 'mts' ? 'ts' : extension,
        };
      });
    },
  };
}

/** The entries' code; each sits in the project root so that its relative imports resolve. */
const ENTRIES = {
  cli: `import { useCompiledWorker } from './analyzers/worker-location.ts';
useCompiledWorker(new URL('./analyzer-worker.mjs', import.meta.url));
await import('./server/cli.ts');`,
  start: `import { useCompiledWorker } from './analyzers/worker-location.ts';
useCompiledWorker(new URL('./analyzer-worker.mjs', import.meta.url));
await import('./server/start.ts');`,
  // The same dispatch as analyzers/worker.mjs, over the compiled task module.
  'analyzer-worker': `import { runSnippetTask, runTask, warmUp } from './analyzers/worker-task.ts';
export default async function analyze(task) {
  if (task.warm) return warmUp(task.warm);
  if (task.snippet) return runSnippetTask(task);
  return runTask(task);
}`,
};

const entryPlugin = {
  name: 'doublet-entries',
  setup(build) {
    build.onResolve({ filter: /^doublet-entry:/ }, (args) => ({ path: args.path.slice('doublet-entry:'.length), namespace: 'doublet-entry' }));
    build.onLoad({ filter: /.*/, namespace: 'doublet-entry' }, (args) => ({ contents: ENTRIES[args.path], resolveDir: root, loader: 'js' }));
  },
};

/**
 * Builds into `outdir` (default dist/server): first into a staging folder beside it, then swapped
 * in, so a command started meanwhile never sees half a build. Resolves to `outdir`.
 */
export async function build(outdir = defaultOutdir) {
  const { build: esbuild } = await import('esbuild');
  const inputs = inputFingerprint();
  const staging = `${outdir}.staging-${process.pid}`;
  fs.rmSync(staging, { recursive: true, force: true });
  await esbuild({
    absWorkingDir: root,
    entryPoints: Object.fromEntries(Object.keys(ENTRIES).map((name) => [name, `doublet-entry:${name}`])),
    bundle: true,
    splitting: true,
    format: 'esm',
    platform: 'node',
    target: 'node20',
    packages: 'external',
    outdir: staging,
    outExtension: { '.js': '.mjs' },
    entryNames: '[name]',
    chunkNames: 'chunk-[hash]',
    sourcemap: 'linked',
    logLevel: 'warning',
    // import.meta.url is relative to where the files end up, not the staging folder
    plugins: [entryPlugin, sourceLocations(outdir)],
  });
  fs.writeFileSync(path.join(staging, STAMP), `${JSON.stringify({ inputs, builtAt: new Date().toISOString() })}\n`);
  const old = `${outdir}.old-${process.pid}`;
  try {
    fs.renameSync(outdir, old);
  } catch (error) {
    // nothing built yet, or another process is swapping its build in right now
    if (error.code !== 'ENOENT') throw error;
  }
  try {
    fs.renameSync(staging, outdir);
  } catch (error) {
    // Another process swapped its build in between: keep that one.
    if (!fs.existsSync(outdir)) throw error;
    fs.rmSync(staging, { recursive: true, force: true });
  }
  fs.rmSync(old, { recursive: true, force: true });
  return outdir;
}

/** The compiled server, built first when it is missing or older than its sources. */
export async function ensureBuilt(outdir = defaultOutdir) {
  if (isFresh(outdir)) return outdir;
  process.stderr.write(`Compiling the server into ${path.relative(process.cwd(), outdir) || outdir}…\n`);
  return build(outdir);
}

/** Imports one compiled entry (cli, start) after making sure the build is current. */
export async function runBuilt(entry, outdir = defaultOutdir) {
  await ensureBuilt(outdir);
  await import(pathToFileURL(path.join(outdir, `${entry}.mjs`)).href);
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const outdir = path.resolve(process.argv[2] ?? defaultOutdir);
  const start = performance.now();
  await build(outdir);
  process.stderr.write(`Built ${path.relative(process.cwd(), outdir) || outdir} in ${Math.round(performance.now() - start)} ms\n`);
}
