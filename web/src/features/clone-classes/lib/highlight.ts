import type { HighlighterCore, ThemeRegistration, ThemedToken } from 'shiki/core';

/**
 * Doublet's own code colours on white: ink for plain code, plum keywords, moss strings, rust
 * numbers, slate-blue functions and muted grey comments. Every colour keeps at least 4.5:1 contrast
 * on white and on the four change backgrounds of the pair view (checked with axe in the Chromium tests).
 */
export const CODE_THEME: ThemeRegistration = {
  name: 'doublet-paper',
  type: 'light',
  colors: { 'editor.background': '#ffffff', 'editor.foreground': '#1f2523' },
  fg: '#1f2523',
  bg: '#ffffff',
  settings: [
    { settings: { foreground: '#1f2523', background: '#ffffff' } },
    { scope: ['comment', 'punctuation.definition.comment'], settings: { foreground: '#5a625d', fontStyle: 'italic' } },
    { scope: ['keyword', 'storage', 'storage.type', 'storage.modifier', 'keyword.operator.new', 'keyword.operator.expression', 'keyword.control'], settings: { foreground: '#7a2f63' } },
    { scope: ['string', 'punctuation.definition.string'], settings: { foreground: '#2f5e22' } },
    { scope: ['constant.numeric', 'constant.language', 'constant.character'], settings: { foreground: '#9a3412' } },
    { scope: ['entity.name.function', 'support.function', 'meta.function-call entity.name.function'], settings: { foreground: '#1d4f7a' } },
    { scope: ['entity.name.type', 'entity.name.class', 'support.class', 'support.type'], settings: { foreground: '#5b3d8f' } },
    { scope: ['variable.parameter'], settings: { foreground: '#6b4a12' } },
  ],
};

// One loader per language Doublet analyzes. Each is a separate import, so the build puts every
// grammar in its own chunk and a page fetches only the grammars of the code it shows.
const GRAMMARS: Record<string, () => Promise<unknown>> = {
  javascript: () => import('shiki/langs/javascript.mjs'),
  typescript: () => import('shiki/langs/typescript.mjs'),
  tsx: () => import('shiki/langs/tsx.mjs'),
  python: () => import('shiki/langs/python.mjs'),
  java: () => import('shiki/langs/java.mjs'),
  go: () => import('shiki/langs/go.mjs'),
  csharp: () => import('shiki/langs/csharp.mjs'),
  c: () => import('shiki/langs/c.mjs'),
  cpp: () => import('shiki/langs/cpp.mjs'),
};

/**
 * The grammar for a fragment: the class's language, with TSX for .tsx files (the TypeScript
 * analyzer reads both). Null for a language without a grammar here: the code is shown plain.
 *
 * @example grammarFor('typescript', 'ui/panel.tsx') // 'tsx'
 */
export function grammarFor(language: string, path: string): string | null {
  if (language === 'typescript' && path.endsWith('.tsx')) return 'tsx';
  return language in GRAMMARS ? language : null;
}

let highlighter: Promise<HighlighterCore> | null = null;

/** The one highlighter of the page: shiki's core with the JavaScript regex engine (no wasm). */
function getHighlighter(): Promise<HighlighterCore> {
  highlighter ??= Promise.all([import('shiki/core'), import('shiki/engine/javascript')]).then(([core, engine]) =>
    core.createHighlighterCore({ themes: [CODE_THEME], langs: [], engine: engine.createJavaScriptRegexEngine() }),
  );
  return highlighter;
}

/**
 * Colours a fragment's code: one array of tokens per line, with their colours and offsets.
 * Loads the grammar on first use.
 *
 * @example const lines = await highlightCode('let a = 1', 'javascript')
 */
export async function highlightCode(code: string, grammar: string): Promise<ThemedToken[][]> {
  const h = await getHighlighter();
  if (!h.getLoadedLanguages().includes(grammar)) {
    const module = (await GRAMMARS[grammar]()) as { default: Parameters<HighlighterCore['loadLanguage']>[0] };
    await h.loadLanguage(module.default);
  }
  return h.codeToTokensBase(code, { lang: grammar, theme: CODE_THEME.name! });
}
