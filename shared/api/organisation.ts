/**
 * API types of /api/organisation: what the overview reads across every repository of the
 * reader's organisation — the latest loads and the organisation's clone ratio over time.
 */
import { z } from 'zod';
import type { SnapshotStatus } from './snapshots';

/** Query of GET /api/organisation/loads. */
export const latestLoadsQuerySchema = z.object({
  limit: z.coerce.number().int('A whole number of loads.').min(1, 'At least 1 load.').max(50, 'At most 50 loads.').default(8),
});

/** A recent load: one snapshot of a repository, whatever its status. */
export interface LoadDTO {
  snapshotId: number;
  label: string;
  status: SnapshotStatus;
  /** why it failed (failed loads only) */
  error: string | null;
  cloneRatio: number | null;
  createdAt: string;
  updatedAt: string;
  repository: { id: number; name: string };
}

/** GET /api/organisation/loads, newest first. */
export interface LatestLoadsDTO {
  loads: LoadDTO[];
}

/** Most points GET /api/organisation/trend returns (the latest ones). */
export const ORGANISATION_TREND_POINTS = 200;

/** The organisation's clone ratio right after one load. */
export interface OrganisationTrendPointDTO {
  snapshotId: number;
  /** the load that moved the figure */
  repositoryName: string;
  label: string;
  createdAt: string;
  /** repositories with a ready snapshot at that point */
  repositoryCount: number;
  fragmentTokens: number;
  clonedTokens: number;
  /** cloned tokens over fragment tokens of every repository's latest snapshot at that point */
  cloneRatio: number;
}

/** GET /api/organisation/trend, oldest first. */
export interface OrganisationTrendDTO {
  points: OrganisationTrendPointDTO[];
}
