import { defineRoutes } from './define';

/** GET /api/health: the process is up (public, for load balancers and start scripts). */
export const healthRoutes = defineRoutes('', [
  {
    method: 'get',
    path: '/health',
    guard: 'public',
    handler: (_req, res) => res.json({ ok: true }),
  },
]);
