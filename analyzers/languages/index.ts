import { c } from './c';
import { cpp } from './cpp';
import { csharp } from './csharp';
import { go } from './go';
import { java } from './java';
import { javascript } from './javascript';
import type { LanguageAnalyzer } from './language';
import { python } from './python';
import { typescript } from './typescript';

/** Every supported language. Adding a language: write `languages/<lang>.ts`, list it here. */
export const LANGUAGES: readonly LanguageAnalyzer[] = [javascript, typescript, python, java, go, csharp, c, cpp];

const byExtension = new Map<string, LanguageAnalyzer>();
const byId = new Map<string, LanguageAnalyzer>();
for (const language of LANGUAGES) {
  byId.set(language.id, language);
  for (const ext of language.extensions) {
    if (byExtension.has(ext)) throw new Error(`extension ${ext} is claimed by two languages`);
    byExtension.set(ext, language);
  }
}

/** The extension of a path, lower-cased, with the dot (`src/A.Test.TS` → `.ts`); '' when none. */
export function extensionOf(path: string): string {
  const base = path.slice(path.lastIndexOf('/') + 1);
  const dot = base.lastIndexOf('.');
  return dot > 0 ? base.slice(dot).toLowerCase() : '';
}

/** The analyzer for a path, by extension. */
export function analyzerForPath(path: string): LanguageAnalyzer | undefined {
  return byExtension.get(extensionOf(path));
}

/** The analyzer for a language id ('python'…). */
export function analyzerForLanguage(id: string): LanguageAnalyzer | undefined {
  return byId.get(id);
}
