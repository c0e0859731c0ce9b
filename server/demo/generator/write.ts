/**
 * Writes every generated release to a folder, to read the demo's code or scan it:
 * `node --import tsx server/demo/generator/write.ts OUT` → OUT/<repository>/<release>/…
 */
import { mkdir, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { generateDemo } from './story';

async function main() {
  const out = process.argv[2];
  if (!out) throw new Error('usage: node --import tsx server/demo/generator/write.ts OUT');
  const demo = generateDemo();
  for (const repository of demo.repositories) {
    for (const release of repository.releases) {
      for (const file of release.files) {
        const target = path.join(out, repository.name, release.label, file.path);
        await mkdir(path.dirname(target), { recursive: true });
        await writeFile(target, file.text);
      }
    }
  }
  console.log(JSON.stringify(demo.story, null, 2));
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
