import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { describe, expect, it } from 'vitest';
import { drain, onShutdown } from '../../server/index';

/**
 * drain() in-process, on a bare HTTP server whose one route answers when the test says so: the
 * order of the steps and the grace period, without a database (closing none is a no-op).
 */
describe('drain', () => {
  it('waits for the request in flight, then runs the shutdown tasks, and abandons a task that outlives the grace period', async () => {
    const events: string[] = [];
    let release!: () => void;
    const released = new Promise<void>((resolve) => (release = resolve));
    const server = http.createServer((_req, res) => {
      void released.then(() => {
        events.push('request answered');
        res.end('done');
      });
    });
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    const { port } = server.address() as AddressInfo;

    onShutdown('flush', async () => {
      events.push('flush ran');
    });
    onShutdown('stuck job', () => new Promise(() => {}));

    const answer = fetch(`http://127.0.0.1:${port}/`).then(async (res) => ({ status: res.status, text: await res.text() }));
    await new Promise((resolve) => setTimeout(resolve, 200));
    const started = Date.now();
    const report = drain(server, 1_500);
    await new Promise((resolve) => setTimeout(resolve, 300));
    expect(server.listening).toBe(false);
    release();

    const result = await report;
    expect(await answer).toEqual({ status: 200, text: 'done' });
    expect(events).toEqual(['request answered', 'flush ran']);
    expect(result).toEqual({ abandonedRequests: 0, abandonedTasks: ['stuck job'] });
    const elapsed = Date.now() - started;
    expect(elapsed).toBeGreaterThanOrEqual(1_400);
    expect(elapsed).toBeLessThan(5_000);
  });
});
