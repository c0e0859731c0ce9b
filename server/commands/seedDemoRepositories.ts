import path from 'node:path';
import { analyzeFiles } from '../../analyzers';
import type { FileAnalysis, SkippedFile, SourceFile } from '../../analyzers/types';
import { analyzeOptions, optionsKey } from '../clone-index/options';
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
 * another, so a first start is deterministic. Reports each load through `log`.
 */
export async function seedDemoRepositories(organisation: Organisation, log: (line: string) => void = () => {}, demo: Demo = generateDemo()): Promise<void> {
  const lead = await User.findOne({ where: { organisationId: organisation.id, role: 'lead' }, order: [['createdAt', 'ASC']] });
  if (!lead) throw new Error('The demo organisation needs a lead: the demo waives a clone class in a lead’s name.');
  const repositories = new Map<string, Repository>();
  for (const r of demo.repositories) {
    repositories.set(r.name, await createRepository(organisation.id, { name: r.name, description: r.description, cloneBudget: r.cloneBudget }));
  }
  const analyze = await analyzedOnce(demo, repositorySettings([...repositories.values()][0]));
  for (const step of demo.steps) {
    if ('load' in step) {
      const repository = repositories.get(step.load.repository)!;
      const release = demo.repositories.find((r) => r.name === step.load.repository)!.releases.find((r) => r.label === step.load.label)!;
      const files = release.files.map((f) => ({ path: f.path, content: Buffer.from(f.text, 'utf8') }));
      const result = await loadSnapshot({ repository: repositorySettings(repository), label: release.label, files, source: 'folder', analyze });
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

/**
 * Analyses every distinct text of every demo release once, in one pool, and returns an analyzer
 * that answers each load from those results: the same analyses a pool per load would give (a
 * file's analysis depends only on its text, its language and the options), without a pool's
 * start-up for each of the fifty loads. Asked with other options, or about other texts, it
 * analyses as usual.
 */
async function analyzedOnce(demo: Demo, settings: Parameters<typeof analyzeOptions>[0]): Promise<typeof analyzeFiles> {
  const options = analyzeOptions(settings);
  const key = (file: { path: string; text: string }) => `${path.extname(file.path).toLowerCase()}\u0000${file.text}`;
  const distinct = new Map<string, SourceFile>();
  for (const file of demo.repositories.flatMap((r) => r.releases.flatMap((x) => x.files))) {
    // a folder of its own for each text: one path may hold several texts over the releases
    if (!distinct.has(key(file))) distinct.set(key(file), { path: `${distinct.size}/${file.path}`, content: Buffer.from(file.text, 'utf8') });
  }
  const all = await analyzeFiles([...distinct.values()], { ...options, ignore: [] });
  const keyByPath = new Map([...distinct.entries()].map(([k, f]) => [f.path, k]));
  const byKey = new Map<string, FileAnalysis | SkippedFile>([...all.files, ...all.skipped].map((x) => [keyByPath.get(x.path)!, x]));
  const decoder = new TextDecoder();
  return async (files, asked = {}) => {
    const { workers: _w, timeoutMs: _t, ignore: _i, maxFileBytes: _m, ...rest } = asked;
    const known = files.map((f) => byKey.get(key({ path: f.path, text: decoder.decode(f.content) })));
    if (optionsKey(rest) !== optionsKey(options) || known.some((x) => x === undefined)) return analyzeFiles(files, asked);
    const out = { files: [] as FileAnalysis[], skipped: [] as SkippedFile[] };
    known.forEach((x, i) => ('reason' in x! ? out.skipped.push({ ...x, path: files[i].path }) : out.files.push({ ...x!, path: files[i].path })));
    return out;
  };
}
