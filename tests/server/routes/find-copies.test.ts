import type { Express } from 'express';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import type { FindCopiesResultDTO } from '../../../shared/api/find-copies';
import { PASTED_PRICING_RULE, buildRepository, buildTeam, loadFolder, RELEASES, signedInAgent, useDatabase } from '../../support';

useDatabase();

let app: Express;
beforeAll(() => {
  app = createApp();
});


describe('POST /api/find-copies', () => {
  it('finds every copy of a pasted function in the latest snapshots of the organisation, nothing below the threshold', async () => {
    const team = await buildTeam();
    const repository = await buildRepository({ organisationId: team.organisation.id });
    await loadFolder(repository, `${RELEASES}/v1`, 'v1');
    const elsewhere = await buildRepository();
    await loadFolder(elsewhere, `${RELEASES}/v1`, 'v1');
    const engineer = await signedInAgent(app, team.engineer);
    const res = (await engineer.post('/api/find-copies').send({ language: 'javascript', text: PASTED_PRICING_RULE, threshold: 0.9 }).expect(200)).body as FindCopiesResultDTO;
    expect(res.copies.map((c) => `${c.path}:${c.name}`).sort()).toEqual(['billing/tariff.js:priceConsignment', 'yard/shunting.js:quoteYardMove']);
    expect(res.copies.every((c) => c.repositoryId === repository.id && c.similarity >= 0.9)).toBe(true);
    const unrelated = (await engineer.post('/api/find-copies').send({ language: 'javascript', text: 'function f(a) { return a.map((x) => x * 2).filter(Boolean); }' }).expect(200)).body as FindCopiesResultDTO;
    expect(unrelated.copies).toEqual([]);
  });

  it('answers 400 for an unknown language, an empty snippet or a threshold under the index threshold; 403 to a viewer', async () => {
    const team = await buildTeam();
    const engineer = await signedInAgent(app, team.engineer);
    expect((await engineer.post('/api/find-copies').send({ language: 'cobol', text: 'x' }).expect(400)).body.error.field).toBe('language');
    expect((await engineer.post('/api/find-copies').send({ language: 'python', text: '' }).expect(400)).body.error.field).toBe('text');
    expect((await engineer.post('/api/find-copies').send({ language: 'python', text: 'x = 1', threshold: 0.3 }).expect(400)).body.error.field).toBe('threshold');
    await (await signedInAgent(app, team.viewer)).post('/api/find-copies').send({ language: 'python', text: 'x = 1' }).expect(403);
  });
});
