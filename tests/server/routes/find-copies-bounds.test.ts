import type { Express } from 'express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeSnippetPool } from '../../../analyzers';
import { createApp } from '../../../server/app';
import { buildRepository, buildTeam, signedInAgent, useDatabase } from '../../support';
import { cpuDuring, cpuWhileBusy, PATHOLOGICAL_TS } from '../../support/cpu';

useDatabase();

let app: Express;
beforeAll(() => {
  app = createApp();
});
afterAll(() => closeSnippetPool());

/** The input of the hardening report: 24,999 nested lambdas, under the 200,000-character limit. */
const NESTED_LAMBDAS = `f = ${'lambda: '.repeat(24_999)}1\n`;

describe('POST /api/find-copies under the analysis bounds', () => {
  it('answers the nested-lambda snippet with 422 naming the nesting limit within seconds, and the server still answers', async () => {
    const team = await buildTeam();
    await buildRepository({ organisationId: team.organisation.id });
    const engineer = await signedInAgent(app, team.engineer);
    expect(NESTED_LAMBDAS.length).toBeLessThan(200_000);
    const started = Date.now();
    const res = await engineer.post('/api/find-copies').send({ language: 'python', text: NESTED_LAMBDAS }).expect(422);
    expect(Date.now() - started).toBeLessThan(15_000);
    expect(res.body.error).toEqual({
      code: 'analysis_limit',
      message: 'the snippet was refused: functions and classes nested more than 100 deep (nesting limit)',
      field: 'text',
    });
    await engineer.get('/api/health').expect(200);
  }, 30_000);

  it('stops analysing a snippet when the client disconnects', async () => {
    const team = await buildTeam();
    await buildRepository({ organisationId: team.organisation.id });
    const engineer = await signedInAgent(app, team.engineer);
    const request = engineer.post('/api/find-copies').timeout(60_000).send({ language: 'typescript', text: PATHOLOGICAL_TS });
    const gone = new Promise<string>((resolve) => {
      request.on('abort', () => resolve('client gone'));
      request.then(
        () => resolve('answered'),
        (error: unknown) => resolve(String(error)),
      );
    });
    const { busy, window } = await cpuWhileBusy(200);
    request.abort();
    expect(await gone).toBe('client gone');
    await new Promise((resolve) => setTimeout(resolve, 500));
    const after = await cpuDuring(window);
    expect(busy).toBeGreaterThan(200);
    expect(after).toBeLessThan(busy / 2);
    await engineer.get('/api/health').expect(200);
  }, 60_000);
});
