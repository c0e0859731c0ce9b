import { sendLoadNotices } from '../mail/load-notices';
import { defineJob } from './definition';

/**
 * `load.notices`: after a load commits, mails the notices its snapshot calls for (over its clone
 * budget, drifted classes). Queued by the load in its own transaction; safe to run twice (the
 * snapshot's notices are claimed once). Retried a few times if the database is briefly away.
 */
export const loadNoticesJob = defineJob<{ snapshotId: number }>({
  queue: 'load.notices',
  sendOptions: { retryLimit: 5, retryDelay: 30, retryBackoff: true, expireInSeconds: 300, retentionHours: 48 },
  handler: async ({ snapshotId }) => sendLoadNotices(snapshotId),
});
