/** Helpers for tests that check an analysis thread really stops: a snippet that keeps one busy, and CPU clocks. */

/**
 * A real pathological input: nested `<T>(` casts make Babel's TypeScript parser try both readings
 * (cast or generic arrow) at every level, so the time doubles per level: 24 levels would take hours.
 */
export const PATHOLOGICAL_TS = `const x = ${'<a>('.repeat(24)}y;\n`;

/** CPU time (ms) this process, pool threads included, spends during the next `ms` milliseconds. */
export async function cpuDuring(ms: number): Promise<number> {
  const before = process.cpuUsage();
  await new Promise((resolve) => setTimeout(resolve, ms));
  const used = process.cpuUsage(before);
  return (used.user + used.system) / 1000;
}

/**
 * CPU this process uses while a pool thread works, measured until it reaches `atLeastMs` (at most
 * 20 s): on a loaded machine the thread gets only a share of a core, so a fixed window can come up
 * short. Returns the CPU used and the wall time it took, to measure the same stretch again after
 * the work should have stopped.
 */
export async function cpuWhileBusy(atLeastMs = 200): Promise<{ busy: number; window: number }> {
  const started = Date.now();
  let busy = 0;
  while (busy <= atLeastMs && Date.now() - started < 20_000) busy += await cpuDuring(500);
  return { busy, window: Date.now() - started };
}
