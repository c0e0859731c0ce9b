import { useEffect, useState } from 'react';
import type { ThemedToken } from 'shiki/core';
import { highlightCode } from '@/features/clone-classes/lib/highlight';

/**
 * A fragment's coloured tokens, line by line, once its grammar has loaded; null until then, for an
 * unknown language, or if highlighting failed (the code is then shown plain, never hidden).
 */
export function useHighlightedLines(code: string, grammar: string | null): ThemedToken[][] | null {
  const [result, setResult] = useState<{ code: string; grammar: string; lines: ThemedToken[][] } | null>(null);
  useEffect(() => {
    if (!grammar) return;
    let live = true;
    highlightCode(code, grammar).then(
      (lines) => {
        if (live) setResult({ code, grammar, lines });
      },
      // Plain text is a fine fallback; the reason is not logged, so no code can reach a log.
      () => undefined,
    );
    return () => {
      live = false;
    };
  }, [code, grammar]);
  return result && result.code === code && result.grammar === grammar ? result.lines : null;
}
