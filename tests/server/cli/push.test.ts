import { spawn } from 'node:child_process';
import fs from 'node:fs';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import schema from '@microsoft/jest-sarif/lib/schemas/sarif-2.1.0-rtm.5.json' with { type: 'json' };
import Ajv from 'ajv-draft-04';
import addFormats from 'ajv-formats';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { PUSH_EXIT, run } from '../../../server/cli/push';
import { select } from '../../../server/clone-index/sql';
import { projectRoot } from '../../../server/config';
import type { Repository } from '../../../server/models/Repository';
import type { SarifLog } from '../../../server/reports/sarif-log';
import type { CreatedApiTokenDTO } from '../../../shared/api/tokens';
import { buildRepository, buildTeam, RELEASES, signedInAgent, useDatabase, useMail, type Agent } from '../../support';
import { captureIo } from './io';

useDatabase();
// The job queue with a worker in this process: the uploaded release is loaded by a snapshot.load job.
useMail();

let server: Server;
let base: string;
let work: string;
let folder: string;
let repository: Repository;
let lead: Agent;
let token: string;

beforeAll(async () => {
  const app = createApp();
  server = await new Promise<Server>((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  work = fs.mkdtempSync(path.join(os.tmpdir(), 'doublet-push-test-'));
  process.env.DOUBLET_UPLOAD_DIR = path.join(work, 'uploads');
  // A checkout of the demo's second release, with what push must leave out: .git, the
  // repository's ignore list (fixtures/), a symbolic link.
  folder = path.join(work, 'checkout');
  fs.cpSync(path.join(RELEASES, 'v2'), folder, { recursive: true });
  fs.mkdirSync(path.join(folder, '.git'));
  fs.writeFileSync(path.join(folder, '.git', 'config'), '[core]\n');
  fs.mkdirSync(path.join(folder, 'fixtures'));
  fs.writeFileSync(path.join(folder, 'fixtures', 'sample.js'), 'export const sample = () => 1;\n');
  fs.symlinkSync('/etc/hostname', path.join(folder, 'host.js'));

  const team = await buildTeam();
  repository = await buildRepository({ organisationId: team.organisation.id, ignore: ['fixtures/'] });
  lead = await signedInAgent(app, team.lead);
  token = ((await lead.post('/api/tokens').send({ name: 'CI push', repositoryId: repository.id }).expect(201)).body as CreatedApiTokenDTO).token;
}, 120_000);

afterAll(async () => {
  await new Promise<void>((resolve) => server?.close(() => resolve()));
  fs.rmSync(work, { recursive: true, force: true });
});

/** Runs `doublet push` in this process with the token in DOUBLET_TOKEN, as a CI job would. */
async function push(args: string[], env: Record<string, string | undefined> = { DOUBLET_TOKEN: token }) {
  const saved = process.env.DOUBLET_TOKEN;
  process.env.DOUBLET_TOKEN = env.DOUBLET_TOKEN;
  if (env.DOUBLET_TOKEN === undefined) delete process.env.DOUBLET_TOKEN;
  try {
    const io = captureIo();
    const code = await run(args, io);
    return { code, stdout: io.stdout(), stderr: io.stderr() };
  } finally {
    process.env.DOUBLET_TOKEN = saved;
  }
}

/** Runs the real command line (`node server/cli.ts push …`) as its own process. */
function pushProcess(args: string[]): Promise<{ code: number | null; stdout: string; stderr: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', path.join(projectRoot, 'server', 'cli.ts'), 'push', ...args], {
      // From the checkout, where `--import tsx` resolves; the folder is given as an absolute path.
      cwd: projectRoot,
      env: { ...process.env, DOUBLET_TOKEN: token },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (d: Buffer) => (stdout += d.toString()));
    child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
    child.once('error', reject);
    child.once('close', (code) => resolve({ code, stdout, stderr }));
  });
}

