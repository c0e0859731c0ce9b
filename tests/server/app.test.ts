import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { useDatabase } from '../support';

useDatabase();

describe('createApp', () => {
  it('answers the health check without a session', async () => {
    const res = await request(createApp()).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ ok: true });
  });

  it('answers GET /api/repositories without a session with 401 and the JSON error shape', async () => {
    const res = await request(createApp()).get('/api/repositories');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });
});
