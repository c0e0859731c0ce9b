/**
 * `npm run size:client`: what index.html makes the browser load up front, in gzipped bytes.
 * Reads the built client (dist/web; run `vite build` first): the entry script, the chunks it
 * preloads, and every chunk those import statically, followed to the end. Dynamic imports (the
 * pages, charts, the highlighter and its grammars) are not counted: they load on the pages that
 * need them. Prints figures and a verdict against the 150 kB budget; it asserts nothing else.
 * Gzip uses zlib's default level (6), as most servers do.
 */
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';

const BUDGET_BYTES = 150 * 1024;
const dist = path.resolve(import.meta.dirname, '../../dist/web');
const indexFile = path.join(dist, 'index.html');
if (!fs.existsSync(indexFile)) {
  console.error('dist/web/index.html is missing: run `npx vite build` first.');
  process.exit(1);
}

const html = fs.readFileSync(indexFile, 'utf8');
const upFront = [
  ...html.matchAll(/<script[^>]*type="module"[^>]*src="([^"]+)"/g),
  ...html.matchAll(/<link[^>]*rel="modulepreload"[^>]*href="([^"]+)"/g),
].map((m) => m[1]);

// Static imports in a minified chunk: `import … from "./x.js"` and bare `import "./x.js"`.
// `import("./x.js")` (dynamic) does not match: the quote must follow `from` or `import` directly.
const STATIC_IMPORT = /(?:\bfrom|\bimport)\s*["'](\.\/[^"']+\.js)["']/g;

const seen = new Set<string>();
const queue = upFront.map((src) => path.join(dist, src));
while (queue.length) {
  const file = queue.shift()!;
  if (seen.has(file)) continue;
  seen.add(file);
  const text = fs.readFileSync(file, 'utf8');
  for (const m of text.matchAll(STATIC_IMPORT)) queue.push(path.join(path.dirname(file), m[1]));
}

let raw = 0;
let gzipped = 0;
const rows = [...seen].map((file) => {
  const bytes = fs.readFileSync(file);
  const gz = zlib.gzipSync(bytes).length;
  raw += bytes.length;
  gzipped += gz;
  return { file: path.relative(dist, file), raw: bytes.length, gz };
});
for (const r of rows.sort((a, b) => b.gz - a.gz)) {
  console.log(`${(r.gz / 1024).toFixed(1).padStart(7)} kB gz  ${(r.raw / 1024).toFixed(1).padStart(7)} kB  ${r.file}`);
}
console.log(`up-front JavaScript: ${rows.length} files, ${(raw / 1024).toFixed(1)} kB, ${(gzipped / 1024).toFixed(1)} kB gzipped (budget 150 kB gzipped)`);
console.log(gzipped <= BUDGET_BYTES ? 'within budget' : 'OVER BUDGET');
process.exitCode = gzipped <= BUDGET_BYTES ? 0 : 1;
