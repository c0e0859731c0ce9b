import { beforeAll, describe, expect, it } from 'vitest';
import { clonePairsAcross, snapshotFragments } from '../../../server/clone-index/snapshot-pairs';
import { select } from '../../../server/clone-index/sql';
import { seedDemoRepositories } from '../../../server/commands/seedDemoRepositories';
import { generateDemo, type Demo, type FragmentRef } from '../../../server/demo/generator/story';
import { parseThreshold } from '../../../server/matching/threshold';
import type { Organisation } from '../../../server/models/Organisation';
import type { User } from '../../../server/models/User';
import { buildTeam, useDatabase, useMail } from '../../support';

useDatabase();
// loads queue notices (over budget, drifted): a queue of this file's own
useMail();

/** The generated demo seeded into an organisation of this file's own, as `npm start` seeds it. */
let demo: Demo;
let organisation: Organisation;
let lead: User;
const lines: string[] = [];

interface ClassRow {
  id: number;
  status: string;
  lineageId: number;
  members: { path: string; name: string; changed: boolean }[];
}

async function snapshotId(repository: string, label: string): Promise<number> {
  const [row] = await select<{ id: number }>(
    undefined,
    `select s.id from snapshots s join repositories r on r.id = s.repository_id where r.organisation_id = $1 and r.name = $2 and s.label = $3`,
    [organisation.id, repository, label],
  );
  if (!row) throw new Error(`no snapshot ${repository}@${label}`);
  return row.id;
}

/** A snapshot's classes with their members (path, fragment name, whether its code changed). */
async function classesOf(repository: string, label: string): Promise<ClassRow[]> {
  return select<ClassRow>(
    undefined,
    `select c.id, c.status, c.lineage_id as "lineageId",
            json_agg(json_build_object('path', sf.path, 'name', f.name, 'changed', m.code_changed) order by sf.path, f.name) as members
       from clone_classes c
       join clone_class_members m on m.class_id = c.id
       join snapshot_files sf on sf.id = m.snapshot_file_id
       join fragments f on f.id = m.fragment_id
      where c.snapshot_id = $1
      group by c.id order by c.ordinal`,
    [await snapshotId(repository, label)],
  );
}

const holds = (c: ClassRow, ref: FragmentRef) => c.members.some((m) => m.path === ref.path && m.name === ref.name);
const labelsOf = (repository: string) => demo.repositories.find((r) => r.name === repository)!.releases.map((r) => r.label);

beforeAll(async () => {
  demo = generateDemo();
  const team = await buildTeam();
  organisation = team.organisation;
  lead = team.lead;
  await seedDemoRepositories(organisation, (line) => lines.push(line));
}, 600_000);

