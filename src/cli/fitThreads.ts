import { isMainThread, MessageChannel, parentPort, receiveMessageOnPort, Worker, workerData, type MessagePort } from 'node:worker_threads';
import { compareLawFits, fitAllLaws, fitLawGroup, type FitAllOptions, type LawComparison } from '../core/fit/fitAllLaws.js';
import { withLazyResiduals } from '../core/fit/fitLaw.js';
import { lawDataRanged, type LawData } from '../core/fit/lawNormalEquations.js';
import type { LawFit } from '../core/fit/types.js';
import { LAW_NAMES, LAW_PARAMETERS } from '../core/flow/params.js';
import type { LawName } from '../core/flow/types.js';

const ROLE = 'strainledger-fit-helper';

/** Flow curves shorter than this are fitted on the calling thread only (a second thread would not pay). */
export const FIT_THREAD_MIN_POINTS = 50_000;

/**
 * The laws fitted on the main thread: Swift, then the Swift–Voce blend, which starts from the Swift
 * and Voce fits. The helper fits Voce first and answers it at once (EARLY), then the others; so the
 * blend, the longest fit, starts as soon as both parts are known and the threads finish together.
 */
const MAIN_GROUP: readonly LawName[] = ['swift', 'swiftVoce'];
const EARLY: LawName = 'voce';

/** What crosses between the threads: a job (the packed curve in shared memory, the helper's laws) and its answer. */
interface Job { x: Float64Array; y: Float64Array; lo: number; hi: number; early: LawName; laws: LawName[] }
type FitData = Omit<LawFit, 'residuals'>;
type Answer = { fits: FitData[] } | { error: string };

// This same module is the helper thread's script (as cli/scatter-workers.ts): it says it is ready,
// then fits the laws of each job and answers on its port, raising the `done` flag the main thread
// waits on with Atomics.wait.
if (!isMainThread && (workerData as { role?: string } | null)?.role === ROLE) {
  const { port, ctl } = workerData as { role: string; port: MessagePort; ctl: Int32Array };
  // ctl[1] counts the answers posted for the current job: 1 after the early law, 2 after the rest.
  const answer = (a: Answer) => { port.postMessage(a); Atomics.add(ctl, 1, 1); Atomics.notify(ctl, 1); };
  port.on('message', (job: Job) => {
    try {
      // ln x made only if a fit reads it, as on the main thread (lawDataRanged); the fits of a long curve do not.
      const packed: LawData = lawDataRanged(job.x, job.y, job.lo, job.hi, -1);
      answer({ fits: [plainFit(fitLawGroup([job.early], job.x, job.y, packed).get(job.early)!)] });
      const byLaw = fitLawGroup(job.laws, job.x, job.y, packed);
      answer({ fits: job.laws.map((l) => plainFit(byLaw.get(l)!)) });
    } catch (e) {
      const error = { error: String((e as Error)?.message ?? e) };
      while (Atomics.load(ctl, 1) < 2) answer(error);
    }
  });
  Atomics.store(ctl, 0, 1);
  Atomics.notify(ctl, 0);
}

/** A fit's fields without the residuals accessor (which would make the whole residual column to copy it). */
function plainFit(f: LawFit): FitData {
  return {
    law: f.law, params: f.params, standardErrors: f.standardErrors, intervals95: f.intervals95, rmse: f.rmse, r2: f.r2, aic: f.aic, bic: f.bic,
    converged: f.converged, iterations: f.iterations, strainRange: f.strainRange, points: f.points, warnings: f.warnings,
    standardErrorsIndependent: f.standardErrorsIndependent, basis: f.basis,
  };
}

/** A fit from the helper thread as fitLaw makes it: the same fields in the same order, residuals made when read. */
function rebuiltFit(d: FitData, packed: LawData): LawFit {
  const fit: LawFit = {
    law: d.law, params: d.params, standardErrors: d.standardErrors, intervals95: d.intervals95, rmse: d.rmse, r2: d.r2, aic: d.aic, bic: d.bic,
    residuals: [], converged: d.converged, iterations: d.iterations, strainRange: d.strainRange, points: d.points, warnings: d.warnings,
    standardErrorsIndependent: d.standardErrorsIndependent, basis: d.basis,
  };
  return withLazyResiduals(fit, packed, Float64Array.from(LAW_PARAMETERS[d.law], (p) => d.params[p.name]!));
}

