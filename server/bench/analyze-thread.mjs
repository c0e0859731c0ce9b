// One thread of `npm run bench:analyze`: analyses the texts it is given, one after another,
// `passes` times, with the heap limits analyze.ts gives it (a pool thread's), and reports wall and
// CPU time per pass. The first pass is cold (JIT, heap growth), later ones show the steady rate
// a thread reaches on a large job. Plain JavaScript: a worker thread's entry file does not go
// through the parent's tsx loader, so the analyzers are loaded with tsx's tsImport, as the pool's
// own threads do (analyzers/worker.mjs).
import { parentPort, workerData } from 'node:worker_threads';
import { tsImport } from 'tsx/esm/api';

const { analyzeFile } = await tsImport('../../analyzers/index.ts', import.meta.url);
const { texts, passes } = workerData;
const results = [];
for (let pass = 0; pass < passes; pass++) {
  let fragments = 0;
  const cpuBefore = process.cpuUsage();
  const started = performance.now();
  for (const t of texts) fragments += (await analyzeFile(t.path, t.text)).fragments.length;
  const seconds = (performance.now() - started) / 1000;
  const cpu = process.cpuUsage(cpuBefore);
  results.push({ seconds, cpuSeconds: (cpu.user + cpu.system) / 1e6, fragments });
}
parentPort.postMessage(results);
