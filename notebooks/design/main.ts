// Route designer: a design specification (the `design` command's format) and the ranked routes it
// gives. Every number comes from the same functions the runner uses (loadDesignSpecText,
// designRoute, routeToPlan); the page only arranges and formats them. The route search (25–120 ms
// at small pass limits) runs in a web worker: a slider move marks the routes on screen as updating
// at once, and the worker's answer replaces them (`?sync` in the address runs it on the page's
// thread instead, as before: the latency bench compares the two).
import { Notebook, expose, slider, valueStream, h, fixed, formatNumber, autosave, restore, downloadText, planFileName, byId } from '../../src/cells/index.js';
import { designRoute, type DesignResult, type DesignedRoute } from '../../src/core/index.js';
import { designInput, type DesignAnswer } from './request.js';
import { loadDesignSpecText, routeToPlan, type LoadedDesignSpec } from '../../src/plan/designSpec.js';
import exampleSpec from '../../examples/design-fencing-wire.yaml?raw';
import { pageChrome } from '../shared/page.js';

pageChrome('design/', 'Route designer');

const SAVE_KEY = 'design-spec';
const FILE = 'design-spec.yaml';

// The specification text: the user's own (autosaved on every change), else the invented example.
const saved = restore(SAVE_KEY, (raw) => (typeof raw === 'string' ? raw : null));
const specArea = h('textarea', { id: 'spec-text', rows: 26, cols: 52, spellcheck: 'false' });
specArea.value = saved.value ?? exampleSpec;
const specWrap = h('div', { class: 'sl-input', id: 'spec-text-wrap' },
  h('label', { for: 'spec-text' }, 'Specification (YAML or JSON; the example is an INVENTED demo)'), specArea,
  h('button', { type: 'button', id: 'spec-reset' }, 'back to the invented example'));
Object.defineProperty(specWrap, 'value', { get: () => specArea.value });
specArea.addEventListener('change', () => { autosave(SAVE_KEY, specArea.value); specWrap.dispatchEvent(new Event('input')); });
specWrap.querySelector('#spec-reset')!.addEventListener('click', () => { specArea.value = exampleSpec; autosave(SAVE_KEY, exampleSpec); specWrap.dispatchEvent(new Event('input')); });
byId('spec-input').append(specWrap);

// Two what-if sliders over the specification's own limits (NaN = use the file's value until moved).
const passInput = slider({ label: 'Largest reduction per pass (overrides the file)', min: 5, max: 60, step: 0.5, value: 30, unit: '%', id: 'pass' });
const marginInput = slider({ label: 'Ductility margin (overrides the file)', min: 0, max: 0.6, step: 0.01, value: 0.2, unit: '(fraction kept in reserve)', id: 'margin' });
byId('pass-input').append(passInput);
byId('margin-input').append(marginInput);

const routeSizes = (spec: LoadedDesignSpec, r: DesignedRoute): string => {
  const u = spec.units;
  const digits = u.length === 'mm' ? 3 : 4;
  return [fixed(u.fromMm(spec.spec.startSize), digits), ...r.steps.map((s) => s.kind === 'anneal' ? 'anneal'
    : fixed(u.fromMm((s.kind === 'draw' ? s.diameter : (s as { thickness?: number }).thickness)!), digits))].join(' → ');
};

// One worker for the page, started at once. Only the newest request matters: while the worker is
// busy, a newer request waits (replacing any older waiting one) and an answer to a request that is
// no longer the newest is dropped; the worker is never restarted, so it keeps its parsed spec.
const SYNC = new URLSearchParams(location.search).has('sync');
const worker = SYNC ? null : new Worker(new URL('./worker.ts', import.meta.url), { type: 'module' });
type Pending = { id: number; text: string; pass: number; margin: number; resolve: (r: DesignResult | null) => void; reject: (e: Error) => void };
let busy: Pending | null = null;
let waiting: Pending | null = null;
let nextId = 0;
function post(p: Pending): void { busy = p; worker!.postMessage({ id: p.id, text: p.text, file: FILE, pass: p.pass, margin: p.margin }); }
if (worker) {
  worker.onmessage = (e: MessageEvent<DesignAnswer>) => {
    const done = busy;
    busy = null;
    if (done && e.data.id === done.id) {
      if (e.data.error) done.reject(new Error(e.data.error.message));
      else done.resolve(waiting ? null : e.data.result!);
    }
    if (waiting) { const w = waiting; waiting = null; post(w); }
  };
  worker.onerror = (e) => { busy?.reject(new Error(`the route search worker failed: ${e.message}`)); busy = null; };
}
function searchInWorker(text: string, pass: number, margin: number): Promise<DesignResult | null> {
  return new Promise((resolve, reject) => {
    const p: Pending = { id: ++nextId, text, pass, margin, resolve, reject };
    if (busy) { waiting?.resolve(null); waiting = p; } else post(p);
  });
}

