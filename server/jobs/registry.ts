import type { JobDefinition } from './definition';

/**
 * Every job kind, by queue name: one file a job under server/jobs/, listed here. Workers work
 * every queue listed; `send()` accepts only these names, with the data type of their handler.
 * Each is imported when first needed, so a process that only queues a job (the command line, a
 * web request) does not load every handler's dependencies (archives, git, mail) at start-up.
 */
const JOBS = {
  'mail.send': () => import('./mail-send').then((m) => m.mailSendJob),
  'snapshot.load': () => import('./snapshot-load').then((m) => m.snapshotLoadJob),
  'snapshot.load-abandoned': () => import('./snapshot-load').then((m) => m.snapshotLoadAbandonedJob),
  'git.import': () => import('./git-import').then((m) => m.gitImportJob),
  'load.notices': () => import('./load-notices').then((m) => m.loadNoticesJob),
} as const;

/** A queue name of a registered job. */
export type QueueName = keyof typeof JOBS;

/** The data a queue's jobs carry. */
export type JobData<Q extends QueueName> = Awaited<ReturnType<(typeof JOBS)[Q]>> extends JobDefinition<infer T> ? T : never;

/** Every registered queue name. */
export const QUEUE_NAMES = Object.keys(JOBS) as QueueName[];

/** The definition of one registered queue, checked to be listed under its own queue name. */
export async function jobDefinition(queue: QueueName): Promise<JobDefinition<object>> {
  const definition = await JOBS[queue]();
  if (definition.queue !== queue) throw new Error(`job "${definition.queue}" is listed as "${queue}" in server/jobs/registry.ts`);
  return definition as unknown as JobDefinition<object>;
}

/** Every registered definition (what a worker works). */
export function jobDefinitions(): Promise<JobDefinition<object>[]> {
  return Promise.all(QUEUE_NAMES.map(jobDefinition));
}
