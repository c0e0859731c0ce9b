import { afterAll, describe, expect, it } from 'vitest';
import os from 'node:os';
import { analyzeSnippet, analyzeSnippetInPool, closeSnippetPool } from '../../analyzers';
import { MAX_WAITING_SNIPPETS } from '../../analyzers/snippet-pool';
import { cpuDuring, cpuWhileBusy, PATHOLOGICAL_TS } from '../support/cpu';

afterAll(() => closeSnippetPool());

describe('analyzeSnippetInPool', () => {
  it('gives what analyzeSnippet gives on the caller thread', async () => {
    const text = 'def crates(n):\n    total = n * 2\n    return total\n';
    expect(await analyzeSnippetInPool('python', text, { shingleSize: 3 })).toEqual({
      ok: true,
      fragments: await analyzeSnippet('python', text, { shingleSize: 3 }),
    });
  });

  it('refuses the nested-lambda input of the hardening report as a limit, naming it, within seconds', async () => {
    const started = Date.now();
    const outcome = await analyzeSnippetInPool('python', `f = ${'lambda: '.repeat(24_999)}1\n`);
    expect(outcome).toEqual({ ok: false, refusal: 'limit', limit: 'nesting', message: 'functions and classes nested more than 100 deep (nesting limit)' });
    expect(Date.now() - started).toBeLessThan(15_000);
  });

  it('reports a snippet the parser cannot read, or an unknown language, as invalid', async () => {
    expect(await analyzeSnippetInPool('cobol', 'x')).toMatchObject({ ok: false, refusal: 'invalid', message: expect.stringMatching(/^unknown language "cobol"/) });
  });

  it('cuts a snippet off at its time limit and says so', async () => {
    const outcome = await analyzeSnippetInPool('typescript', PATHOLOGICAL_TS, { timeoutMs: 1_500 });
    expect(outcome).toEqual({ ok: false, refusal: 'limit', limit: 'time', message: 'the analysis took longer than 1500 ms (time limit)' });
  }, 30_000);

  it('stops the work when the signal aborts: the promise rejects with its reason and the thread stops using the CPU', async () => {
    const controller = new AbortController();
    const running = analyzeSnippetInPool('typescript', PATHOLOGICAL_TS, { signal: controller.signal });
    const settled = running.then(
      () => 'resolved',
      (error: unknown) => error,
    );
    const { busy, window } = await cpuWhileBusy(200);
    controller.abort(new Error('client gone'));
    expect(await settled).toEqual(new Error('client gone'));
    await new Promise((resolve) => setTimeout(resolve, 300));
    const after = await cpuDuring(window);
    expect(busy).toBeGreaterThan(200);
    expect(after).toBeLessThan(busy / 2);
  }, 60_000);

  it('refuses a snippet as busy when every thread is taken and the waiting line is full, and lets an aborted waiter go', async () => {
    const controller = new AbortController();
    const held = Array.from({ length: os.availableParallelism() + MAX_WAITING_SNIPPETS }, () =>
      analyzeSnippetInPool('typescript', PATHOLOGICAL_TS, { signal: controller.signal }).catch((error: unknown) => error),
    );
    expect(await analyzeSnippetInPool('python', 'x = 1')).toEqual({
      ok: false,
      refusal: 'busy',
      message: `${MAX_WAITING_SNIPPETS} snippets are waiting to be analysed already; try again shortly`,
    });
    controller.abort(new Error('client gone'));
    for (const outcome of await Promise.all(held)) expect(outcome).toEqual(new Error('client gone'));
    expect(await analyzeSnippetInPool('python', 'x = 1')).toMatchObject({ ok: true });
  }, 30_000);

  describe('edge cases', () => {
    it('rejects at once when the signal has already aborted', async () => {
      const controller = new AbortController();
      controller.abort(new Error('already gone'));
      await expect(analyzeSnippetInPool('python', 'x = 1', { signal: controller.signal })).rejects.toThrow('already gone');
    });
  });
});