/** Routes on screen, and whether they answer the current sliders (false: the last answer, being updated). */
interface Shown { result: DesignResult; current: boolean }
let latest = 0;
let lastShown: DesignResult | null = null;
/**
 * The result cell: at once the last answer marked as updating, then the worker's answer for these
 * values. Fires `strainledger:refine` on window just before the new answer is shown (the latency
 * bench separates the two by it); `nb.track` makes `idle()` wait for it.
 */
async function* resultStream(text: string, s: LoadedDesignSpec, pass: number, margin: number): AsyncGenerator<Shown, void, unknown> {
  if (SYNC) { yield { result: designRoute(designInput(s, pass, margin)), current: true }; return; }
  const run = ++latest;
  if (lastShown) yield { result: lastShown, current: false };
  const result = await nb.track(searchInWorker(text, pass, margin));
  if (result === null || run !== latest) return;
  lastShown = result;
  window.dispatchEvent(new Event('strainledger:refine'));
  yield { result, current: true };
}
const updating = (shown: Shown) => shown.current ? null
  : h('p', { class: 'sl-notice sl-resolution' }, 'Updating: these routes are for the previous slider values; the new search is running.');

const nb = new Notebook();
nb.cell({ name: 'specText', fn: () => valueStream(specWrap as unknown as HTMLElement & { value: string }) })
  .cell({ name: 'passLimit', fn: () => valueStream(passInput) })
  .cell({ name: 'margin', fn: () => valueStream(marginInput) })
  .cell({
    name: 'spec', inputs: ['specText'], into: 'cell-spec-note',
    fn: (text: string): LoadedDesignSpec => loadDesignSpecText(text, FILE),
    render: (v) => {
      const s = v as LoadedDesignSpec;
      return h('p', {}, `${s.doc.name}: ${s.doc.process.kind === 'draw' ? 'drawing' : 'rolling'} from ${fixed(s.units.fromMm(s.spec.startSize), 4)} to ${fixed(s.units.fromMm(s.spec.finalSize), 4)} ${s.units.length}. `,
        /INVENTED/i.test(s.doc.name + (s.doc.description ?? '')) ? h('span', { class: 'sl-invented' }, 'INVENTED demo') : null);
    },
  })
  .cell({
    name: 'result', inputs: ['specText', 'spec', 'passLimit', 'margin'],
    fn: (text: string, s: LoadedDesignSpec, pass: number, margin: number) => resultStream(text, s, pass, margin),
  })
  .cell({
    name: 'summary', inputs: ['result'], into: 'cell-summary',
    fn: ({ result: res, current }: Shown) => h('div', { id: 'summary', 'data-resolution': current ? 'full' : 'updating' }, updating({ result: res, current }),
      h('p', {}, `Total strain ${fixed(res.totalStrain, 3)}; at most ${fixed(res.maxStrainBeforeAnneal, 3)} between anneals and ${fixed(res.passStrainLimit, 3)} per pass. ${res.window.note}. ${res.candidatesTried} candidate schedules run through the ledger.`),
      res.feasible ? null : h('div', { class: 'sl-error', role: 'alert', id: 'binding' },
        h('strong', {}, `No route: the binding limit is ${res.binding!.limit}. `), res.binding!.explanation)),
  })
  .cell({
    name: 'routes', inputs: ['spec', 'result'], into: 'cell-routes',
    fn: (spec: LoadedDesignSpec, { result: res, current }: Shown) => {
      const u = spec.units;
      return h('ol', { id: 'routes', 'data-resolution': current ? 'full' : 'updating' }, ...res.routes.map((r) => {
        const last = r.ledger.rows[r.ledger.rows.length - 1]!;
        const button = h('button', { type: 'button', 'data-route': String(r.rank) }, `download route ${r.rank} as a plan`);
        button.addEventListener('click', () => downloadText(planFileName(`${spec.doc.name} route ${r.rank}`), JSON.stringify(routeToPlan(spec, r.steps, r.rank), null, 2) + '\n'));
        return h('li', { 'data-rank': String(r.rank) },
          h('p', {}, h('strong', {}, `${r.anneals} anneal${r.anneals === 1 ? '' : 's'}, ${r.passes} passes`),
            ` — final reduction ${fixed(r.finalReductionPct, 1)} %; smallest margins: window ${fixed(r.windowMargin * 100, 1)} %, passes ${fixed(r.passMargin * 100, 1)} % (${r.governingPassLimit} governs), anneal ${fixed(r.annealMargin * 100, 1)} %`),
          h('p', { class: 'sl-sizes' }, `sizes (${u.length}): ${routeSizes(spec, r)}`),
          h('p', {}, `final reload yield Rp0.2 ${formatNumber(u.fromMPa(last.reloadYield), 'stress', u.stress)} ${u.stress}, tensile strength Rm ${formatNumber(u.fromMPa(last.tensileStrength), 'stress', u.stress)} ${u.stress} (engineering, on the final section)`),
          r.annealNotes.length ? h('ul', {}, ...r.annealNotes.map((n) => h('li', {}, `after pass ${n.afterPass}: ${n.reason}`))) : h('p', {}, 'no anneal needed: the whole reduction lands in the window'),
          button);
      }));
    },
  });

expose('design', nb);