/** A second thread for the law fits of large records; `fitLaws` is a drop-in for analyzeRecord's `fitLaws` option. */
export interface FitHelper {
  fitLaws: (strain: Float64Array, stress: Float64Array, opts: FitAllOptions & { packed: LawData }) => LawComparison;
  /** Fits done on two threads so far (the rest went the one-thread way). */
  readonly shared: number;
  close(): Promise<void>;
}

/**
 * Starts one helper thread for the law fits (started early, e.g. while the record is read, so it is
 * ready when the fits begin). `fitLaws` fits Swift and the Swift–Voce blend on the calling thread and
 * Voce (answered first: the blend starts from it), Hollomon, Ludwik and Hockett–Sherby on the helper,
 * at the same time, then compares them as fitAllLaws does:
 * the same fits (each fit depends only on the data and its start; JavaScript arithmetic is the same
 * on every thread), so `analyze` prints the same bytes with or without the helper
 * (test/cli/analyze.test.ts). It falls back to {@link fitAllLaws} on the calling thread when the
 * curve is short, the helper is not ready yet (unless `waitReady`: then up to 5 s), a custom law list is asked for, the helper fails, or
 * it does not answer within `timeoutMs` of the main thread's own part.
 * The calling thread waits with Atomics.wait, so analyzeRecord stays synchronous and the core pure.
 */
export function startFitHelper(timeoutMs = 60_000, waitReady = false): FitHelper {
  const ctl = new Int32Array(new SharedArrayBuffer(8));
  const { port1, port2 } = new MessageChannel();
  const worker = new Worker(new URL(import.meta.url), { workerData: { role: ROLE, port: port2, ctl }, transferList: [port2] });
  worker.unref();
  let broken = false;
  let shared = 0;
  worker.on('error', () => { broken = true; });
  worker.on('exit', () => { broken = true; });
  /** Waits (Atomics.wait) until the helper has posted `count` answers for this job, then takes the next one; undefined on timeout. */
  const next = (count: number, until: number): Answer | undefined => {
    while (Atomics.load(ctl, 1) < count) {
      const left = until - Date.now();
      if (left <= 0) return undefined;
      Atomics.wait(ctl, 1, Atomics.load(ctl, 1), Math.min(left, 1000));
    }
    return receiveMessageOnPort(port1)?.message as Answer | undefined;
  };
  const fitLaws: FitHelper['fitLaws'] = (strain, stress, opts) => {
    const laws = opts.laws ?? LAW_NAMES;
    const helperLaws = laws.filter((l) => !MAIN_GROUP.includes(l) && l !== EARLY);
    const usable = laws.includes('swiftVoce') && laws.includes('swift') && laws.includes(EARLY) && helperLaws.length > 0;
    if (waitReady && usable && !broken && strain.length >= FIT_THREAD_MIN_POINTS) Atomics.wait(ctl, 0, 0, 5000); // asked for two threads: let it start
    if (broken || !usable || Atomics.load(ctl, 0) !== 1 || strain.length < FIT_THREAD_MIN_POINTS) return fitAllLaws(strain, stress, opts);
    const p = opts.packed;
    const share = (a: Float64Array) => { const s = new Float64Array(new SharedArrayBuffer(a.byteLength)); s.set(a); return s; };
    Atomics.store(ctl, 1, 0);
    port1.postMessage({ x: share(p.x), y: share(p.y), lo: p.lo, hi: p.hi, early: EARLY, laws: helperLaws } satisfies Job);
    const started = Date.now();
    // On any failure, the whole fit again on this thread: it words an error exactly as the one-thread fit.
    const fallback = () => { broken = true; return fitAllLaws(strain, stress, opts); };
    let mine: Map<LawName, LawFit>;
    try {
      mine = fitLawGroup(['swift'], strain, stress, p);
    } catch {
      return fallback();
    }
    // A clock is fine here: this is the runner, not the core.
    const early = next(1, started + timeoutMs);
    if (!early || 'error' in early) return fallback();
    mine.set(EARLY, rebuiltFit(early.fits[0]!, p));
    try {
      mine = fitLawGroup(['swiftVoce'], strain, stress, p, mine);
    } catch {
      return fallback();
    }
    const rest = next(2, started + timeoutMs);
    if (!rest || 'error' in rest) return fallback();
    for (const d of rest.fits) mine.set(d.law, rebuiltFit(d, p));
    shared++;
    return compareLawFits(mine, stress, opts);
  };
  return {
    fitLaws,
    get shared() { return shared; },
    async close() {
      port1.close();
      await worker.terminate();
    },
  };
}
