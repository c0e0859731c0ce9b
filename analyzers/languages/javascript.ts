import { analyzeWithBabel } from './babel';
import type { LanguageAnalyzer } from './language';

/**
 * JavaScript: .js, .jsx, .mjs, .cjs (JSX is accepted in all of them, as bundlers do).
 * `.cjs` is parsed as a script first; the others as modules, falling back to script.
 */
export const javascript: LanguageAnalyzer = {
  id: 'javascript',
  extensions: ['.js', '.jsx', '.mjs', '.cjs'],
  async analyze(path, text, options) {
    const sourceType = path.toLowerCase().endsWith('.cjs') ? 'script' : 'module';
    return analyzeWithBabel(text, { typescript: false, jsx: true, sourceType }, options);
  },
};
