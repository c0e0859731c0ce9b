import { spawn, type ChildProcessWithoutNullStreams } from 'node:child_process';
import http from 'node:http';
import net from 'node:net';
import type { Express } from 'express';
import { afterEach, describe, expect, it } from 'vitest';
import { CSRF_HEADER } from '../../shared/api/session';
import { projectRoot } from '../../server/config';
import type { User } from '../../server/models/User';
import { buildRepository, buildUser, loadFolder, PASTED_PRICING_RULE, RELEASES, signedInAgent, useDatabase } from '../support';

useDatabase();

/**
 * The HTTP entry as a process manager runs it (`node --import tsx server/index.ts`), against the
 * suite's database, stopped with SIGTERM while a request is in flight. The request is held open by
 * sending its body in two parts, so "in flight" does not depend on how fast the server is.
 */

interface Running {
  child: ChildProcessWithoutNullStreams;
  port: number;
  output: () => string;
  exited: Promise<number | null>;
}

const children: ChildProcessWithoutNullStreams[] = [];
afterEach(() => {
  for (const child of children.splice(0)) if (child.exitCode === null) child.kill('SIGKILL');
});

async function startServer(graceMs: number): Promise<Running> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: projectRoot,
    env: { ...process.env, PORT: '0', HOST: '127.0.0.1', SHUTDOWN_GRACE_MS: String(graceMs) },
  });
  children.push(child);
  let output = '';
  child.stdout.on('data', (chunk: Buffer) => (output += chunk.toString()));
  child.stderr.on('data', (chunk: Buffer) => (output += chunk.toString()));
  const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
  const port = await waitFor(() => {
    if (child.exitCode !== null) throw new Error(`the server exited with ${child.exitCode}:\n${output}`);
    return /serving on http:\/\/127\.0\.0\.1:(\d+)\//.exec(output)?.[1];
  }, 60_000, () => output);
  return { child, port: Number(port), output: () => output, exited };
}

async function waitFor<T>(check: () => T | undefined | Promise<T | undefined>, ms: number, describe: () => string): Promise<T> {
  const until = Date.now() + ms;
  for (;;) {
    const value = await check();
    if (value !== undefined) return value;
    if (Date.now() > until) throw new Error(`timed out; server output:\n${describe()}`);
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
}

/** Resolves with true once a new TCP connection to the port is refused. */
function refused(port: number): Promise<true | undefined> {
  return new Promise((resolve) => {
    const socket = net.connect(port, '127.0.0.1');
    socket.once('connect', () => {
      socket.destroy();
      resolve(undefined);
    });
    socket.once('error', (error: NodeJS.ErrnoException) => resolve(error.code === 'ECONNREFUSED' ? true : undefined));
  });
}

/** The cookie and CSRF headers of a signed-in session, for a hand-made request. */
async function sessionHeaders(port: number, user: User): Promise<Record<string, string>> {
  // supertest takes a base URL as well as an app.
  const agent = await signedInAgent(`http://127.0.0.1:${port}` as unknown as Express, user);
  const probe = await agent.get('/api/repositories').expect(200);
  const sent = (probe as unknown as { req: http.ClientRequest }).req;
  return { cookie: String(sent.getHeader('cookie')), [CSRF_HEADER]: String(sent.getHeader(CSRF_HEADER)) };
}

/** Starts a POST whose body is sent in two parts: `finish()` sends the rest. */
function heldRequest(port: number, path: string, headers: Record<string, string>, body: string) {
  const bytes = Buffer.from(body);
  const half = Math.floor(bytes.length / 2);
  let settle!: (value: { status: number; headers: http.IncomingHttpHeaders; body: string } | { error: string }) => void;
  const answered = new Promise<{ status: number; headers: http.IncomingHttpHeaders; body: string } | { error: string }>((resolve) => (settle = resolve));
  const req = http.request({
    host: '127.0.0.1', port, method: 'POST', path, agent: false,
    headers: { ...headers, 'content-type': 'application/json', 'content-length': String(bytes.length) },
  });
  req.on('response', (res) => {
    let text = '';
    res.on('data', (chunk: Buffer) => (text += chunk.toString()));
    res.on('end', () => settle({ status: res.statusCode ?? 0, headers: res.headers, body: text }));
    res.on('error', (error) => settle({ error: error.message }));
  });
  req.on('error', (error: NodeJS.ErrnoException) => settle({ error: error.code ?? error.message }));
  req.write(bytes.subarray(0, half));
  return { answered, finish: () => req.end(bytes.subarray(half)) };
}

describe('server/index.ts on SIGTERM', () => {
  it('stops accepting, lets the request in flight finish with a complete answer, and exits 0', async () => {
    const engineer = await buildUser({ role: 'engineer' });
    const repository = await buildRepository({ organisationId: engineer.organisationId, name: 'freight-platform' });
    await loadFolder(repository, `${RELEASES}/v1`, '2026.09');
    const server = await startServer(20_000);
    const headers = await sessionHeaders(server.port, engineer);

    const request = heldRequest(server.port, '/api/find-copies', headers, JSON.stringify({ language: 'javascript', text: PASTED_PRICING_RULE }));
    // The server has the request once it has read its headers; give it a moment on a busy machine.
    await new Promise((resolve) => setTimeout(resolve, 500));
    server.child.kill('SIGTERM');
    await waitFor(() => (/draining 1 request/.test(server.output()) ? true : undefined), 10_000, server.output);
    await waitFor(() => refused(server.port), 10_000, server.output);

    request.finish();
    const answer = await request.answered;
    expect(answer).toMatchObject({ status: 200 });
    if (!('status' in answer)) throw new Error(answer.error);
    expect(answer.headers.connection).toBe('close');
    // The answer is whole and was worked out after SIGTERM (session, user and index all read then).
    const body = JSON.parse(answer.body) as { copies: { repositoryName: string; similarity: number }[] };
    expect(body.copies.length).toBeGreaterThan(0);
    expect(body.copies.every((c) => c.repositoryName === 'freight-platform' && c.similarity >= 0.8)).toBe(true);

    expect(await server.exited).toBe(0);
    expect(server.output()).toContain('Doublet stopped.');
    expect(server.output()).not.toContain('Cut off');
  }, 120_000);

  it('cuts a request that outlives the grace period, and still exits 0 soon after it', async () => {
    const engineer = await buildUser({ role: 'engineer' });
    const server = await startServer(1_000);
    const headers = await sessionHeaders(server.port, engineer);

    const request = heldRequest(server.port, '/api/find-copies', headers, JSON.stringify({ language: 'javascript', text: PASTED_PRICING_RULE }));
    await new Promise((resolve) => setTimeout(resolve, 500));
    const signalled = Date.now();
    server.child.kill('SIGTERM');

    // The rest of the body never comes: the server must not wait for it past the grace period.
    const answer = await request.answered;
    expect(answer).toHaveProperty('error');
    expect(await server.exited).toBe(0);
    expect(Date.now() - signalled).toBeLessThan(15_000);
    expect(server.output()).toContain('Cut off 1 request(s)');
  }, 120_000);
});
