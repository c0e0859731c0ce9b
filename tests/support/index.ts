/** Shared test helpers: database per file, factories, signed-in supertest agents. */
export { useDatabase } from './database';
export { TEST_PASSWORD, buildOrganisation, buildTeam, buildUser, uniqueEmail, type BuildUserOptions } from './factories';
export { anonymousAgent, signedInAgent, type Agent } from './agents';
export { buildRepository, describedPairs, loadFolder, RELEASES } from './snapshots';
export { PASTED_PRICING_RULE } from './snippets';
export { useMail, mailTo, invitationTokenMailedTo, QUICK_RETRIES, type MailHarness } from './mail';
export { useJobs, waitForSnapshot, type JobsHarness } from './jobs';
