import { prepareScatter, type ScatterProblem } from './problem.js';
import { sampleScatterBlock, type ScatterBlock } from './sample.js';
import { summarizeScatter, type ScatterSummary } from './summarize.js';

/** Options of {@link runScatter}. */
export interface RunScatterOptions {
  /** Called after each block with (blocks done, blocks in all); for progress bars. */
  onProgress?: (done: number, total: number) => void;
}

/**
 * Monte Carlo through the route on one thread: prepares the problem, samples every block with its
 * own seeded stream and summarises. The Node runner shares blocks among worker threads and the
 * notebook runs this in a web worker; all give the same summary, byte for byte, for the same
 * problem (the blocks and their streams do not depend on who computes them).
 * Units: MPa, mm, %. @throws InputError for an invalid problem (see {@link prepareScatter}).
 * @example runScatter({ ...problem, samples: 10000, seed: 7 }).probabilityAllTargetsMet // e.g. 0.93
 */
export function runScatter(problem: ScatterProblem, opts: RunScatterOptions = {}): ScatterSummary {
  const prep = prepareScatter(problem);
  const blocks: ScatterBlock[] = [];
  for (let b = 0; b < prep.blocks; b++) {
    blocks.push(sampleScatterBlock(prep, b));
    opts.onProgress?.(b + 1, prep.blocks);
  }
  return summarizeScatter(prep, blocks);
}
