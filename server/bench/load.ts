import { spawn } from 'node:child_process';
import os from 'node:os';
import { parseArgs } from 'node:util';
import autocannon from 'autocannon';
import { CSRF_HEADER } from '../../shared/api/session';
import { DEMO_SIGN_INS, seedDemo } from '../commands/seedDemo';
import { seedDemoRepositories } from '../commands/seedDemoRepositories';
import { projectRoot } from '../config';
import { connect, disconnect } from '../db/connection';
import { stopJobs } from '../jobs';
import { migrateUp } from '../db/migrate';
import { createDatabaseIfMissing, dropDatabase, ensureDatabaseServer } from '../db/postgres';
import { initModels } from '../models';

/**
 * `npm run bench:load [-- --duration 10 --connections 10,50,100 --keep]`: HTTP load on the main read
 * routes and on find copies, printed as Markdown. Not a test: it measures, it does not judge.
 *
 * It seeds the demo organisation into a database of its own (`doublet_bench_load`, on the local
 * cluster or on DATABASE_URL's server; created fresh, dropped at the end unless `--keep`), starts
 * the server as its own process (`node --import tsx server/index.ts`, PORT=0, loopback only) so the
 * load generator does not share its event loop, signs in as the demo engineer and runs autocannon
 * against each route (after a 3 s warm-up at the highest connection count) at each connection
 * count for a fixed duration. Latency percentiles are computed from every response time
 * (autocannon's own summary has no p95). The server is stopped with SIGTERM at the end, as an
 * operator would.
 */

const BENCH_DATABASE = 'doublet_bench_load';
const WARM_UP_S = 3;

/** An engineer's paste: the demo's pricing rule (server/demo/freight-platform) with its names changed. */
const SNIPPET = `function chargeFor(cars, km, terms) {
  let sum = 0;
  for (const car of cars) {
    const base = car.loadTonnes * terms.ratePerTonne + car.axles * 3;
    const hazard = car.hazardous ? base * 0.15 : 0;
    sum += (base + hazard) * Math.max(1, km / 100);
  }
  if (terms.discount > 0) {
    sum = sum - sum * terms.discount;
  }
  return Math.round(sum * 100) / 100;
}`;

interface Target {
  name: string;
  path: string;
  method?: 'GET' | 'POST';
  body?: string;
}

interface Row {
  route: string;
  connections: number;
  requests: number;
  perSecond: number;
  p50: number;
  p95: number;
  p99: number;
  errors: number;
  loadBefore: number;
  loadAfter: number;
}

/** Nearest-rank percentile of a sorted list. */
function percentile(sorted: Float64Array, p: number): number {
  if (sorted.length === 0) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!;
}

/** A cookie jar of one: every Set-Cookie kept by name, sent back as one Cookie header. */
class Cookies {
  private readonly jar = new Map<string, string>();
  take(res: Response) {
    for (const line of res.headers.getSetCookie()) {
      const [pair] = line.split(';');
      const at = pair!.indexOf('=');
      this.jar.set(pair!.slice(0, at).trim(), pair!.slice(at + 1).trim());
    }
  }
  header(): string {
    return [...this.jar].map(([k, v]) => `${k}=${v}`).join('; ');
  }
}

async function signIn(base: string, email: string, password: string): Promise<Record<string, string>> {
  const cookies = new Cookies();
  const probe = await fetch(`${base}/api/session`);
  cookies.take(probe);
  const { csrfToken } = (await probe.json()) as { csrfToken: string };
  const res = await fetch(`${base}/api/session`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', cookie: cookies.header(), [CSRF_HEADER]: csrfToken },
    body: JSON.stringify({ email, password }),
  });
  if (res.status !== 200) throw new Error(`sign-in failed: ${res.status} ${await res.text()}`);
  cookies.take(res);
  const session = (await res.json()) as { csrfToken: string };
  return { cookie: cookies.header(), [CSRF_HEADER]: session.csrfToken };
}

async function getJson<T>(base: string, path: string, headers: Record<string, string>): Promise<T> {
  const res = await fetch(`${base}${path}`, { headers });
  if (res.status !== 200) throw new Error(`GET ${path}: ${res.status}`);
  return (await res.json()) as T;
}

/** Seeds a fresh bench database with the demo organisation; returns its URL. */
async function prepareDatabase(): Promise<{ url: string; admin: string }> {
  const configured = new URL(await ensureDatabaseServer());
  configured.pathname = '/postgres';
  const admin = configured.toString();
  configured.pathname = `/${BENCH_DATABASE}`;
  const url = configured.toString();
  await dropDatabase(BENCH_DATABASE, admin);
  await createDatabaseIfMissing(BENCH_DATABASE, admin);
  const sequelize = connect(url);
  await migrateUp(sequelize);
  initModels(sequelize);
  const organisation = await seedDemo();
  if (!organisation) throw new Error('the bench database was not empty');
  for (const line of await seedDemoRepositories(organisation)) console.error(line);
  // The loads queued their notices in the bench database: close the queue they opened there.
  await stopJobs();
  await disconnect();
  return { url, admin };
}