describe('doublet push against the real server', () => {
  it('packs the folder without .git, links and ignored files, uploads it, waits for the load and prints the figures (exit 0, no budget)', async () => {
    const result = await push(['--server', base, '--repository', String(repository.id), '--label', 'v2', folder]);
    expect(result.code, result.stderr).toBe(PUSH_EXIT.ok);
    expect(result.stderr).toMatch(/^packed \d+ files \(\d+ KiB\), left out 3$/m);
    expect(result.stderr).toMatch(/uploaded as snapshot \d+/);
    // The upload answers while the load is queued: the wait prints that first.
    expect(result.stderr).toContain('queued: waiting for a worker');
    expect(result.stdout).toMatch(new RegExp(`^${repository.name} v2: \\d+ files, \\d+ fragments\\.$`, 'm'));
    expect(result.stdout).toMatch(/^Clone ratio \d+\.\d %.*; \d+ clone classes, \d+ new, \d+ drifted, \d+ gone since the previous release\.$/m);
    expect(result.stdout).toContain('No clone budget set.');
    const [snapshot] = await select<{ id: number; status: string; source: string }>(
      undefined,
      'select id, status, source from snapshots where repository_id = $1 and label = $2',
      [repository.id, 'v2'],
    );
    expect(snapshot.status).toBe('ready');
    expect(result.stdout).toContain(`${base}/snapshots/${snapshot.id}`);
    const paths = (await select<{ path: string }>(undefined, 'select path from snapshot_files where snapshot_id = $1', [snapshot.id])).map((r) => r.path);
    const expected = fs.readdirSync(path.join(RELEASES, 'v2'), { recursive: true, withFileTypes: true }).filter((e) => e.isFile()).length;
    expect(paths).toHaveLength(expected);
    expect(paths.some((p) => p.startsWith('.git') || p.startsWith('fixtures/') || p === 'host.js')).toBe(false);
  }, 120_000);

  it('exits 1 over the repository\'s clone budget and 0 with a --budget it is within (the process\'s own exit code)', async () => {
    await lead.patch(`/api/repositories/${repository.id}`).send({ cloneBudget: 0.001 }).expect(200);
    const over = await pushProcess(['--server', base, '--repository', String(repository.id), '--label', 'v2-rc1', folder]);
    expect(over.stdout, over.stderr).toContain('Clone budget 0.001: OVER BUDGET.');
    expect(over.code, over.stderr).toBe(PUSH_EXIT.overBudget);
    const within = await push(['--server', base, '--repository', String(repository.id), '--label', 'v2-rc2', '--wait', '--budget', '100%', '--format', 'json', folder]);
    expect(within.code, within.stderr).toBe(PUSH_EXIT.ok);
    const summary = JSON.parse(within.stdout) as { verdict: string; budget: string; snapshot: { label: string; status: string } };
    expect(summary).toMatchObject({ verdict: 'within', budget: '100%', snapshot: { label: 'v2-rc2', status: 'ready' } });
  }, 120_000);

  it('exits 2 with the reason on stderr for a refused token, a taken label, a bad option or a missing folder, uploading nothing', async () => {
    const before = await select<{ n: number }>(undefined, 'select count(*)::int as n from snapshots where repository_id = $1', [repository.id]);
    const cases: [string[], Record<string, string | undefined>, RegExp][] = [
      [['--server', base, '--repository', String(repository.id), '--label', 'v9', folder], { DOUBLET_TOKEN: `dblt_${'A'.repeat(43)}` }, /HTTP 401.*Check the token/],
      [['--server', base, '--repository', String(repository.id), '--label', 'v9', folder], { DOUBLET_TOKEN: undefined }, /DOUBLET_TOKEN/],
      [['--server', base, '--repository', String(repository.id), folder], { DOUBLET_TOKEN: token }, /--label is required/],
      [['--server', base, '--repository', 'seven', '--label', 'v9', folder], { DOUBLET_TOKEN: token }, /--repository must be a whole number/],
      [['--server', base, '--repository', String(repository.id), '--label', 'v9', '--budget', '5 percent', folder], { DOUBLET_TOKEN: token }, /--budget/],
      [['--server', base, '--repository', String(repository.id), '--label', 'v9', path.join(work, 'nowhere')], { DOUBLET_TOKEN: token }, /is not a folder/],
      [['--server', 'ftp://doublet.example', '--repository', String(repository.id), '--label', 'v9', folder], { DOUBLET_TOKEN: token }, /http:\/\/ or https:\/\//],
      [['--server', base, '--repository', String(repository.id), '--label', 'v9', '--colour', folder], { DOUBLET_TOKEN: token }, /Unknown option/],
      [['--server', base, '--repository', String(repository.id), '--label', 'v9', '--wait', '--no-wait', folder], { DOUBLET_TOKEN: token }, /exclude each other/],
      [['--server', base, '--label', 'v9', '--format', 'xml', folder], { DOUBLET_TOKEN: token }, /--format must be text, json or sarif \(got "xml"\)/],
    ];
    for (const [args, env, message] of cases) {
      const result = await push(args, env);
      expect(result.code, args.join(' ')).toBe(PUSH_EXIT.error);
      expect(result.stderr, args.join(' ')).toMatch(message);
      expect(result.stdout).toBe('');
    }
    // The label v2 holds another archive (the first test's): a 409 from the server, in words.
    fs.writeFileSync(path.join(folder, 'billing', 'late-fee.js'), 'export function lateFee(days) { return days * 12; }\n');
    const taken = await push(['--server', base, '--repository', String(repository.id), '--label', 'v2', folder]);
    expect(taken.code).toBe(PUSH_EXIT.error);
    expect(taken.stderr).toMatch(/HTTP 409/);
    const after = await select<{ n: number }>(undefined, 'select count(*)::int as n from snapshots where repository_id = $1', [repository.id]);
    expect(after).toEqual(before);
  }, 120_000);

  it('finds the repository from the token alone, and writes the new and drifted classes as a SARIF 2.1.0 log that validates and points at the real lines', async () => {
    const own = await buildRepository({ organisationId: repository.organisationId });
    const ownToken = ((await lead.post('/api/tokens').send({ name: 'CI push, token only', repositoryId: own.id }).expect(201)).body as CreatedApiTokenDTO).token;
    const saved = process.env.DOUBLET_REPOSITORY;
    delete process.env.DOUBLET_REPOSITORY;
    try {
      const first = await push(['--server', base, '--label', 'v1', path.join(RELEASES, 'v1')], { DOUBLET_TOKEN: ownToken });
      expect(first.code, first.stderr).toBe(PUSH_EXIT.ok);
      expect(first.stdout).toMatch(new RegExp(`^${own.name} v1: `, 'm'));
      // v2 fixes the pricing rule in one copy only: that class drifts. The checkout also gets a
      // renamed copy of summariseInvoice (billing/tariff.js lines 15–24) at lines 4–13 of a new
      // file whose name needs percent-encoding: a new class.
      const checkout = path.join(work, 'checkout-v2');
      fs.cpSync(path.join(RELEASES, 'v2'), checkout, { recursive: true });
      const tariff = fs.readFileSync(path.join(checkout, 'billing', 'tariff.js'), 'utf8').split('\n');
      expect(tariff[14]).toMatch(/^export function summariseInvoice\(/);
      const copy = tariff.slice(14, 24).join('\n').replace('summariseInvoice', 'customerTotals');
      fs.mkdirSync(path.join(checkout, 'reports'));
      fs.writeFileSync(path.join(checkout, 'reports', 'customer totals.js'), `// Customer totals for the monthly statement.\n// (Brackenfold Rail Freight.)\n\n${copy}\n`);
      const file = path.join(work, 'doublet.sarif');
      const second = await push(['--server', base, '--label', 'v2', '--format', 'sarif', '--out', file, checkout], { DOUBLET_TOKEN: ownToken });
      expect(second.code, second.stderr).toBe(PUSH_EXIT.ok);
      expect(second.stdout).toBe('');
      const log = JSON.parse(fs.readFileSync(file, 'utf8')) as SarifLog;

      // The official SARIF 2.1.0 JSON schema (rtm.5, as shipped by the npm package @microsoft/jest-sarif),
      // checked with ajv; it is draft-04, and one of its patterns is not valid in unicode mode.
      const ajv = new Ajv({ allErrors: true, strict: false, unicodeRegExp: false });
      addFormats(ajv);
      const validate = ajv.compile(schema);
      expect(validate(log), JSON.stringify(validate.errors)).toBe(true);

      const [run] = log.runs;
      expect(run.tool.driver.name).toBe('Doublet');
      expect(run.tool.driver.rules!.map((r) => r.id)).toEqual(['new-clone-class', 'drifted-clone-class']);
      expect(run.properties).toMatchObject({ verdict: 'none', budget: null, snapshot: { label: 'v2' } });
      const [snapshot] = await select<{ id: number }>(undefined, 'select id from snapshots where repository_id = $1 and label = $2', [own.id, 'v2']);
      const counts = await select<{ status: string; n: number }>(
        undefined,
        `select status, count(*)::int as n from clone_classes where snapshot_id = $1 and status in ('new', 'drifted') group by status`,
        [snapshot.id],
      );
      const byRule = (rule: string) => run.results.filter((r) => r.ruleId === rule).length;
      expect({ new: byRule('new-clone-class'), drifted: byRule('drifted-clone-class') }).toEqual({
        new: counts.find((c) => c.status === 'new')?.n ?? 0,
        drifted: counts.find((c) => c.status === 'drifted')?.n ?? 0,
      });
      const drifted = run.results.find((r) => r.ruleId === 'drifted-clone-class');
      expect(drifted?.locations?.map((l) => l.physicalLocation.artifactLocation.uri)).toContain('billing/tariff.js');
      const planted = run.results.find((r) => r.ruleId === 'new-clone-class' && r.message.text.includes('customerTotals'));
      const where = (planted?.locations ?? []).map((l) => ({ uri: l.physicalLocation.artifactLocation.uri, ...l.physicalLocation.region, name: l.message?.text }));
      expect(where.sort((a, b) => a.uri.localeCompare(b.uri))).toEqual([
        { uri: 'billing/tariff.js', startLine: 15, endLine: 24, name: 'summariseInvoice' },
        { uri: 'reports/customer%20totals.js', startLine: 4, endLine: 13, name: 'customerTotals' },
      ]);
      for (const result of run.results) {
        expect(result.level).toBe('warning');
        expect(result.message.text).toMatch(/near copies, similarity [\d.–]+, \d+ tokens: /);
        for (const location of result.locations ?? []) {
          const { artifactLocation, region } = location.physicalLocation;
          expect(artifactLocation.uriBaseId).toBe('%SRCROOT%');
          // The member's real file in the pushed folder, its function starting on startLine and ending by endLine.
          const lines = fs.readFileSync(path.join(checkout, decodeURIComponent(artifactLocation.uri)), 'utf8').split('\n');
          expect(region!.endLine!).toBeLessThanOrEqual(lines.length);
          expect(region!.startLine).toBeLessThanOrEqual(region!.endLine!);
          expect(lines[region!.startLine - 1], `${artifactLocation.uri}:${region!.startLine}`).toContain(location.message!.text);
          // Names and places only: no line of the member's code is in the log.
          const body = lines.slice(region!.startLine, region!.endLine).map((l) => l.trim()).filter((l) => l.length > 20);
          for (const line of body) expect(JSON.stringify(log)).not.toContain(line);
        }
      }
    } finally {
      if (saved !== undefined) process.env.DOUBLET_REPOSITORY = saved;
    }
  }, 180_000);
});
