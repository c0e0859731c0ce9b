import fs from 'node:fs';
import path from 'node:path';
import { simpleGit } from 'simple-git';

/**
 * Invented Brackenfold code for git release tests: the second release copies computeTariff into
 * surchargeTariff; the third fixes that by making surchargeTariff call computeTariff.
 */
export const TARIFF_RELEASES = {
  tariff: `export function computeTariff(wagon, distance, season) {
  const base = wagon.axles * 120 + (wagon.loaded ? wagon.tonnes * 3 : 0);
  const perKm = wagon.hazardous ? 4.5 : season === 'winter' ? 3.6 : 3.2;
  if (distance > 800) return base + perKm * 800 + (distance - 800) * perKm * 0.8;
  return base + perKm * distance;
}
`,
  copied: `export function surchargeTariff(wagon, km, season) {
  const base = wagon.axles * 120 + (wagon.loaded ? wagon.tonnes * 3 : 0);
  const perKm = wagon.hazardous ? 4.5 : season === 'winter' ? 3.6 : 3.2;
  if (km > 800) return base + perKm * 800 + (km - 800) * perKm * 0.8;
  return base + perKm * km + 25;
}
`,
  fixed: `import { computeTariff } from './tariff.js';
export function surchargeTariff(wagon, km, season) {
  return computeTariff(wagon, km, season) + 25;
}
`,
};

/** A bare repository on disk and the work tree its releases are committed from. */
export interface ReleaseRepository {
  /** the bare repository (what Doublet links to) */
  bare: string;
  /** writes a file of the work tree */
  write(relative: string, content: string): void;
  /** commits the work tree, tags it (annotated or not) with the date given, and pushes the tag to `bare` */
  release(tag: string, date: string, annotated?: boolean): Promise<void>;
  /** the commit a tag of `bare` points at */
  commitOf(tag: string): Promise<string>;
}

/**
 * Builds a bare repository at `bare` with simple-git, committed from a work tree at `author`,
 * with fixed dates so the order of tags by date is known.
 *
 * @example const repo = await buildReleaseRepository(work, `${work}/mirrors/freight.git`, `${work}/author`);
 */
export async function buildReleaseRepository(home: string, bare: string, author: string): Promise<ReleaseRepository> {
  const gitAt = (dir: string, date?: string) => {
    const env: Record<string, string> = { PATH: process.env.PATH ?? '', HOME: home };
    if (date) Object.assign(env, { GIT_AUTHOR_DATE: date, GIT_COMMITTER_DATE: date });
    return simpleGit({ baseDir: dir, allowEnvironment: ['GIT_AUTHOR_DATE', 'GIT_COMMITTER_DATE'] }).env(env);
  };
  fs.mkdirSync(author, { recursive: true });
  fs.mkdirSync(bare, { recursive: true });
  await gitAt(bare).raw(['init', '--bare', '--quiet']);
  const g = gitAt(author);
  await g.init();
  await g.addConfig('user.name', 'Ines Varga');
  await g.addConfig('user.email', 'ines.varga@brackenfold.example');
  return {
    bare,
    write(relative, content) {
      fs.mkdirSync(path.dirname(path.join(author, relative)), { recursive: true });
      fs.writeFileSync(path.join(author, relative), content);
    },
    async release(tag, date, annotated = false) {
      const dated = gitAt(author, date);
      await dated.add('.');
      await dated.commit(`release ${tag}`);
      if (annotated) await dated.addAnnotatedTag(tag, `release ${tag}`);
      else await dated.addTag(tag);
      await dated.raw(['push', '--quiet', bare, `refs/tags/${tag}`]);
    },
    async commitOf(tag) {
      return (await gitAt(bare).revparse([`${tag}^{commit}`])).trim();
    },
  };
}
