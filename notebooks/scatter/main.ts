// Scatter notebook: the histogram of the final yield with the target and the probability of
// meeting it, following the final-pass slider. The Monte Carlo is the core's `runScatter` (the same
// function, seed and blocks as `strainledger run`): a quick preview from the first samples on every
// slider move, and the full run in a web worker once the slider rests.
import { Notebook, expose, slider, choice, valueStream, widthStream, h, quantity, fixed, formatNumber, DIGITS, byId, targetLabel } from '../../src/cells/index.js';
import { InputError, evaluateRoute, runScatter, type ScatterProblem, type ScatterSummary } from '../../src/core/index.js';
import { yieldHistogram } from '../../src/charts/scatter.js';
import { SCATTER_CAUTIONS } from '../../src/report/scatter.js';
import type { LoadedPlan } from '../../src/plan/load.js';
import { demoPlans, pageChrome } from '../shared/page.js';
import { lastFormingStep, withFinalPass } from './problem.js';

pageChrome('scatter/', 'Scatter');

// Plans with a scatter section (the invented demo plans in examples/).
const plans = demoPlans().filter((d) => d.plan.scatter !== undefined);
if (plans.length === 0) throw new Error('no demo plan with a scatter section in examples/');
const planInput = choice({ label: 'Plan', id: 'plan', options: plans.map((d) => ({ value: d.plan, text: `${d.plan.doc.name} (${d.file})` })) });
byId('plan-input').append(planInput);

/** The strain of the plan's last forming pass (the slider's starting value). */
function nominalFinalPass(plan: LoadedPlan): number {
  const i = lastFormingStep(plan.route.steps);
  return i < 0 ? 0 : evaluateRoute(plan.route).rows[i]!.strainIncrement;
}
const first = plans[0]!.plan;
const prestrainInput = slider({
  label: 'Final pass ε̄', min: 0, max: 1, step: 0.001, value: Number(nominalFinalPass(first).toFixed(3)),
  unit: '(equivalent true strain of the last forming pass)', id: 'prestrain',
});
byId('prestrain-input').append(prestrainInput);

// One worker for the page, started at once (so the first full run does not wait for it to load); a
// newer run replaces an older one still computing (the old worker is stopped and its run answers
// `null`, superseded).
type WorkerAnswer = { id: number; summary?: ScatterSummary; error?: { path?: string; value?: unknown; allowed?: string; message: string } };
let worker: Worker | null = null;
let running: { id: number; resolve: (s: ScatterSummary | null) => void; reject: (e: Error) => void } | null = null;
let nextId = 0;
function startWorker(): Worker {
  const w = new Worker(new URL('./worker.ts', import.meta.url), { type: 'module' });
  w.onmessage = (e: MessageEvent<WorkerAnswer>) => {
    const r = running;
    if (!r || e.data.id !== r.id) return;
    running = null;
    const err = e.data.error;
    if (err) {
      if (err.path !== undefined) {
        const ie = new InputError(err.path, err.value, err.allowed ?? '');
        ie.message = err.message;
        r.reject(ie);
      } else r.reject(new Error(err.message));
    } else r.resolve(e.data.summary!);
  };
  w.onerror = (e) => { running?.reject(new Error(`the sampling worker failed: ${e.message}`)); running = null; };
  return w;
}
worker = startWorker();
function sampleInWorker(problem: ScatterProblem): Promise<ScatterSummary | null> {
  if (running) {
    // Still computing an older problem: stop it (a worker cannot be interrupted mid-run).
    worker?.terminate();
    running.resolve(null);
    running = null;
    worker = startWorker();
  }
  worker ??= startWorker();
  const id = ++nextId;
  return new Promise((resolve, reject) => {
    running = { id, resolve, reject };
    worker!.postMessage({ id, problem });
  });
}

/**
 * Samples in the quick answer a slider move gets at once, on the page's thread (about 4 ms in
 * bench/notebook-latency.mjs). They are the first samples of block 0, i.e. the first samples of the
 * full run too (same seed and stream), so the preview is a subset of the final answer.
 */
