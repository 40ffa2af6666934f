import { isMainThread, parentPort, Worker, workerData } from 'node:worker_threads';
import { PlanError, type Problem } from '../plan/problems.js';
import type { ReportV1 } from '../report/build.js';
import { evaluatePlanFile } from './evaluate.js';
import type { Override } from './overrides.js';
import type { Progress } from './progress.js';
import { render, renderInvalid, type Format } from './render.js';

/** One plan to evaluate; `render` asks for the formatted output too (done where the work runs). */
export interface Task {
  file: string;
  format: Format;
  overrides: Override[];
  render: boolean;
}

/** What became of one plan: exit 0 met, 1 a target missed, 2 invalid input, 3 internal error. */
export interface Outcome {
  file: string;
  exit: 0 | 1 | 2 | 3;
  report?: ReportV1;
  output?: string;
  problems?: Problem[];
  internal?: string;
}

/** Evaluates one plan; never throws (invalid input and internal errors become the outcome). */
export async function processTask(t: Task): Promise<Outcome> {
  try {
    const report = await evaluatePlanFile(t.file, t.overrides);
    const output = t.render ? await render(report, t.format) : undefined;
    return { file: t.file, exit: report.allTargetsMet ? 0 : 1, report, ...(output !== undefined ? { output } : {}) };
  } catch (e) {
    // With --out an invalid plan gets its file too where merge reads it (JSON, JUnit): a shard's
    // per-plan files must carry it, or merge would drop the plan and its exit code.
    const invalid = async (o: Outcome): Promise<Outcome> => {
      const output = t.render ? await renderInvalid(t.file, t.format, o.problems, o.internal) : undefined;
      return output !== undefined ? { ...o, output } : o;
    };
    if (e instanceof PlanError) return invalid({ file: t.file, exit: 2, problems: e.problems });
    return invalid({ file: t.file, exit: 3, internal: e instanceof Error ? e.message : String(e) });
  }
}

const ROLE = 'strainledger-batch-worker';

// This same module is the worker's script: started with workerData.role it serves tasks.
if (!isMainThread && (workerData as { role?: string } | null)?.role === ROLE && parentPort) {
  const port = parentPort;
  // Batches are served one after the other, in the order they came (two may be waiting).
  let queue = Promise.resolve();
  port.on('message', ({ from, batch }: { from: number; batch: Task[] }) => {
    queue = queue.then(async () => {
      const out: Outcome[] = [];
      for (const t of batch) out.push(await processTask(t));
      port.postMessage({ from, out });
    });
  });
}


/** Options of {@link runTasks}. */
export interface RunTasksOptions {
  /** Start the workers at once instead of when the work left is worth it (tests of the worker path). */
  eagerWorkers?: boolean;
  /** Filled in: how many plans the worker threads evaluated. */
  stats?: { byWorkers: number };
}

/**
 * Evaluates plans, `jobs` at a time. With jobs = 1 (or one plan) everything runs on the main thread;
 * otherwise on the main thread and, once the work left is worth their start, `jobs − 1` worker
 * threads (node:worker_threads), each pulling the next few plans when done.
 * Outcomes come back in the order of `tasks`; `onOutcome` sees each as soon as it is ready (in
 * completion order), e.g. to write its file while the other plans are still being worked on.
 */
export async function runTasks(tasks: readonly Task[], jobs: number, progress: Progress, onOutcome: (o: Outcome) => void = () => {}, opts: RunTasksOptions = {}): Promise<Outcome[]> {
  const out: Outcome[] = new Array(tasks.length);
  const done = (i: number, o: Outcome) => {
    out[i] = o;
    onOutcome(o);
    progress.tick();
  };
  if (jobs <= 1 || tasks.length <= 1) {
    for (let i = 0; i < tasks.length; i++) {
      done(i, await processTask(tasks[i]!));
    }
    return out;
  }
  // Plans go out in small batches (fewer messages), small enough to keep both threads busy to the end.
  const size = Math.max(1, Math.min(32, Math.ceil(tasks.length / (jobs * 8))));
  let next = 0;
  const workers: Promise<void>[] = [];
  const url = new URL(import.meta.url);
  const launch = () => new Promise<void>((resolveWorker, rejectWorker) => {
    const w = new Worker(url, { workerData: { role: ROLE } });
    // Two batches in flight per worker, so it starts the next while its last result is in the post.
    let pending = 0;
    const feed = () => {
      while (pending < 2 && next < tasks.length) {
        const from = next;
        next = Math.min(tasks.length, next + size);
        pending++;
        w.postMessage({ from, batch: tasks.slice(from, next) });
      }
      if (pending === 0) void w.terminate().then(() => resolveWorker());
    };
    w.on('message', ({ from, out: batch }: { from: number; out: Outcome[] }) => {
      pending--;
      if (opts.stats) opts.stats.byWorkers += batch.length;
      batch.forEach((o, k) => done(from + k, o));
      feed();
    });
    w.on('error', (e) => rejectWorker(e));
    feed();
  });
  // A worker that fails is reported when the batch ends (internal error, exit 3); handled at once so
  // that it is not an unhandled rejection while the main thread is still working.
  const startWorker = () => {
    const p = launch();
    p.catch(() => {});
    workers.push(p);
  };
  // The main thread is one of the `jobs` and starts at once. Workers start only when the work left,
  // judged from the main thread's rate after its first plan, would keep it busy for longer than a
  // worker takes to start and warm up (a new isolate loading the runner: ~0.1 s for JSON, ~0.4 s
  // with the chart code; bench/RESULTS.md), so `--jobs N` is not slower than `--jobs 1` on a batch
  // of small plans. Once workers run, the main thread yields to the event loop every few
  // milliseconds so that a worker's finished batch is answered at once.
  const YIELD_MS = 4;
  const PROBE_MS = 50;
  const WORKER_START_MS = 500;
  const n = Math.min(jobs, tasks.length) - 1;
  const t0 = performance.now();
  let since = t0;
  let mine = 0;
  let tFirst = 0; // the first plan also pays for loading and compiling the code: the rate is taken after it
  if (opts.eagerWorkers) for (let k = 0; k < n; k++) startWorker();
  while (next < tasks.length) {
    const i = next++;
    done(i, await processTask(tasks[i]!));
    mine++;
    const now = performance.now();
    if (mine === 1) tFirst = now;
    if (workers.length === 0 && mine > 1 && now - t0 > PROBE_MS && ((tasks.length - next) * (now - tFirst)) / (mine - 1) > WORKER_START_MS) {
      for (let k = 0; k < n; k++) startWorker();
    }
    if (workers.length > 0 && now - since > YIELD_MS) { // only workers send messages to answer
      await new Promise((r) => setImmediate(r));
      since = performance.now();
    }
  }
  await Promise.all(workers);
  return out;
}
