import { PlanError } from '../plan/problems.js';

/** One share of a plan list: `index` is 1-based like test runners' shards (`--shard 2/4`). */
export interface Shard {
  index: number;
  count: number;
}

/** Largest shard count accepted (a CI matrix is far smaller; the bound only keeps the number sane). */
export const MAX_SHARDS = 10_000;

/**
 * Reads `K/N` (whole numbers, 1 ≤ K ≤ N ≤ {@link MAX_SHARDS}).
 * @throws PlanError (exit 2) naming `--shard`, the value and what is allowed.
 */
export function parseShard(text: string): Shard {
  const m = /^(\d+)\/(\d+)$/.exec(text.trim());
  const bad = (why: string) => new PlanError([{ file: '(command line)', path: '--shard', message: `got ${JSON.stringify(text)}${why}, allowed K/N with whole numbers 1 ≤ K ≤ N ≤ ${MAX_SHARDS}, e.g. 2/4` }]);
  if (!m) throw bad('');
  const index = Number(m[1]);
  const count = Number(m[2]);
  if (count < 1 || count > MAX_SHARDS) throw bad(`: N = ${count} is out of range`);
  if (index < 1 || index > count) throw bad(`: K = ${index} is not between 1 and N = ${count}`);
  return { index, count };
}

/** Code-unit order, the same on every machine and locale (not `localeCompare`). */
export function comparePaths(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

/**
 * The plans of one shard. The list is sorted (code-unit order) and de-duplicated first, so every job
 * of a CI matrix that runs the same arguments sees the same list; with M plans, shard K of N takes
 * the contiguous indices i (0-based) with ⌊(K−1)·M/N⌋ ≤ i < ⌊K·M/N⌋. The N shares are disjoint,
 * their union is the whole list, in order, and their sizes differ by at most one (a shard is empty
 * only when N > M).
 *
 * @example shardOf(['d', 'a', 'c', 'b', 'e'], { index: 2, count: 2 }) // → ['c', 'd', 'e']
 */
export function shardOf(files: readonly string[], shard: Shard): string[] {
  const list = [...new Set(files)].sort(comparePaths);
  const m = list.length;
  const from = Math.floor(((shard.index - 1) * m) / shard.count);
  const to = Math.floor((shard.index * m) / shard.count);
  return list.slice(from, to);
}
