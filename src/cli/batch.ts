import { availableParallelism } from 'node:os';
import { isMainThread, parentPort, Worker, workerData } from 'node:worker_threads';
import { PlanError, type Problem } from '../plan/problems.js';
import type { ReportV1 } from '../report/build.js';
import { evaluatePlanFile } from './evaluate.js';
import type { Override } from './overrides.js';
import type { Progress } from './progress.js';
import { render, type Format } from './render.js';

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
    const report = evaluatePlanFile(t.file, t.overrides);
    const output = t.render ? await render(report, t.format) : undefined;
    return { file: t.file, exit: report.allTargetsMet ? 0 : 1, report, ...(output !== undefined ? { output } : {}) };
  } catch (e) {
    if (e instanceof PlanError) return { file: t.file, exit: 2, problems: e.problems };
    return { file: t.file, exit: 3, internal: e instanceof Error ? e.message : String(e) };
  }
}

const ROLE = 'strainledger-batch-worker';

// This same module is the worker's script: started with workerData.role it serves tasks.
if (!isMainThread && (workerData as { role?: string } | null)?.role === ROLE && parentPort) {
  const port = parentPort;
  port.on('message', (t: Task) => {
    void processTask(t).then((o) => port.postMessage(o));
  });
}

/** Largest `--jobs`: more threads than cores only adds overhead. */
export function maxJobs(): number {
  return Math.max(1, availableParallelism() * 2);
}

/**
 * Evaluates plans, `jobs` at a time. With jobs = 1 (or one plan) everything runs on the main thread;
 * otherwise on `jobs` worker threads (node:worker_threads), each pulling the next plan when done.
 * Outcomes come back in the order of `tasks`.
 */
export async function runTasks(tasks: readonly Task[], jobs: number, progress: Progress): Promise<Outcome[]> {
  const out: Outcome[] = new Array(tasks.length);
  if (jobs <= 1 || tasks.length <= 1) {
    for (let i = 0; i < tasks.length; i++) {
      out[i] = await processTask(tasks[i]!);
      progress.tick();
    }
    return out;
  }
  let next = 0;
  const n = Math.min(jobs, tasks.length);
  const url = new URL(import.meta.url);
  await Promise.all(Array.from({ length: n }, () => new Promise<void>((resolveWorker, rejectWorker) => {
    const w = new Worker(url, { workerData: { role: ROLE } });
    let current = -1;
    const feed = () => {
      if (next >= tasks.length) {
        void w.terminate().then(() => resolveWorker());
        return;
      }
      current = next++;
      w.postMessage(tasks[current]);
    };
    w.on('message', (o: Outcome) => {
      out[current] = o;
      progress.tick();
      feed();
    });
    w.on('error', (e) => rejectWorker(e));
    feed();
  })));
  return out;
}
