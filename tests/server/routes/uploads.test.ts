import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';
import AdmZip from 'adm-zip';
import type { Express } from 'express';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { select } from '../../../server/clone-index/sql';
import { projectRoot } from '../../../server/config';
import { readFolder, storedArchivePath } from '../../../server/ingest';
import type { Repository } from '../../../server/models/Repository';
import type { CreatedApiTokenDTO } from '../../../shared/api/tokens';
import type { SnapshotAnswerDTO, SnapshotDTO } from '../../../shared/api/snapshots';
import { buildRepository, buildTeam, buildUser, describedPairs, loadFolder, RELEASES, signedInAgent, useDatabase, useJobs, waitForSnapshot, type Agent } from '../../support';
import { buildTar, buildZip, deflatedZeros, gzipAround, tarHeader } from '../ingest/build-archives';

useDatabase();
const jobs = useJobs({ work: true });

let app: Express;
let team: Awaited<ReturnType<typeof buildTeam>>;
const agents = {} as Record<'engineer' | 'otherEngineer' | 'lead' | 'viewer', Agent>;

beforeAll(async () => {
  app = createApp();
  team = await buildTeam();
  agents.engineer = await signedInAgent(app, team.engineer);
  agents.lead = await signedInAgent(app, team.lead);
  agents.viewer = await signedInAgent(app, team.viewer);
  agents.otherEngineer = await signedInAgent(app, await buildUser({ role: 'engineer', organisation: team.organisation }));
});

/** A zip of a folder as people make them: one top folder holding the release. */
function zipOf(folder: string, top = 'release'): Buffer {
  const zip = new AdmZip();
  zip.addLocalFolder(folder, top);
  return zip.toBuffer();
}

const demoV1 = () => zipOf(`${RELEASES}/v1`, 'freight-platform-v1');

function upload(agent: Agent | request.SuperTest<request.Test>, repositoryId: number, label: string | undefined, archive: Buffer | undefined, name = 'release.zip') {
  let req = agent.post(`/api/repositories/${repositoryId}/snapshots`);
  if (label !== undefined) req = req.field('label', label);
  if (archive !== undefined) req = req.attach('archive', archive, name);
  return req;
}

async function repositoryRows(repository: Repository) {
  const [row] = await select<{ snapshots: string }>(undefined, 'select count(*) as snapshots from snapshots where repository_id = $1', [repository.id]);
  return Number(row.snapshots);
}

/** Files left in the upload folder (incoming temporary files and kept archives). */
function uploadFolderFiles(): string[] {
  const found: string[] = [];
  const walk = (dir: string) => {
    if (!fs.existsSync(dir)) return;
    for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
      if (entry.isDirectory()) walk(path.join(dir, entry.name));
      else found.push(path.join(dir, entry.name));
    }
  };
  walk(jobs.uploadDir);
  return found;
}

