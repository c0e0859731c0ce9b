/** Seeded choices for the edit operators (JavaScript and Python alike). */

/**
 * One item, chosen with `random` (a seeded generator, so runs repeat).
 *
 * @example pick(['a', 'b'], () => 0.7) // 'b'
 */
export function pick<T>(items: readonly T[], random: () => number): T {
  return items[Math.floor(random() * items.length)]!;
}

/**
 * Up to `count` distinct items in random order.
 *
 * @example pickSome([1, 2, 3], 2, () => 0) // [1, 2]
 */
export function pickSome<T>(items: readonly T[], count: number, random: () => number): T[] {
  const pool = [...items];
  const out: T[] = [];
  while (out.length < count && pool.length > 0) out.push(pool.splice(Math.floor(random() * pool.length), 1)[0]!);
  return out;
}
