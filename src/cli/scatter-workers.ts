import { availableParallelism } from 'node:os';
import { isMainThread, parentPort, Worker, workerData } from 'node:worker_threads';
import { InputError } from '../core/errors.js';
import { prepareScatter, SCATTER_BLOCK, type ScatterProblem } from '../core/scatter/problem.js';
import { sampleScatterBlock, type ScatterBlock } from '../core/scatter/sample.js';
import { summarizeScatter, type ScatterSummary } from '../core/scatter/summarize.js';
import { startProgress } from './progress.js';

const ROLE = 'strainledger-scatter-worker';

// This same module is the worker's script (so it works from tsc's dist/ and from the bundled runner
// chunk alike): started with workerData.role it prepares the problem once, then answers each block
// index with the sampled block (typed arrays transferred, not copied) or the error that stopped it.
if (!isMainThread && (workerData as { role?: string } | null)?.role === ROLE && parentPort) {
  const port = parentPort;
  const prep = prepareScatter((workerData as { problem: ScatterProblem }).problem);
  port.on('message', (index: number) => {
    try {
      const b = sampleScatterBlock(prep, index);
      port.postMessage({ block: b }, [b.inputs.buffer, b.reloadYield.buffer, b.tensileStrength.buffer, b.remainingElongationPct.buffer, b.hardnessHV.buffer, b.metMask.buffer] as ArrayBuffer[]);
    } catch (e) {
      const err = e as Error;
      port.postMessage({ error: err instanceof InputError
        ? { kind: 'input', path: err.path, value: err.value, allowed: err.allowed, message: err.message }
        : { kind: 'other', message: err.message } });
    }
  });
}

/** Blocks kept in flight per worker, so a worker never waits for the next index. */
const IN_FLIGHT = 2;

/** Largest sensible number of sampling threads on this machine. */
export function maxScatterThreads(): number {
  return Math.max(1, availableParallelism());
}

/**
 * Samples a scatter problem on `threads` worker threads (node:worker_threads). Blocks of
 * SCATTER_BLOCK samples, each with its own seeded stream (seed, block index), are handed out one at
 * a time as workers finish; the summary combines them in block order. So the result is the same,
 * byte for byte, for any number of threads, and the same as the core's single-thread `runScatter`.
 * The main thread only hands out work and ticks `onBlock`, so a progress bar keeps moving.
 * `threads` = 0 samples on the calling thread (no worker), for small runs and tests.
 * @throws InputError from the problem or from sampling (e.g. spreads too wide).
 */
export async function sampleScatterThreads(problem: ScatterProblem, threads: number, onBlock: () => void = () => {}): Promise<ScatterSummary> {
  const prep = prepareScatter(problem);
  const blocks: ScatterBlock[] = new Array(prep.blocks);
  if (threads <= 0) {
    for (let b = 0; b < prep.blocks; b++) { blocks[b] = sampleScatterBlock(prep, b); onBlock(); }
    return summarizeScatter(prep, blocks);
  }
  const n = Math.min(threads, prep.blocks);
  const url = new URL(import.meta.url);
  let next = 0;
  const workers: Worker[] = [];
  try {
    await Promise.all(Array.from({ length: n }, () => new Promise<void>((resolve, reject) => {
      const w = new Worker(url, { workerData: { role: ROLE, problem } });
      workers.push(w);
      let pending = 0;
      const feed = () => {
        while (pending < IN_FLIGHT && next < prep.blocks) { w.postMessage(next++); pending++; }
        if (pending === 0) resolve();
      };
      w.on('message', (m: { block?: ScatterBlock; error?: { kind: string; path?: string; value?: unknown; allowed?: string; message: string } }) => {
        pending--;
        if (m.error) {
          const e = m.error;
          next = prep.blocks; // stop handing out work
          if (e.kind === 'input') {
            const ie = new InputError(e.path!, e.value, e.allowed!);
            ie.message = e.message; // the worker's full message, detail included
            reject(ie);
          } else reject(new Error(e.message));
          return;
        }
        blocks[m.block!.index] = m.block!;
        onBlock();
        feed();
      });
      w.on('error', reject);
      feed();
    })));
  } finally {
    await Promise.all(workers.map((w) => w.terminate()));
  }
  return summarizeScatter(prep, blocks);
}

/**
 * For the runner: samples a plan's resolved scatter section on worker threads, with a progress bar
 * on a TTY (silent otherwise, and under CI), and returns the summary for the report.
 * @throws InputError from the problem or from sampling (the caller locates it in the plan file).
 */
export async function sampleScatterWithProgress(problem: ScatterProblem, threads: number, progressOn: boolean): Promise<ScatterSummary> {
  const total = Math.ceil(problem.samples / SCATTER_BLOCK);
  const progress = await startProgress(total, 'scatter blocks', progressOn);
  try {
    return await sampleScatterThreads(problem, threads, () => progress.tick());
  } finally {
    progress.stop();
  }
}
