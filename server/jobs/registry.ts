import type { JobDefinition } from './definition';
import { gitImportJob } from './git-import';
import { loadNoticesJob } from './load-notices';
import { mailSendJob } from './mail-send';
import { snapshotLoadAbandonedJob, snapshotLoadJob } from './snapshot-load';

/**
 * Every job kind, by queue name: one file a job under server/jobs/, listed here. Workers work
 * every queue listed; `send()` accepts only these names, with the data type of their handler.
 */
export const JOBS = {
  'mail.send': mailSendJob,
  'snapshot.load': snapshotLoadJob,
  'snapshot.load-abandoned': snapshotLoadAbandonedJob,
  'git.import': gitImportJob,
  'load.notices': loadNoticesJob,
} as const;

/** A queue name of a registered job. */
export type QueueName = keyof typeof JOBS;

/** The data a queue's jobs carry. */
export type JobData<Q extends QueueName> = (typeof JOBS)[Q] extends JobDefinition<infer T> ? T : never;

/** The registered definitions, each checked to be listed under its own queue name. */
export function jobDefinitions(): JobDefinition<object>[] {
  return Object.entries(JOBS).map(([name, definition]) => {
    if (definition.queue !== name) throw new Error(`job "${definition.queue}" is listed as "${name}" in server/jobs/registry.ts`);
    return definition as unknown as JobDefinition<object>;
  });
}