export const PREVIEW_SAMPLES = 1024;
/** The full run starts once the slider has rested this long (ms); moves in between only preview. */
export const REFINE_AFTER_MS = 120;
const sleep = (ms: number) => new Promise<void>((r) => setTimeout(r, ms));

/** A summary on screen and how many samples it rests on. */
interface Shown { summary: ScatterSummary; full: boolean; samples: number; of: number }

let latestRun = 0;
let keptHistogram: { el: Element; plan: LoadedPlan; width: number } | null = null;
/** `?redraw` in the address: the preview redraws the histogram, as before (the latency bench compares the two). */
const REDRAW_HISTOGRAM = new URLSearchParams(location.search).has('redraw');
/**
 * The summary cell: a preview from {@link PREVIEW_SAMPLES} samples at once, then the full run from
 * the worker when the slider rests. A newer problem makes an older generator stop before it shows
 * anything stale. Fires `strainledger:refine` on window just before the full answer is shown (the
 * latency bench separates the two answers by it).
 */
async function* summaryStream(problem: ScatterProblem): AsyncGenerator<Shown, void, unknown> {
  const run = ++latestRun;
  if (problem.samples > PREVIEW_SAMPLES) {
    yield { summary: runScatter({ ...problem, samples: PREVIEW_SAMPLES }), full: false, samples: PREVIEW_SAMPLES, of: problem.samples };
  }
  const full = await nb.track((async () => {
    if (problem.samples > PREVIEW_SAMPLES) await sleep(REFINE_AFTER_MS);
    return run === latestRun ? sampleInWorker(problem) : null;
  })());
  if (full === null || run !== latestRun) return;
  window.dispatchEvent(new Event('strainledger:refine'));
  yield { summary: full, full: true, samples: problem.samples, of: problem.samples };
}

