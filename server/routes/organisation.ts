import { latestLoadsQuerySchema, ORGANISATION_TREND_POINTS, type LatestLoadsDTO, type OrganisationTrendDTO } from '../../shared/api/organisation';
import { currentUser } from '../auth/current-user';
import { authorize } from '../policies';
import { latestLoads, readySnapshotFigures } from '../queries/organisation';
import { organisationTrend } from '../reports/organisation-trend';
import { defineRoutes } from './define';
import { parse } from './validate';

/** /api/organisation: the reader's organisation across all its repositories (the overview's figures). */
export const organisationRoutes = defineRoutes('/organisation', [
  {
    method: 'get',
    path: '/loads',
    guard: 'snapshots.read',
    handler: async (req, res) => {
      const { limit } = parse(latestLoadsQuerySchema, req.query);
      const actor = currentUser(req);
      authorize(actor, 'snapshots.read', { organisationId: actor.organisationId });
      const answer: LatestLoadsDTO = {
        loads: (await latestLoads(actor.organisationId, limit)).map((l) => ({
          snapshotId: l.id,
          label: l.label,
          status: l.status,
          error: l.status === 'failed' ? l.error : null,
          cloneRatio: l.cloneRatio,
          createdAt: l.createdAt.toISOString(),
          updatedAt: l.updatedAt.toISOString(),
          repository: { id: l.repositoryId, name: l.repositoryName },
        })),
      };
      res.json(answer);
    },
  },
  {
    method: 'get',
    path: '/trend',
    guard: 'snapshots.read',
    handler: async (req, res) => {
      const actor = currentUser(req);
      authorize(actor, 'snapshots.read', { organisationId: actor.organisationId });
      const rows = await readySnapshotFigures(actor.organisationId);
      const points = organisationTrend(
        rows.map((r) => ({ ...r, fragmentTokens: Number(r.fragmentTokens), clonedTokens: Number(r.clonedTokens) })),
        ORGANISATION_TREND_POINTS,
      );
      const answer: OrganisationTrendDTO = { points: points.map((p) => ({ ...p, createdAt: p.createdAt.toISOString() })) };
      res.json(answer);
    },
  },
]);
