import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';

// axe-core's own bundle, evaluated in the page through the DevTools protocol (so a page's
// Content-Security-Policy, which forbids inline script, does not stop it).
const AXE_SOURCE: string = createRequire(import.meta.url)('axe-core').source;

interface AxeViolation {
  id: string;
  impact: string | null;
  help: string;
  nodes: Array<{ target: string[] }>;
}

/** The serious and critical axe-core violations of the page as it is now, as short readable lines. */
export async function seriousViolations(page: Page): Promise<string[]> {
  await page.evaluate(AXE_SOURCE);
  const violations = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run(ctx: Document): Promise<{ violations: AxeViolation[] }> } }).axe;
    return (await axe.run(document)).violations;
  });
  return violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.impact} ${v.id}: ${v.help} at ${v.nodes.slice(0, 3).map((n) => n.target.join(' ')).join(', ')}`);
}