describe('seedDemoRepositories', () => {
  it('loads every release of every repository, a few thousand fragments in three languages', async () => {
    const rows = await select<{ name: string; label: string; status: string }>(
      undefined,
      `select r.name, s.label, s.status from repositories r join snapshots s on s.repository_id = r.id where r.organisation_id = $1 order by s.id`,
      [organisation.id],
    );
    for (const r of demo.repositories) expect(rows.filter((x) => x.name === r.name).map((x) => x.label)).toEqual(labelsOf(r.name));
    expect(rows.every((x) => x.status === 'ready')).toBe(true);
    expect(lines.filter((l) => /fragments/.test(l))).toHaveLength(rows.length);
    const [latest] = await select<{ fragments: number; languages: number }>(
      undefined,
      `with latest as (select distinct on (s.repository_id) s.id from snapshots s join repositories r on r.id = s.repository_id
                        where r.organisation_id = $1 order by s.repository_id, s.id desc)
       select (select sum(fragment_count) from snapshots where id in (select id from latest))::int as fragments,
              (select count(distinct language) from snapshot_files where snapshot_id in (select id from latest) and language is not null)::int as languages`,
      [organisation.id],
    );
    expect(latest.fragments).toBeGreaterThanOrEqual(2000);
    expect(latest.languages).toBeGreaterThanOrEqual(3);
  });

  it('shows each copied module as new classes at the release that copied it, and not before', async () => {
    expect(demo.story.copied.length).toBeGreaterThanOrEqual(2);
    for (const copy of demo.story.copied) {
      const labels = labelsOf(copy.repository);
      const spanning = (c: ClassRow) => c.members.some((m) => m.path === copy.from) && c.members.some((m) => m.path === copy.to);
      const at = (await classesOf(copy.repository, copy.label)).filter(spanning);
      expect(at.length, `${copy.repository}@${copy.label}`).toBeGreaterThan(0);
      // new classes; a copy of a function already in a class joins it instead (grown)
      expect(at.some((c) => c.status === 'new')).toBe(true);
      expect(at.filter((c) => c.status !== 'new' && c.status !== 'grown')).toEqual([]);
      const before = await classesOf(copy.repository, labels[labels.indexOf(copy.label) - 1]);
      expect(before.some((c) => c.members.some((m) => m.path === copy.to))).toBe(false);
    }
  });

  it('marks the class whose fix reached one copy only as drifted, at the release of the fix', async () => {
    expect(demo.story.drifted.length).toBeGreaterThanOrEqual(1);
    for (const drift of demo.story.drifted) {
      const found = (await classesOf(drift.repository, drift.label)).find((c) => holds(c, drift.fixed));
      expect(found, `${drift.repository}@${drift.label} ${drift.fixed.name}`).toBeDefined();
      expect(found!.status).toBe('drifted');
      expect(holds(found!, drift.missed)).toBe(true);
      expect(found!.members.find((m) => m.path === drift.fixed.path && m.name === drift.fixed.name)!.changed).toBe(true);
      expect(found!.members.find((m) => m.path === drift.missed.path && m.name === drift.missed.name)!.changed).toBe(false);
      // the release before had the same class, not yet drifted
      const labels = labelsOf(drift.repository);
      const before = (await classesOf(drift.repository, labels[labels.indexOf(drift.label) - 1])).find((c) => holds(c, drift.fixed));
      expect(before?.status).not.toBe('drifted');
      expect(before?.lineageId).toBe(found!.lineageId);
    }
  });

  it('makes the merged copies’ classes disappear at the refactor', async () => {
    const { repository, label, removed, kept } = demo.story.merged;
    const labels = labelsOf(repository);
    const before = await classesOf(repository, labels[labels.indexOf(label) - 1]);
    // the classes that nothing but the copy held together: one original and its copies (a class
    // with two members besides the copy lives on without it)
    const merged = before.filter((c) => c.members.some((m) => m.path === removed) && c.members.filter((m) => m.path !== removed).every((m, _, rest) => m.path === kept && rest.length === 1));
    expect(merged.length).toBeGreaterThan(0);
    const after = await classesOf(repository, label);
    expect(after.some((c) => c.members.some((m) => m.path === removed))).toBe(false);
    // their lineages end there (one may live on where an original found another partner the same release)
    const lineages = new Set(after.map((c) => c.lineageId));
    const ended = merged.filter((c) => !lineages.has(c.lineageId));
    expect(ended.length).toBeGreaterThan(merged.length / 2);
    const [metrics] = await select<{ gone: number }>(undefined, 'select gone_class_count as gone from snapshot_metrics where snapshot_id = $1', [
      await snapshotId(repository, label),
    ]);
    expect(metrics.gone).toBeGreaterThanOrEqual(ended.length);
  });

  it('finds the module copied into another repository as a match across repositories', async () => {
    const across = demo.story.acrossRepositories;
    const latest = labelsOf(across.repository).at(-1)!;
    const id = await snapshotId(across.repository, latest);
    const [repository] = await select<{ id: number; threshold: string }>(undefined, 'select id, threshold from repositories where organisation_id = $1 and name = $2', [
      organisation.id,
      across.repository,
    ]);
    const fragments = await snapshotFragments(undefined, id);
    const pairs = await clonePairsAcross(undefined, repository.id, fragments, parseThreshold(repository.threshold));
    const copies = pairs.filter((p) => fragments[p.a].path === across.path && p.other.repositoryName === across.fromRepository && p.other.path === across.fromPath);
    expect(copies.length).toBeGreaterThan(0);
    const [metrics] = await select<{ cross: number }>(undefined, 'select cross_pair_count as cross from snapshot_metrics where snapshot_id = $1', [
      await snapshotId(across.repository, across.label),
    ]);
    expect(metrics.cross).toBeGreaterThan(0);
  });

  it('takes the clone ratio over the clone budget at the copy and back under it at the refactor', async () => {
    const { repository, budget, overFrom, underAgain } = demo.story.budget;
    const rows = await select<{ label: string; ratio: number; budget: number }>(
      undefined,
      `select s.label, m.clone_ratio as ratio, r.clone_budget as budget
         from snapshots s join repositories r on r.id = s.repository_id join snapshot_metrics m on m.snapshot_id = s.id
        where r.organisation_id = $1 and r.name = $2 order by s.id`,
      [organisation.id, repository],
    );
    expect(rows.every((r) => Number(r.budget) === budget)).toBe(true);
    const from = rows.findIndex((r) => r.label === overFrom);
    const until = rows.findIndex((r) => r.label === underAgain);
    expect(from).toBeGreaterThan(0);
    expect(until).toBeGreaterThan(from);
    const verdicts = rows.map((r) => `${r.label} ${r.ratio > budget ? 'over' : 'under'}`);
    expect(verdicts).toEqual(rows.map((r, i) => `${r.label} ${i >= from && i < until ? 'over' : 'under'}`));
  });

  it('keeps the waived classes waived with the lead’s reason, out of the unwaived ratio', async () => {
    const { repository, paths, reason } = demo.story.waived;
    const latest = labelsOf(repository).at(-1)!;
    const classes = (await classesOf(repository, latest)).filter((c) => c.members.every((m) => paths.includes(m.path)));
    expect(classes.length).toBeGreaterThan(0);
    const waivers = await select<{ lineageId: number; reason: string; createdBy: string; endedAt: Date | null }>(
      undefined,
      'select lineage_id as "lineageId", reason, created_by as "createdBy", ended_at as "endedAt" from waivers where lineage_id = any($1::int[])',
      [classes.map((c) => c.lineageId)],
    );
    expect(waivers.map((w) => w.lineageId).sort()).toEqual(classes.map((c) => c.lineageId).sort());
    for (const w of waivers) expect(w).toMatchObject({ reason, createdBy: lead.id, endedAt: null });
    const [metrics] = await select<{ cloned: string; unwaived: string }>(
      undefined,
      'select cloned_tokens as cloned, unwaived_cloned_tokens as unwaived from snapshot_metrics where snapshot_id = $1',
      [await snapshotId(repository, latest)],
    );
    expect(Number(metrics.unwaived)).toBeLessThan(Number(metrics.cloned));
  });
});
