import { db } from '../db/connection';
import { defineRoutes } from './define';

/**
 * GET /api/health: the process is up and reaches its database (public, for load balancers and
 * start scripts). While PostgreSQL is unreachable it answers 503 `database_unavailable`.
 */
export const healthRoutes = defineRoutes('', [
  {
    method: 'get',
    path: '/health',
    guard: 'public',
    handler: async (_req, res) => {
      await db().query('select 1');
      res.json({ ok: true });
    },
  },
]);
