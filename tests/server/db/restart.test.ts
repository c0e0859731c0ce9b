import fs from 'node:fs';
import type { Server } from 'node:http';
import net, { type AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import type { Express } from 'express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { connect, disconnect } from '../../../server/db/connection';
import { migrateUp } from '../../../server/db/migrate';
import { clusterDatabaseUrl, createDatabaseIfMissing, startCluster, stopCluster, type ClusterOptions } from '../../../server/db/postgres';
import { initModels } from '../../../server/models';
import { buildRepository, buildUser, signedInAgent, type Agent } from '../../support';

/**
 * PostgreSQL restarted under a running server. This file runs a throwaway cluster of its own (not
 * the suite's shared one, which other files use in parallel), so it can stop and start it.
 */

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = net.createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const { port } = probe.address() as AddressInfo;
      probe.close(() => resolve(port));
    });
  });
}

// Small, so a second postmaster on a shared machine costs little.
const SETTINGS = ['shared_buffers=16MB', 'max_connections=20', 'fsync=off', 'jit=off'];

let tmp: string;
let cluster: ClusterOptions;
let server: Server;
let base: string;

beforeAll(async () => {
  tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'doublet-pg-restart-'));
  cluster = { dataDir: path.join(tmp, 'data'), port: await freePort(), settings: SETTINGS };
  startCluster(cluster);
  await createDatabaseIfMissing('doublet', clusterDatabaseUrl(cluster.port, 'postgres'));
  const sequelize = connect(clusterDatabaseUrl(cluster.port, 'doublet'));
  await migrateUp(sequelize);
  initModels(sequelize);
  server = createApp().listen(0, '127.0.0.1');
  await new Promise((resolve) => server.once('listening', resolve));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
}, 120_000);

afterAll(async () => {
  server?.closeAllConnections();
  await new Promise((resolve) => (server ? server.close(resolve) : resolve(undefined)));
  await disconnect();
  if (cluster) stopCluster(cluster);
  if (tmp) fs.rmSync(tmp, { recursive: true, force: true });
});

// supertest takes a base URL as well as an app: the requests go to the listening server.
const listening = (url: string) => url as unknown as Express;

describe('a running server while PostgreSQL restarts', () => {
  it('answers 503 database_unavailable while it is down, and serves the same session again once it is back', async () => {
    const lead = await buildUser({ role: 'lead' });
    const repository = await buildRepository({ organisationId: lead.organisationId, name: 'signal-box' });
    const agent: Agent = await signedInAgent(listening(base), lead);
    const before = await agent.get('/api/repositories').expect(200);
    expect(before.body.repositories.map((r: { name: string }) => r.name)).toEqual(['signal-box']);

    stopCluster(cluster);

    const down = await agent.get('/api/repositories');
    expect(down.status).toBe(503);
    expect(down.body.error.code).toBe('database_unavailable');
    expect(down.headers['retry-after']).toBe('5');
    const detail = await agent.get(`/api/repositories/${repository.id}`);
    expect(detail.status).toBe(503);
    const health = await agent.get('/api/health');
    expect(health.status).toBe(503);
    expect(health.body.error.code).toBe('database_unavailable');
    // An anonymous probe (no session to load) reaches the health check itself.
    const anonymousHealth = await fetch(`${base}/api/health`);
    expect(anonymousHealth.status).toBe(503);

    startCluster(cluster);

    const after = await agent.get('/api/repositories');
    expect(after.status).toBe(200);
    expect(after.body.repositories.map((r: { name: string }) => r.name)).toEqual(['signal-box']);
    await agent.get('/api/health').expect(200);
    // The session survived: a write that needs the same CSRF token and user still works.
    await agent.patch(`/api/repositories/${repository.id}`).send({ description: 'after the restart' }).expect(200);
  }, 120_000);
});
