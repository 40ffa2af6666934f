// Scatter notebook: the histogram of the final yield with the target and the probability of
// meeting it, following the final-pass slider. The Monte Carlo is the core's `runScatter` (the same
// function, seed and blocks as `strainledger run`), computed in a web worker.
import { Notebook, expose, slider, choice, valueStream, h, quantity, fixed, formatNumber, DIGITS, byId } from '../../src/cells/index.js';
import { InputError, evaluateRoute, type ScatterProblem, type ScatterSummary } from '../../src/core/index.js';
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

// One worker per run; a newer run replaces an older one still computing.
let current: Worker | null = null;
let nextId = 0;
function sampleInWorker(problem: ScatterProblem): Promise<ScatterSummary> {
  current?.terminate();
  const w = new Worker(new URL('./worker.ts', import.meta.url), { type: 'module' });
  current = w;
  const id = ++nextId;
  return new Promise((resolve, reject) => {
    w.onmessage = (e: MessageEvent<{ id: number; summary?: ScatterSummary; error?: { path?: string; value?: unknown; allowed?: string; message: string } }>) => {
      if (e.data.id !== id) return;
      w.terminate();
      if (current === w) current = null;
      const err = e.data.error;
      if (err) {
        if (err.path !== undefined) {
          const ie = new InputError(err.path, err.value, err.allowed ?? '');
          ie.message = err.message;
          reject(ie);
        } else reject(new Error(err.message));
      } else resolve(e.data.summary!);
    };
    w.onerror = (e) => reject(new Error(`the sampling worker failed: ${e.message}`));
    w.postMessage({ id, problem });
  });
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
  .cell({ name: 'summary', inputs: ['problem'], fn: (problem: ScatterProblem) => sampleInWorker(problem) })
  .cell({
    name: 'numbers', inputs: ['summary', 'plan'], into: 'cell-numbers',
    fn: (s: ScatterSummary, plan: LoadedPlan) => {
      const S = plan.units.fromMPa;
      const u = plan.units.stress;
      const y = s.finalReloadYield;
      const tb = s.toleranceBound;
      return h('dl', { class: 'sl-quantities', id: 'numbers' },
        quantity('probability all targets met', s.probabilityAllTargetsMet * 100, 2, `% (± ${fixed(s.probabilityStdError * 100, 2)} % sampling error)`, 'probability'),
        ...s.targets.map((t) => quantity(`probability ${t.name} met`, t.probabilityMet * 100, 2, '%', `p-${t.name}`)),
        quantity('final Rp0.2, mean', S(y.mean), DIGITS.stress, u, 'mean'),
        quantity('final Rp0.2, sd', S(y.sd), DIGITS.stress, u, 'sd'),
        quantity('final Rp0.2, 5 % point', S(y.p05), DIGITS.stress, u, 'p05'),
        quantity(`lower bound (${fixed(tb.coverage * 100, 0)} % coverage, ${fixed(tb.confidence * 100, 0)} % confidence)`, S(tb.value), DIGITS.stress, `${u}, ${tb.method}`, 'bound'));
    },
  })
  .cell({
    name: 'histogram', inputs: ['summary', 'plan'], into: 'cell-histogram',
    fn: (s: ScatterSummary, plan: LoadedPlan) => {
      const S = plan.units.fromMPa;
      const t = plan.route.targets ?? {};
      const chart = yieldHistogram(Array.from(s.sorted.finalReloadYield, S), {
        stressUnit: plan.units.stress,
        ...(t.minYield !== undefined ? { minYield: +S(t.minYield).toPrecision(6) } : {}),
        ...(t.maxYield !== undefined ? { maxYield: +S(t.maxYield).toPrecision(6) } : {}),
        bound: S(s.toleranceBound.value),
        probability: s.probabilityAllTargetsMet,
      });
      chart.setAttribute('id', 'histogram');
      return chart;
    },
  })
  .cell({
    name: 'sensitivity', inputs: ['summary', 'plan'], into: 'cell-sensitivity',
    fn: (s: ScatterSummary, plan: LoadedPlan) => h('div', {},
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