describe('POST /api/repositories/:id/snapshots', () => {
  it('queues an engineer\'s zip (202, status queued, progress), and the load ends ready with the pairs of the same folder loaded directly', async () => {
    const repository = await buildRepository({ organisationId: team.organisation.id });
    const res = await upload(agents.engineer, repository.id, '2026.09', demoV1());
    expect(res.status, JSON.stringify(res.body)).toBe(202);
    const { snapshot } = res.body as SnapshotAnswerDTO;
    expect(snapshot).toMatchObject({ repositoryId: repository.id, label: '2026.09', source: 'archive', status: 'queued', startedById: team.engineer.id, error: null });
    expect(snapshot.progress).toEqual({ phase: 'unpacking', done: 0, total: 0 });

    const ready = await waitForSnapshot(snapshot.id);
    expect(ready.status, ready.error ?? '').toBe('ready');
    const read = (await agents.viewer.get(`/api/snapshots/${snapshot.id}`).expect(200)).body as SnapshotDTO;
    expect(read).toMatchObject({ status: 'ready', progress: null, error: null });
    expect(read.metrics?.classCount).toBeGreaterThan(0);
    // The archive was deleted once the load had read it.
    expect(fs.existsSync(storedArchivePath(snapshot.id))).toBe(false);
    expect(uploadFolderFiles()).toEqual([]);

    const direct = await buildRepository();
    const { snapshotId } = await loadFolder(direct, `${RELEASES}/v1`, 'v1');
    expect(await describedPairs(snapshot.id, repository.threshold)).toEqual(await describedPairs(snapshotId, direct.threshold));
  }, 120_000);

  it('answers the same archive sent again under its label with the existing snapshot; another archive under that label is 409 naming it', async () => {
    const repository = await buildRepository({ organisationId: team.organisation.id });
    const archive = demoV1();
    const first = await upload(agents.engineer, repository.id, 'r1', archive).expect(202);
    const again = await upload(agents.lead, repository.id, 'r1', archive);
    expect(again.status).toBe(200);
    expect((again.body as SnapshotAnswerDTO).snapshot.id).toBe(first.body.snapshot.id);

    const other = await upload(agents.engineer, repository.id, 'r1', zipOf(`${RELEASES}/v2`));
    expect(other.status).toBe(409);
    expect(other.body.error).toMatchObject({ code: 'conflict', field: 'label' });
    expect(other.body.error.message).toContain('"r1"');
    expect(await repositoryRows(repository)).toBe(1);
    await waitForSnapshot(first.body.snapshot.id);
    expect(uploadFolderFiles()).toEqual([]);
  }, 120_000);

  it('answers two different archives racing for one new label with one 202 and one 409, never 500', async () => {
    const repository = await buildRepository({ organisationId: team.organisation.id });
    const answers = await Promise.all([
      upload(agents.engineer, repository.id, 'race', zipOf(`${RELEASES}/v1`)),
      upload(agents.lead, repository.id, 'race', zipOf(`${RELEASES}/v2`)),
      upload(agents.otherEngineer, repository.id, 'race', zipOf(`${RELEASES}/v3`)),
    ]);
    expect(answers.map((a) => a.status).sort()).toEqual([202, 409, 409]);
    for (const a of answers.filter((a) => a.status === 409)) expect(a.body.error.field).toBe('label');
    expect(await repositoryRows(repository)).toBe(1);
    await waitForSnapshot(answers.find((a) => a.status === 202)!.body.snapshot.id);
    expect(uploadFolderFiles()).toEqual([]);
  }, 120_000);

  it('lets an upload token queue a load for its own repository only', async () => {
    const repository = await buildRepository({ organisationId: team.organisation.id });
    const sibling = await buildRepository({ organisationId: team.organisation.id });
    const created = (await agents.lead.post('/api/tokens').send({ name: 'CI push', repositoryId: repository.id }).expect(201)).body as CreatedApiTokenDTO;
    const bearer = { Authorization: `Bearer ${created.token}` };
    const own = await request(app).post(`/api/repositories/${repository.id}/snapshots`).set(bearer).field('label', 'ci-1').attach('archive', demoV1(), 'r.zip');
    expect(own.status, JSON.stringify(own.body)).toBe(202);
    expect(own.body.snapshot.startedById).toBeNull();
    const other = await request(app).post(`/api/repositories/${sibling.id}/snapshots`).set(bearer).field('label', 'ci-1').attach('archive', demoV1(), 'r.zip');
    expect(other.status).toBe(403);
    expect(await repositoryRows(sibling)).toBe(0);
    await waitForSnapshot(own.body.snapshot.id);
  }, 120_000);

  it('answers 400 naming the field for a missing label or archive, a JSON body, a control character or an extra file', async () => {
    const repository = await buildRepository({ organisationId: team.organisation.id });
    const cases: [request.Test, string][] = [
      [upload(agents.engineer, repository.id, undefined, demoV1()), 'label'],
      [upload(agents.engineer, repository.id, '   ', demoV1()), 'label'],
      [upload(agents.engineer, repository.id, 'x'.repeat(101), demoV1()), 'label'],
      [upload(agents.engineer, repository.id, 'r\u0007', demoV1()), 'label'],
      [upload(agents.engineer, repository.id, 'r1', undefined), 'archive'],
      [agents.engineer.post(`/api/repositories/${repository.id}/snapshots`).send({ label: 'r1' }), 'archive'],
      [upload(agents.engineer, repository.id, 'r1', demoV1()).attach('second', demoV1(), 'b.zip'), 'archive'],
    ];
    for (const [req, field] of cases) {
      const res = await req;
      expect(res.status, JSON.stringify(res.body)).toBe(400);
      expect(res.body.error.field).toBe(field);
    }
    expect(await repositoryRows(repository)).toBe(0);
    expect(uploadFolderFiles()).toEqual([]);
  });

  it('answers 404 for a repository of another organisation, before reading the upload', async () => {
    const foreign = await buildRepository();
    const res = await upload(agents.engineer, foreign.id, 'r1', demoV1());
    expect(res.status).toBe(404);
    expect(await repositoryRows(foreign)).toBe(0);
  });
});

