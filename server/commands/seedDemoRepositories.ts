import os from 'node:os';
import { AnalyzerPool } from '../../analyzers';
import { generateDemo, type Demo } from '../demo/generator/story';
import { User } from '../models/User';
import type { Organisation } from '../models/Organisation';
import type { Repository } from '../models/Repository';
import { allSnapshotClasses } from '../queries/classes';
import { latestReadySnapshot } from '../queries/repositories';
import { createRepository, repositorySettings } from './createRepository';
import { loadSnapshot } from './loadSnapshot';
import { waiveLineage } from './waivers';

/**
 * Loads the generated demo repositories (server/demo/generator: the same code on every run) into
 * the organisation, release after release in the order of their dates, and waives what the story
 * waives, in the name of the organisation's first lead. Loads run here, in process and one after
 * another (in one pool of analyzer threads), so a first start is deterministic. Reports each load
 * through `log`.
 */
export async function seedDemoRepositories(organisation: Organisation, log: (line: string) => void = () => {}, demo: Demo = generateDemo()): Promise<void> {
  const lead = await User.findOne({ where: { organisationId: organisation.id, role: 'lead' }, order: [['createdAt', 'ASC']] });
  if (!lead) throw new Error('The demo organisation needs a lead: the demo waives a clone class in a lead’s name.');
  const repositories = new Map<string, Repository>();
  for (const r of demo.repositories) {
    repositories.set(r.name, await createRepository(organisation.id, { name: r.name, description: r.description, cloneBudget: r.cloneBudget }));
  }
  // one pool for the fifty loads: its threads start once, not once a load
  const pool = new AnalyzerPool(os.availableParallelism());
  try {
    await runSteps(demo, repositories, lead, pool, log);
  } finally {
    await pool.close();
  }
}

async function runSteps(demo: Demo, repositories: Map<string, Repository>, lead: User, pool: AnalyzerPool, log: (line: string) => void): Promise<void> {
  for (const step of demo.steps) {
    if ('load' in step) {
      const repository = repositories.get(step.load.repository)!;
      const release = demo.repositories.find((r) => r.name === step.load.repository)!.releases.find((r) => r.label === step.load.label)!;
      const files = release.files.map((f) => ({ path: f.path, content: Buffer.from(f.text, 'utf8') }));
      const result = await loadSnapshot({ repository: repositorySettings(repository), label: release.label, files, source: 'folder' }, { pool });
      log(`  ${repository.name}@${release.label}: ${result.fragmentCount} fragments, ${result.classCount} clone classes, clone ratio ${(result.cloneRatio * 100).toFixed(1)} %`);
    } else {
      const { repository: name, paths, reason } = step.waive;
      const repository = repositories.get(name)!;
      const latest = await latestReadySnapshot(repository.id);
      if (!latest) throw new Error(`The demo waives a class of ${name} before any release of it is loaded.`);
      // every class between the two files the story names, and nothing else
      const waived = (await allSnapshotClasses(latest.id)).filter((c) => c.paths.length === paths.length && c.paths.every((p) => paths.includes(p)));
      for (const c of waived) await waiveLineage({ lineageId: c.lineageId, repositoryId: repository.id }, { reason, untilLabel: null, createdBy: lead.id });
      log(`  ${name}: ${waived.length} clone ${waived.length === 1 ? 'class' : 'classes'} waived by ${lead.name}`);
    }
  }
}
