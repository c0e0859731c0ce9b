/**
 * Background jobs on pg-boss, in the app's own PostgreSQL: one PgBoss a process (startJobs /
 * stopJobs), the registry of job kinds (one file each in this folder), and send() for callers.
 */
export { startJobs, stopJobs, send, waitingJobs, jobQueue, isWorking, type StartJobsOptions, type SendJobOptions } from './queue';
export { startEmbedded, stopEmbedded } from './embedded';
export { jobDefinitions, type QueueName, type JobData } from './registry';
export { defineJob, type JobDefinition, type JobContext } from './definition';