const nb = new Notebook();
nb.cell({ name: 'plan', fn: () => valueStream(planInput) })
  .cell({ name: 'prestrain', fn: () => valueStream(prestrainInput) })
  .cell({
    name: 'note', inputs: ['plan'], into: 'plan-note',
    fn: (plan: LoadedPlan) => {
      const p = plan.scatter!;
      return h('p', {}, `${p.samples} samples, seed ${p.seed}; inputs ${p.inputs.map((i) => `${i.name} cv ${fixed((i.sd / Math.abs(i.mean)) * 100, 1)} %`).join(', ')}. `,
        h('span', { class: 'sl-invented' }, 'INVENTED demo'));
    },
  })
  .cell({ name: 'problem', inputs: ['plan', 'prestrain'], fn: (plan: LoadedPlan, eps: number) => withFinalPass(plan.scatter!, eps) })
  .cell({ name: 'shown', inputs: ['problem'], fn: (problem: ScatterProblem) => summaryStream(problem) })
  .cell({
    name: 'numbers', inputs: ['shown', 'plan'], into: 'cell-numbers',
    fn: (shown: Shown, plan: LoadedPlan) => {
      const s = shown.summary;
      const S = plan.units.fromMPa;
      const u = plan.units.stress;
      const y = s.finalReloadYield;
      const tb = s.toleranceBound;
      const note = shown.full ? h('p', { class: 'sl-resolution' }, `From all ${shown.of.toLocaleString('en')} samples.`)
        : h('p', { class: 'sl-notice sl-resolution' }, `Preview from the first ${shown.samples.toLocaleString('en')} of ${shown.of.toLocaleString('en')} samples; the full run follows when the slider rests.`);
      return h('div', { 'data-resolution': shown.full ? 'full' : 'preview' }, note, h('dl', { class: 'sl-quantities', id: 'numbers' },
        quantity('probability all targets met', s.probabilityAllTargetsMet * 100, 2, `% (± ${fixed(s.probabilityStdError * 100, 2)} % sampling error)`, 'probability'),
        ...s.targets.map((t) => quantity(`probability the ${targetLabel(t.name)} target is met`, t.probabilityMet * 100, 2, '%', `p-${t.name}`)),
        quantity('final Rp0.2, mean', S(y.mean), DIGITS.stress, u, 'mean'),
        quantity('final Rp0.2, sd', S(y.sd), DIGITS.stress, u, 'sd'),
        quantity('final Rp0.2, 5 % point', S(y.p05), DIGITS.stress, u, 'p05'),
        quantity(`lower bound (${fixed(tb.coverage * 100, 0)} % coverage, ${fixed(tb.confidence * 100, 0)} % confidence)`, S(tb.value), DIGITS.stress, `${u}, ${tb.method}`, 'bound')));
    },
  })
  .cell({
    name: 'histogramWidth', fn: () => widthStream(byId('cell-histogram')),
  })
  .cell({
    name: 'histogram', inputs: ['shown', 'plan', 'histogramWidth'], into: 'cell-histogram',
    fn: (shown: Shown, plan: LoadedPlan, width: number) => {
      // A preview keeps the last full histogram on screen, dimmed and marked as updating (drawing a
      // histogram with Plot cost 15–35 ms per move in bench/notebook-latency.mjs); the full answer
      // redraws it. Only the first answer of the page, or one at a new width, draws a preview histogram.
      if (!REDRAW_HISTOGRAM && !shown.full && keptHistogram && keptHistogram.plan === plan && keptHistogram.width === width) {
        keptHistogram.el.setAttribute('data-resolution', 'updating');
        (keptHistogram.el as HTMLElement).style.opacity = '0.45';
        return keptHistogram.el;
      }
      const s = shown.summary;
      const S = plan.units.fromMPa;
      const t = plan.route.targets ?? {};
      const chart = yieldHistogram(Array.from(s.sorted.finalReloadYield, S), {
        stressUnit: plan.units.stress,
        ...(t.minYield !== undefined ? { minYield: +S(t.minYield).toPrecision(6) } : {}),
        ...(t.maxYield !== undefined ? { maxYield: +S(t.maxYield).toPrecision(6) } : {}),
        bound: S(s.toleranceBound.value),
        probability: s.probabilityAllTargetsMet,
        width,
      });
      chart.setAttribute('data-resolution', shown.full ? 'full' : 'preview');
      chart.setAttribute('id', 'histogram');
      if (shown.full) keptHistogram = { el: chart, plan, width };
      return chart;
    },
  })
  .cell({
    name: 'sensitivity', inputs: ['shown', 'plan'], into: 'cell-sensitivity',
    fn: ({ summary: s }: Shown, plan: LoadedPlan) => h('div', {},
      h('h3', {}, 'Which input drives the spread'),
      h('table', { class: 'sl-table', id: 'sensitivity' },
        h('thead', {}, h('tr', {}, ...['input', 'standardised regression coefficient', 'correlation with final Rp0.2'].map((x) => h('th', { scope: 'col' }, x)))),
        h('tbody', {}, ...s.sensitivity.inputs.map((i) => h('tr', {}, h('td', { class: 'text' }, i.input), h('td', {}, fixed(i.src, 3)), h('td', {}, fixed(i.correlation, 3)))))),
      h('p', {}, `Linear model R² ${fixed(s.sensitivity.linearR2, 3)}; first-order check: mean ${formatNumber(plan.units.fromMPa(s.deltaMethod.finalReloadYield.mean), 'stress', plan.units.stress)} ${plan.units.stress}, sd ${formatNumber(plan.units.fromMPa(s.deltaMethod.finalReloadYield.sd), 'stress', plan.units.stress)} ${plan.units.stress}.`)),
  })
  .cell({
    name: 'cautions', into: 'cell-scatter-cautions',
    fn: () => h('aside', { class: 'sl-cautions', 'aria-label': 'Scatter cautions' }, h('strong', {}, 'About these probabilities'), h('ul', {}, ...SCATTER_CAUTIONS.map((c) => h('li', {}, c)))),
  });

expose('scatter', nb);