/** Starts server/index.ts on a free loopback port against the bench database. */
async function startServer(url: string) {
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: projectRoot,
    env: { ...process.env, DATABASE_URL: url, PORT: '0', HOST: '127.0.0.1' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout.on('data', (chunk: Buffer) => (output += chunk.toString()));
  child.stderr.on('data', (chunk: Buffer) => (output += chunk.toString()));
  const exited = new Promise<number | null>((resolve) => child.once('exit', resolve));
  const until = Date.now() + 60_000;
  for (;;) {
    const port = /serving on http:\/\/127\.0\.0\.1:(\d+)\//.exec(output)?.[1];
    if (port) return { base: `http://127.0.0.1:${port}`, stop: async () => (child.kill('SIGTERM'), exited), output: () => output };
    if (child.exitCode !== null || Date.now() > until) throw new Error(`the server did not start:\n${output}`);
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

async function measure(base: string, target: Target, connections: number, durationS: number, headers: Record<string, string>): Promise<Row> {
  const times: number[] = [];
  const loadBefore = os.loadavg()[0]!;
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon(
      {
        url: `${base}${target.path}`,
        method: target.method ?? 'GET',
        body: target.body,
        headers: { ...headers, ...(target.body ? { 'content-type': 'application/json' } : {}) },
        connections,
        duration: durationS,
        timeout: 30,
      },
      (error, done) => (error ? reject(error) : resolve(done)),
    );
    instance.on('response', (_client, _status, _bytes, responseTime) => times.push(responseTime));
  });
  const sorted = Float64Array.from(times).sort();
  return {
    route: target.name,
    connections,
    requests: result.requests.total,
    perSecond: result['2xx'] / durationS,
    p50: percentile(sorted, 50),
    p95: percentile(sorted, 95),
    p99: percentile(sorted, 99),
    errors: result.errors + result.timeouts + result.non2xx,
    loadBefore,
    loadAfter: os.loadavg()[0]!,
  };
}

async function main() {
  const { values } = parseArgs({
    options: {
      duration: { type: 'string', default: '10' },
      connections: { type: 'string', default: '10,50,100' },
      keep: { type: 'boolean', default: false },
    },
  });
  const durationS = Number(values.duration);
  const levels = values.connections.split(',').map(Number);
  if (!(durationS > 0 && durationS <= 120) || levels.some((n) => !Number.isInteger(n) || n < 1 || n > 500)) {
    throw new Error('--duration is 1..120 seconds, --connections a list of 1..500');
  }

  const loadAtStart = os.loadavg();
  console.error(`Seeding ${BENCH_DATABASE} with the demo organisation…`);
  const { url, admin } = await prepareDatabase();
  const server = await startServer(url);
  try {
    const engineer = DEMO_SIGN_INS.find((s) => s.role === 'engineer')!;
    const headers = await signIn(server.base, engineer.email, engineer.password);
    type Repositories = { repositories: { id: number; name: string; latestSnapshot: { id: number } | null }[] };
    const { repositories } = await getJson<Repositories>(server.base, '/api/repositories', headers);
    const repository = repositories.find((r) => r.name === 'freight-platform')!;
    const snapshotId = repository.latestSnapshot!.id;
    const { classes } = await getJson<{ classes: { id: number }[] }>(server.base, `/api/snapshots/${snapshotId}/classes`, headers);
    const body = JSON.stringify({ language: 'javascript', text: SNIPPET });
    const found = await fetch(`${server.base}/api/find-copies`, { method: 'POST', headers: { ...headers, 'content-type': 'application/json' }, body });
    const { copies } = (await found.json()) as { copies: unknown[] };
    console.error(`find copies of the pasted snippet: ${copies.length} copies (status ${found.status})`);

    const targets: Target[] = [
      { name: 'repositories list', path: '/api/repositories' },
      { name: "a snapshot's classes", path: `/api/snapshots/${snapshotId}/classes` },
      { name: 'a class with its code', path: `/api/clone-classes/${classes[0]!.id}` },
      { name: 'the trend', path: `/api/repositories/${repository.id}/metrics` },
      { name: 'find copies', path: '/api/find-copies', method: 'POST', body },
    ];
    const rows: Row[] = [];
    for (const target of targets) {
      // Warm-up, not reported: JIT, the pool's connections and, for find copies, every analysis
      // thread (the pool starts them as load arrives; a start takes a second or more under load).
      await measure(server.base, target, Math.max(...levels), WARM_UP_S, headers);
      for (const connections of levels) {
        const row = await measure(server.base, target, connections, durationS, headers);
        console.error(`  ${row.route} @${connections}: ${row.perSecond.toFixed(0)} req/s, p95 ${row.p95.toFixed(1)} ms, ${row.errors} errors`);
        rows.push(row);
      }
    }

    const ms = (x: number) => (Number.isNaN(x) ? '–' : x < 10 ? x.toFixed(1) : x.toFixed(0));
    console.log(`\n${os.cpus().length} cores, Node ${process.version}, ${durationS} s per row, loopback; load average (1/5/15 min) at start ${loadAtStart.map((x) => x.toFixed(2)).join(' / ')}\n`);
    console.log('| route | connections | req/s | p50 ms | p95 ms | p99 ms | errors | requests | load (1 min) before → after |');
    console.log('| --- | ---: | ---: | ---: | ---: | ---: | ---: | ---: | --- |');
    for (const r of rows) {
      console.log(`| ${r.route} | ${r.connections} | ${r.perSecond.toFixed(0)} | ${ms(r.p50)} | ${ms(r.p95)} | ${ms(r.p99)} | ${r.errors} | ${r.requests} | ${r.loadBefore.toFixed(2)} → ${r.loadAfter.toFixed(2)} |`);
    }
    console.log(`\nload average (1/5/15 min) at the end ${os.loadavg().map((x) => x.toFixed(2)).join(' / ')}`);
  } finally {
    const code = await server.stop();
    if (code !== 0) console.error(`the server exited with ${code}:\n${server.output()}`);
    if (!values.keep) await dropDatabase(BENCH_DATABASE, admin);
  }
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.stack : error);
  process.exit(1);
});
