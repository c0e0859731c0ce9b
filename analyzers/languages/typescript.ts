import { analyzeWithBabel } from './babel';
import type { LanguageAnalyzer } from './language';

/**
 * TypeScript: .ts, .mts, .cts, and .tsx (JSX only in .tsx, where `<T>x` casts are not allowed).
 * Type annotations are dropped from the token stream by default (see babel.ts).
 */
export const typescript: LanguageAnalyzer = {
  id: 'typescript',
  extensions: ['.ts', '.tsx', '.mts', '.cts'],
  async analyze(path, text, options) {
    const lower = path.toLowerCase();
    const sourceType = lower.endsWith('.cts') ? 'script' : 'module';
    return analyzeWithBabel(text, { typescript: true, jsx: lower.endsWith('.tsx'), sourceType }, options);
  },
};
