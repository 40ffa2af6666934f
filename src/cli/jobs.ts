import { availableParallelism } from 'node:os';

/** Largest `--jobs`: more threads than cores only adds overhead. */
export function maxJobs(): number {
  return Math.max(1, availableParallelism() * 2);
}
