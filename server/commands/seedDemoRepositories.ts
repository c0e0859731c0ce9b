import path from 'node:path';
import { projectRoot } from '../config';
import { readFolder } from '../ingest/folder';
import type { Organisation } from '../models/Organisation';
import { createRepository, repositorySettings } from './createRepository';
import { loadSnapshot } from './loadSnapshot';
import { seedDemoTasks } from './seedDemoTasks';

const DEMO = path.join(projectRoot, 'server', 'demo');

/** The demo repositories: folder under server/demo, release folders and the labels they load as. */
const DEMO_REPOSITORIES = [
  {
    name: 'freight-platform',
    description: 'Consignment billing, yard planning and inspection tools.',
    cloneBudget: 0.4,
    releases: [['v1', '2026.09'], ['v2', '2026.10'], ['v3', '2026.11']],
  },
  {
    name: 'depot-tools',
    description: 'Scripts the maintenance depot runs on its own.',
    cloneBudget: null,
    releases: [['2026.11', '2026.11']],
  },
] as const;

/**
 * Loads the invented demo repositories into the demo organisation, release after release, so a
 * first start shows classes, a trend, a drifted class and a match across repositories.
 */
export async function seedDemoRepositories(organisation: Organisation): Promise<string[]> {
  const lines: string[] = [];
  for (const demo of DEMO_REPOSITORIES) {
    const repository = await createRepository(organisation.id, { name: demo.name, description: demo.description, cloneBudget: demo.cloneBudget });
    for (const [folder, label] of demo.releases) {
      const { files, skipped } = await readFolder(path.join(DEMO, demo.name, folder), { ignore: repository.ignore });
      const result = await loadSnapshot({ repository: repositorySettings(repository), label, files, skipped, source: 'folder' });
      lines.push(`  ${demo.name}@${label}: ${result.fragmentCount} fragments, ${result.classCount} clone classes`);
    }
  }
  lines.push(...(await seedDemoTasks(organisation))); // two refactor tasks on the loaded classes (commands/seedDemoTasks.ts)
  return lines;
}