describe('the attack corpus, uploaded: refused with 4xx and the reason, nothing stored', () => {
  const marker = `attack-${crypto.randomBytes(6).toString('hex')}`;
  const quote = Buffer.from(`export function ${marker.replace(/-/g, '_')}() { return 1; }\n`);
  const MIB = 1024 * 1024;

  const corpus: { name: string; file: string; bytes: () => Buffer; status: number; code: string; message: RegExp; env?: Record<string, string> }[] = [
    { name: 'a zip entry with ../', file: 'evil.zip', bytes: () => buildZip([{ name: 'ok.js', data: quote }, { name: '../../etc/cron.d/evil.js', data: quote }]), status: 422, code: 'path_escapes_root', message: /"\.\.\/\.\.\/etc\/cron\.d\/evil\.js" climbs out/ },
    { name: 'a tar with an absolute path', file: 'evil.tar', bytes: () => buildTar([{ name: 'ok.js', data: quote }, { name: '/etc/profile.d/evil.sh', data: quote }]), status: 422, code: 'path_escapes_root', message: /"\/etc\/profile\.d\/evil\.sh" is an absolute path/ },
    {
      name: 'a 100,000-entry zip (entry limit lowered to 50,000)',
      file: 'many.zip',
      bytes: () => buildZip(Array.from({ length: 100_000 }, (_, i) => ({ name: `f/${i}.js`, data: Buffer.alloc(0), method: 0 as const }))),
      status: 413,
      code: 'too_many_entries',
      message: /100000 entries; the limit is 50000/,
      env: { DOUBLET_MAX_ARCHIVE_ENTRIES: '50000' },
    },
    { name: 'a 4 MiB zip that unpacks to 4 GiB of zeros', file: 'bomb.zip', bytes: () => buildZip([{ name: 'ok.js', data: quote }, { name: 'zeros.js', deflated: deflatedZeros(4096), size: 1000, crc: 0 }]), status: 413, code: 'expansion_too_large', message: /decompression bomb/ },
    { name: 'a tar.gz that unpacks to gigabytes of zeros', file: 'bomb.tgz', bytes: () => gzipAround(deflatedZeros(4096, tarHeader({ name: 'dump.sql' }, 4096 * MIB))), status: 413, code: 'expansion_too_large', message: /decompression bomb/ },
    {
      name: 'a truncated zip',
      file: 'cut.zip',
      bytes: () => {
        const zip = buildZip([{ name: 'ok.js', data: quote }, { name: 'b.js', data: Buffer.alloc(5000, 0x62) }]);
        return zip.subarray(0, zip.length - 40);
      },
      status: 422,
      code: 'corrupt_archive',
      message: /corrupt or truncated/,
    },
    { name: 'a truncated tar.gz', file: 'cut.tgz', bytes: () => { const t = zlib.gzipSync(buildTar([{ name: 'ok.js', data: quote }, { name: 'a.js', data: Buffer.alloc(200_000, 0x61) }])); return t.subarray(0, Math.floor(t.length / 2)); }, status: 422, code: 'corrupt_archive', message: /corrupt or truncated/ },
    { name: 'a text file named .zip', file: 'release.zip', bytes: () => Buffer.from(`release notes ${marker}, not an archive\n`), status: 422, code: 'not_an_archive', message: /not a zip or tar archive/ },
    { name: 'an encrypted zip', file: 'locked.zip', bytes: () => buildZip([{ name: 'ok.js', data: quote }, { name: 'secret.js', data: quote, flags: 1 }]), status: 422, code: 'encrypted_archive', message: /"secret\.js" is encrypted/ },
    { name: 'an archive over the size limit (lowered to 1,000 bytes)', file: 'big.zip', bytes: () => buildZip([{ name: 'ok.js', data: Buffer.concat([quote, Buffer.alloc(5000, 0x20)]), method: 0 }]), status: 413, code: 'archive_too_large', message: /limit of 1000 bytes/, env: { DOUBLET_MAX_ARCHIVE_BYTES: '1000' } },
  ];

  for (const attack of corpus) {
    it(attack.name, async () => {
      const repository = await buildRepository({ organisationId: team.organisation.id });
      const saved = Object.fromEntries(Object.keys(attack.env ?? {}).map((k) => [k, process.env[k]]));
      Object.assign(process.env, attack.env);
      let res: request.Response;
      try {
        res = await upload(agents.engineer, repository.id, 'attack', attack.bytes(), attack.file);
      } finally {
        for (const [k, v] of Object.entries(saved)) {
          if (v === undefined) delete process.env[k];
          else process.env[k] = v;
        }
      }
      expect(res.status, JSON.stringify(res.body)).toBe(attack.status);
      expect(res.body.error.code).toBe(attack.code);
      expect(res.body.error.field).toBe('archive');
      expect(res.body.error.message).toMatch(attack.message);
      // Nothing stored: no snapshot row, no file text from the archive, no file left in the upload folder.
      expect(await repositoryRows(repository)).toBe(0);
      const [texts] = await select<{ n: string }>(undefined, 'select count(*) as n from file_contents where text like $1', [`%${marker.replace(/-/g, '_')}%`]);
      expect(texts.n).toBe('0');
      expect(uploadFolderFiles()).toEqual([]);
    }, 60_000);
  }

  it('skips a symbolic link to a file outside (never followed) and loads the rest', async () => {
    const repository = await buildRepository({ organisationId: team.organisation.id });
    const tar = buildTar([
      { name: 'r/ok.js', data: quote },
      { name: 'r/passwd.js', type: '2', linkname: '/etc/passwd' },
    ]);
    const res = await upload(agents.engineer, repository.id, 'links', tar, 'links.tar').expect(202);
    const done = await waitForSnapshot(res.body.snapshot.id);
    expect(done.status, done.error ?? '').toBe('ready');
    const rows = await select<{ path: string; skipReason: string | null }>(undefined, 'select path, skip_reason as "skipReason" from snapshot_files where snapshot_id = $1 order by path', [done.id]);
    expect(rows.map((r) => r.path)).toEqual(['ok.js', 'passwd.js']);
    expect(rows[1].skipReason).toMatch(/link/);
  }, 60_000);
});

