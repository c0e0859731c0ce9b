/**
 * The clone budget verdict, exact: a repository's (or a CI run's) ceiling on the clone ratio,
 * compared in integers so that a ratio right at the budget passes. The web API's `overBudget`
 * and `doublet scan --budget` both ask exceedsBudget.
 */

/** A clone budget as an exact fraction: "0.05" → 5/100. */
export interface CloneBudget {
  numerator: number;
  denominator: number;
  text: string;
}

/**
 * Parses a clone budget: a decimal in [0, 1] with at most six decimals ("0.05", or the stored
 * "0.050000"), or a percentage ("5%"). Kept exact so that a ratio right at the budget passes.
 *
 * @example parseBudget('5%') // { numerator: 5, denominator: 100, text: '5%' }
 * @throws when the text is not such a number
 */
export function parseBudget(text: string): CloneBudget {
  const match = /^(\d+)(?:\.(\d{1,6}))?(%?)$/.exec(text.trim());
  if (!match) throw new Error(`budget "${text}" is not a ratio in [0, 1] (like 0.05) or a percentage (like 5%)`);
  const decimals = match[2] ?? '';
  let denominator = 10 ** decimals.length;
  const numerator = Number(match[1]) * denominator + Number(decimals || '0');
  if (match[3] === '%') denominator *= 100;
  if (numerator > denominator) throw new Error(`budget "${text}" is above 100%`);
  return { numerator, denominator, text: text.trim() };
}

/** The token counts a clone ratio is made of (report stats and snapshot figures both have them). */
export interface TokenCounts {
  /** tokens inside fragments that are in at least one clone pair, each counted once */
  clonedTokens: number;
  /** tokens inside fragments, each counted once */
  fragmentTokens: number;
}

/**
 * Whether the clone ratio clonedTokens / fragmentTokens is above the budget, compared as
 * clonedTokens · denominator > numerator · fragmentTokens in BigInt (a ratio at the budget
 * passes; no double rounding, and no overflow past 2^53 for large token counts).
 *
 * @example exceedsBudget({ clonedTokens: 240, fragmentTokens: 300 }, parseBudget('0.8')) // false: 0.8 is at the budget
 */
export function exceedsBudget(counts: TokenCounts, budget: CloneBudget): boolean {
  return BigInt(counts.clonedTokens) * BigInt(budget.denominator) > BigInt(budget.numerator) * BigInt(counts.fragmentTokens);
}
