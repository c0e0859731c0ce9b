/**
 * Release labels compared as versions, for waivers "until release …". A label is read as the text
 * before its first digit (its prefix: "v", "release-", or nothing) and then its numbers from left
 * to right: 2026.10 < 2026.11, v2 < v10, 1.9.0 < 1.10.0 < 1.10.0.1. Two labels compare only when
 * their prefixes are the same (ignoring case) and both have numbers; any other pair of labels is
 * equal only when the labels are the same text.
 */

interface VersionParts {
  prefix: string;
  numbers: number[];
}

function versionParts(label: string): VersionParts | undefined {
  const text = label.trim();
  const first = text.search(/\d/);
  if (first < 0) return undefined;
  const numbers = (text.slice(first).match(/\d+/g) ?? []).map(Number);
  return { prefix: text.slice(0, first).toLowerCase(), numbers };
}

/**
 * Whether loading a snapshot labelled `loaded` reaches the release `until`: it is that release
 * (the same text, ignoring surrounding spaces and case), or a later version of the same form.
 *
 * @example
 * releaseReached('2026.10', '2026.10') // true
 * releaseReached('2026.10', '2026.11') // true
 * releaseReached('v10', 'v9') // false
 * releaseReached('spring-timetable', 'summer-timetable') // false: no numbers, not the same label
 */
export function releaseReached(until: string, loaded: string): boolean {
  if (until.trim().toLowerCase() === loaded.trim().toLowerCase()) return true;
  const a = versionParts(until);
  const b = versionParts(loaded);
  if (!a || !b || a.prefix !== b.prefix) return false;
  for (let i = 0; i < Math.max(a.numbers.length, b.numbers.length); i++) {
    const x = a.numbers[i] ?? 0;
    const y = b.numbers[i] ?? 0;
    if (x !== y) return y > x;
  }
  return true;
}