describe('POST /api/snapshots/:id/cancel', () => {
  /** sequelize 6.37.8's lib from node_modules, each file salted so it is analysed afresh: a load that lasts a while. */
  async function slowArchive(): Promise<Buffer> {
    const { files } = await readFolder(path.join(projectRoot, 'node_modules', 'sequelize', 'lib'));
    const salt = crypto.randomBytes(8).toString('hex');
    return zlib.gzipSync(buildTar(files.map((f) => ({ name: `lib/${f.path}`, data: Buffer.concat([Buffer.from(f.content), Buffer.from(`\n// ${salt}\n`)]) }))));
  }

  async function jobState(snapshotId: number): Promise<string | undefined> {
    const [row] = await select<{ state: string }>(undefined, `select state from "${jobs.schema}".job where name = 'snapshot.load' and data->>'snapshotId' = $1`, [String(snapshotId)]);
    return row?.state;
  }

  it('stops a running load at its next checkpoint: cancelled, nothing of it written, the archive deleted', async () => {
    const repository = await buildRepository({ organisationId: team.organisation.id });
    const res = await upload(agents.engineer, repository.id, 'to-cancel', await slowArchive(), 'lib.tgz').expect(202);
    const id = res.body.snapshot.id as number;
    await waitForSnapshot(id, (s) => s.status !== 'queued' && s.status !== 'running' ? true : s.progress?.phase === 'analysing');
    const running = (await agents.viewer.get(`/api/snapshots/${id}`).expect(200)).body as SnapshotDTO;
    expect(running.status).toBe('running');
    expect(running.progress?.phase).toBe('analysing');

    // Another engineer may not; the one who started it may.
    expect((await agents.otherEngineer.post(`/api/snapshots/${id}/cancel`)).status).toBe(403);
    const cancelled = await agents.engineer.post(`/api/snapshots/${id}/cancel`);
    expect(cancelled.status, JSON.stringify(cancelled.body)).toBe(200);
    expect((cancelled.body as SnapshotAnswerDTO).snapshot).toMatchObject({ status: 'cancelled', progress: null });
    expect(fs.existsSync(storedArchivePath(id))).toBe(false);

    // The job ends (it stopped at a checkpoint) and leaves nothing of the snapshot.
    const deadline = Date.now() + 120_000;
    while ((await jobState(id)) !== 'completed' && Date.now() < deadline) await new Promise((r) => setTimeout(r, 200));
    expect(await jobState(id)).toBe('completed');
    const [left] = await select<{ files: string; classes: string; metrics: string; status: string }>(
      undefined,
      `select (select count(*) from snapshot_files where snapshot_id = $1) as files, (select count(*) from clone_classes where snapshot_id = $1) as classes,
              (select count(*) from snapshot_metrics where snapshot_id = $1) as metrics, (select status from snapshots where id = $1) as status`,
      [id],
    );
    expect(left).toEqual({ files: '0', classes: '0', metrics: '0', status: 'cancelled' });
    // Cancelling again: the load has ended.
    const again = await agents.lead.post(`/api/snapshots/${id}/cancel`);
    expect(again.status).toBe(409);
    expect(again.body.error.message).toContain('already ended (cancelled)');
  }, 180_000);

  it('deleting the repository mid-load deletes the kept archive, and the load stops writing nothing', async () => {
    const repository = await buildRepository({ organisationId: team.organisation.id });
    const res = await upload(agents.engineer, repository.id, 'deleted-midway', await slowArchive(), 'lib.tgz').expect(202);
    const id = res.body.snapshot.id as number;
    await waitForSnapshot(id, (s) => (s.status !== 'queued' && s.status !== 'running' ? true : s.progress?.phase === 'analysing'));
    expect(fs.existsSync(storedArchivePath(id))).toBe(true);
    await agents.lead.delete(`/api/repositories/${repository.id}`).expect(204);
    expect(fs.existsSync(storedArchivePath(id))).toBe(false);
    const deadline = Date.now() + 120_000;
    while ((await jobState(id)) !== 'completed' && Date.now() < deadline) await new Promise((r) => setTimeout(r, 200));
    expect(await jobState(id)).toBe('completed');
    const [left] = await select<{ files: string; snapshots: string }>(
      undefined,
      'select (select count(*) from snapshot_files where snapshot_id = $1) as files, (select count(*) from snapshots where id = $1) as snapshots',
      [id],
    );
    expect(left).toEqual({ files: '0', snapshots: '0' });
  }, 180_000);

  it('lets a lead cancel an engineer\'s load; a ready snapshot is 409; a viewer is 403', async () => {
    const repository = await buildRepository({ organisationId: team.organisation.id });
    const res = await upload(agents.engineer, repository.id, 'lead-cancels', await slowArchive(), 'lib.tgz').expect(202);
    const id = res.body.snapshot.id as number;
    expect((await agents.viewer.post(`/api/snapshots/${id}/cancel`)).status).toBe(403);
    const cancelled = await agents.lead.post(`/api/snapshots/${id}/cancel`);
    expect(cancelled.status, JSON.stringify(cancelled.body)).toBe(200);
    expect(cancelled.body.snapshot.status).toBe('cancelled');
    expect((await waitForSnapshot(id)).status).toBe('cancelled');

    // The label of a cancelled load is free again: a new upload takes it over.
    const retry = await upload(agents.engineer, repository.id, 'lead-cancels', demoV1());
    expect(retry.status, JSON.stringify(retry.body)).toBe(202);
    expect(retry.body.snapshot.id).not.toBe(id);
    expect(await repositoryRows(repository)).toBe(1);
    expect((await waitForSnapshot(retry.body.snapshot.id)).status).toBe('ready');

    const ready = await loadFolder(repository, `${RELEASES}/v1`, 'v1');
    const late = await agents.lead.post(`/api/snapshots/${ready.snapshotId}/cancel`);
    expect(late.status).toBe(409);
    expect(late.body.error.message).toContain('already ended (ready)');
  }, 120_000);
});
