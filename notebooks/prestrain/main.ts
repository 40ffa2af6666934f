// Prestrain explorer: the cell graph. Every number comes from the core (stateProperties,
// chordModulus, makeLaw); the page only arranges and formats them.
import {
  Notebook, expose, slider, stepSlider, choice, valueStream, widthStream, h, quantity, fixed, formatLaw, DIGITS, restore, byId,
} from '../../src/cells/index.js';
import {
  makeLaw, fitAllLaws, stateProperties, chordModulus, reductionPctFromStrain, LAW_PARAMETERS, LAW_NAMES, PROOF_OFFSET, InputError, defaultHardnessModel,
} from '../../src/core/index.js';
import type { FlowLaw, LawSpec, Material } from '../../src/core/index.js';
import { flowCurveChart, loadUnloadChart, markPrestrain } from '../../src/charts/prestrain.js';
import { BENCH_MATERIAL_KEY, demoPlans, pageChrome } from '../shared/page.js';
import { chartStreams } from '../shared/chartStream.js';

pageChrome('prestrain/', 'Prestrain explorer');

/** A material with one or more laws to compare (stresses in MPa). */
export interface LawSet {
  name: string;
  invented: boolean;
  elasticModulus: number;
  modulusDecay?: Material['modulusDecay'];
  testedRange: readonly [number, number] | null;
  laws: { label: string; law: FlowLaw }[];
  /** Tabor hardness model of a demo plan's material (its own c); the defaults otherwise. */
  hardness?: Material['hardness'];
}

// A law as an engineer writes it (src/report/numbers.ts): 4 significant figures, a parameter a fit
// collapsed onto its bound as "0 (at bound)", stresses with their unit.
const lawLabel = (law: FlowLaw) => formatLaw(law.law, law.params, 'MPa');
/** The law specs of a set, as the typed-in box writes them (full precision: this is data, not display). */
const lawSpecs = (laws: readonly FlowLaw[]) => laws.map((law) => ({ law: law.law, ...Object.fromEntries(LAW_PARAMETERS[law.law].map((p) => [p.name, law.params[p.name]!])) }));

// Material sources: the invented demo plans, a law typed in, and the record bench's saved fits.
type Source = { kind: 'demo'; index: number } | { kind: 'typed' } | { kind: 'bench' };
const demos = demoPlans();
const sources: { value: Source; text: string }[] = [
  ...demos.map((d, index) => ({ value: { kind: 'demo', index } as Source, text: `${d.plan.route.material.name} — INVENTED demo (${d.file})` })),
  { value: { kind: 'typed' }, text: 'a law typed in (JSON below)' },
  { value: { kind: 'bench' }, text: 'the law saved from the record bench' },
];
const sourceInput = choice({ label: 'Material', options: sources, id: 'material' });
byId('material-input').append(sourceInput);

// The box always shows the law in use: the chosen material's E and law (read-only) or, with "a law
// typed in", the user's own text (editable). The user's text is kept while another material is shown;
// until the user edits it, it starts from the law last in use, so its E is the material's.
const lawText = h('textarea', { id: 'law-text', rows: 5, cols: 44, spellcheck: 'false' });
lawText.value = JSON.stringify({ elasticModulus: 70000, laws: [{ law: 'voce', sigma0: 120, Q: 160, b: 12 }, { law: 'hollomon', K: 400, n: 0.2 }] }, null, 1);
lawText.readOnly = true;
let typedDraft: string | null = null;
const lawTextLabel = h('label', { for: 'law-text', id: 'law-text-label' }, 'Law in use (MPa)');
const lawTextWrap = h('div', { class: 'sl-input', id: 'law-text-wrap' }, lawTextLabel, lawText);
Object.defineProperty(lawTextWrap, 'value', { get: () => lawText.value });
lawText.addEventListener('input', () => { if (!lawText.readOnly) typedDraft = lawText.value; });
lawText.addEventListener('change', () => { if (!lawText.readOnly) typedDraft = lawText.value; lawTextWrap.dispatchEvent(new Event('input')); });
/** Shows the law in use in the box (read-only) or the user's draft (editable). */
function showLawInBox(inUse: { elasticModulus: number; laws: readonly FlowLaw[] } | 'typed'): void {
  if (inUse === 'typed') {
    // Already editable: the box holds what the user is typing; never overwrite it.
    if (!lawText.readOnly) return;
    typedDraft ??= lawText.value;
    lawText.readOnly = false;
    lawText.value = typedDraft;
    lawTextLabel.textContent = 'Law typed in (MPa; edit, then leave the box to apply)';
    return;
  }
  lawText.readOnly = true;
  lawText.value = JSON.stringify({ elasticModulus: inUse.elasticModulus, laws: lawSpecs(inUse.laws) }, null, 1);
  lawTextLabel.textContent = 'Law in use (MPa; read-only — choose "a law typed in" to edit a copy)';
}
byId('law-text-input').append(lawTextWrap);

const PRESTRAIN_MAX = 1.5;
const prestrainInput = slider({ label: 'Prestrain ε̄', min: 0, max: PRESTRAIN_MAX, step: 0.001, value: 0.1, unit: '(equivalent true plastic strain)', id: 'prestrain' });
byId('prestrain-input').append(prestrainInput);

type Mode = 'uniaxial' | 'plane' | 'equibiaxial';
const modeInput = stepSlider<Mode>({
  label: 'Forming mode', id: 'mode', value: 'uniaxial',
  options: [{ value: 'uniaxial', text: 'uniaxial (stretch, draw)' }, { value: 'plane', text: 'plane strain (roll)' }, { value: 'equibiaxial', text: 'equibiaxial (bulge)' }],
});
byId('mode-input').append(modeInput);

function parseTyped(text: string): LawSet {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (e) {
    throw new InputError('law typed in', text.slice(0, 40), `JSON such as {"elasticModulus": 200000, "laws": [{"law": "hollomon", "K": 600, "n": 0.21}]} (${(e as Error).message})`);
  }
  const o = raw as { elasticModulus?: unknown; laws?: unknown };
  const E = o.elasticModulus;
  if (typeof E !== 'number' || !(E > 0) || !Number.isFinite(E)) throw new InputError('elasticModulus', E, 'a number of MPa above 0');
  if (!Array.isArray(o.laws) || o.laws.length === 0) throw new InputError('laws', o.laws, `a list of one or more laws (${LAW_NAMES.join(', ')})`);
  const laws = o.laws.map((spec, i) => makeLaw(spec as LawSpec, `laws[${i}]`));
  return { name: 'typed in', invented: false, elasticModulus: E, testedRange: null, laws: laws.map((law) => ({ label: lawLabel(law), law })) };
}

function benchSet(): LawSet {
  const stored = restore(BENCH_MATERIAL_KEY, (raw) => raw as { name: string; elasticModulus: number; flowCurve: LawSpec; alternatives?: LawSpec[]; fittedStrainRange?: [number, number]; modulusDecay?: { Ea: number; xi: number } });
  const m = stored.value;
  if (!m) throw new Error(stored.problem ?? 'no law has been saved from the record bench yet: open the record bench, choose a law and press "use in the other notebooks"');
  const specs = [m.flowCurve, ...(m.alternatives ?? []).filter((s) => s.law !== m.flowCurve.law)];
  const laws = specs.map((s, i) => makeLaw(s, `record bench law ${i + 1}`));
  return { name: m.name, invented: false, elasticModulus: m.elasticModulus, ...(m.modulusDecay ? { modulusDecay: m.modulusDecay } : {}), testedRange: m.fittedStrainRange ?? null, laws: laws.map((law) => ({ label: lawLabel(law), law })) };
}

/**
 * The other laws, each fitted (fitAllLaws, the record bench's fitter) to the given law's curve over
 * the strain range a tensile test would reach: they agree there and show where they part ways.
 */
function companions(law: FlowLaw, range: readonly [number, number]): { label: string; law: FlowLaw }[] {
  const N = 60;
  const eps = Array.from({ length: N }, (_, i) => range[0] + ((range[1] - range[0]) * i) / (N - 1));
  const cmp = fitAllLaws(eps, eps.map((e) => law.stress(e)), { laws: LAW_NAMES.filter((l) => l !== law.law && l !== 'swiftVoce') });
  return cmp.fits.filter((f) => f.converged).map((f) => {
    const fitted = makeLaw({ law: f.law, ...f.params } as LawSpec, f.law);
    return { label: `${lawLabel(fitted)}, fitted to it on ${fixed(range[0], 3)}–${fixed(range[1], 3)}`, law: fitted };
  });
}

const chartStream = chartStreams(() => nb);
const nb = new Notebook();
nb.cell({ name: 'source', fn: () => valueStream(sourceInput) })
  .cell({ name: 'lawText', fn: () => valueStream(lawTextWrap as unknown as HTMLElement & { value: string }) })
  .cell({ name: 'prestrain', fn: () => valueStream(prestrainInput) })
  .cell({ name: 'mode', fn: () => valueStream(modeInput) })
  .cell({
    name: 'lawSet', inputs: ['source', 'lawText'], into: 'material-note',
    fn: (source: Source, _text: string): LawSet => {
      if (source.kind === 'typed') {
        showLawInBox('typed');
        return parseTyped(lawText.value);
      }
      if (source.kind === 'bench') {
        const set = benchSet();
        showLawInBox({ elasticModulus: set.elasticModulus, laws: set.laws.map((x) => x.law) });
        return set;
      }
      const m = demos[source.index]!.plan.route.material;
      showLawInBox({ elasticModulus: m.elasticModulus, laws: [m.law] });
      const tested = m.fittedStrainRange ?? [PROOF_OFFSET, m.law.uniformStrain()] as const;
      return { name: m.name, invented: true, elasticModulus: m.elasticModulus, ...(m.modulusDecay ? { modulusDecay: m.modulusDecay } : {}), ...(m.hardness ? { hardness: m.hardness } : {}), testedRange: tested, laws: [{ label: lawLabel(m.law), law: m.law }, ...companions(m.law, tested)] };
    },
    render: (v) => {
      const s = v as LawSet;
      return h('p', {}, `E = ${fixed(s.elasticModulus, 0)} MPa; ${s.laws.length} law${s.laws.length > 1 ? 's' : ''}. `,
        s.invented ? h('span', { class: 'sl-invented' }, 'INVENTED demo, handbook law') : null);
    },
  })
  .cell({
    name: 'materialName', inputs: ['lawSet'], into: 'cell-material-name',
    fn: (s: LawSet) => h('span', {}, `— ${s.name}`),
  })
  .cell({
    name: 'states', inputs: ['lawSet', 'prestrain'],
    fn: (s: LawSet, eps: number) => s.laws.map(({ label, law }) => {
      const m: Material = { name: s.name, elasticModulus: s.elasticModulus, poissonRatio: 0.3, law, ...(s.modulusDecay ? { modulusDecay: s.modulusDecay } : {}), ...(s.hardness ? { hardness: s.hardness } : {}) };
      return { label, law, material: m, uniformStrain: law.uniformStrain(), props: stateProperties(m, eps) };
    }),
  })
  .cell({
    name: 'numbers', inputs: ['states', 'prestrain', 'lawSet'], into: 'cell-numbers',
    fn: (states: { props: ReturnType<typeof stateProperties>; uniformStrain: number }[], eps: number, s: LawSet) => {
      const p = states[0]!.props;
      const hm = s.hardness ?? defaultHardnessModel();
      const basis = hm.basis === 'fitted' ? `c ${fixed(hm.taborFactor, 3)} fitted to ${hm.readings} readings` : hm.basis === 'given' ? `c ${fixed(hm.taborFactor, 3)} given in the plan` : `default c ${fixed(hm.taborFactor, 3)}`;
      return h('div', {}, h('dl', { class: 'sl-quantities', id: 'numbers' },
        quantity('prestrain ε̄', eps, 3, '', 'prestrain'),
        quantity('reload yield Rp0.2 (engineering, own section)', p.reloadYield, DIGITS.stress, 'MPa', 'reloadYield'),
        quantity('tensile strength Rm (engineering, own section)', p.tensileStrength, DIGITS.stress, 'MPa', 'tensileStrength'),
        quantity('yield ratio Rp0.2/Rm', p.yieldRatio, DIGITS.ratio, '', 'yieldRatio'),
        quantity('elastic recovery σ/E(ε̄)', p.elasticRecoveryStrain * 100, DIGITS.recoveryPct, '% strain', 'elasticRecovery'),
        quantity('remaining uniform elongation', p.remainingUniformElongationPct, DIGITS.pct, '%', 'remainingElongation'),
        quantity('unloading modulus E(ε̄)', p.elasticModulus, 0, 'MPa', 'modulus'),
        quantity('uniform strain εu (Considère)', states[0]!.uniformStrain, DIGITS.strain, '', 'uniformStrain'),
        quantity('Vickers hardness (Tabor estimate)', p.hardnessHV, 1, 'HV', 'hardnessHV')),
        h('p', { class: 'sl-note', id: 'hardness-note' },
          `HV = c·σ(ε̄ + ${hm.representativeStrain})/9.80665 (Tabor), ${basis}. An estimate, typically within 10–15 %: release parts by measured hardness.`));
    },
  })
  .cell({
    name: 'reductions', inputs: ['prestrain', 'mode'], into: 'cell-reductions',
    fn: (eps: number, mode: Mode) => {
      // Equivalent strain → reductions (von Mises; Marciniak, Duncan & Hu §3.4; see core/route/strain.ts).
      const rows: [string, string][] = mode === 'uniaxial'
        ? [['stretch (engineering)', `${fixed(Math.expm1(eps) * 100, 1)} %`], ['area reduction (drawing)', `${fixed(reductionPctFromStrain('area', eps), 1)} %`]]
        : mode === 'plane'
          ? [['thickness strain ε̄·√3/2', fixed(eps * Math.sqrt(3) / 2, 4)], ['thickness reduction (rolling)', `${fixed(reductionPctFromStrain('thickness', eps), 1)} %`]]
          : [['major strain ε1 = ε̄/2', fixed(eps / 2, 4)], ['thickness reduction', `${fixed(-Math.expm1(-eps) * 100, 1)} %`]];
      return h('table', { class: 'sl-table', id: 'reductions' }, h('tbody', {}, ...rows.map(([k, v]) => h('tr', {}, h('td', { class: 'text' }, k), h('td', {}, v)))));
    },
  })
  .cell({
    // The curves span the slider's whole range, so a slider move never redraws them.
    name: 'curves', inputs: ['lawSet'],
    fn: (s: LawSet) => {
      const top = PRESTRAIN_MAX;
      const N = 150;
      return s.laws.map(({ label, law }) => ({ label, points: Array.from({ length: N + 1 }, (_, i) => ({ strain: (top * i) / N, stress: law.stress((top * i) / N) })) }));
    },
  })
  .cell({ name: 'flowWidth', fn: () => widthStream(byId('cell-flow-chart')) })
  .cell({ name: 'lurWidth', fn: () => widthStream(byId('cell-lur-chart')) })
  .cell({
    name: 'flowBase', inputs: ['curves', 'lawSet', 'flowWidth'],
    fn: (curves: { label: string; points: { strain: number; stress: number }[] }[], s: LawSet, width: number) =>
      flowCurveChart(curves, { stressUnit: 'MPa', testedRange: s.testedRange ?? [0, Math.min(...s.laws.map((x) => x.law.uniformStrain()))], width }),
  })
  .cell({
    // A slider move only moves the marker on the chart drawn above (same element, no redraw).
    name: 'flowChart', inputs: ['flowBase', 'states', 'prestrain'], into: 'cell-flow-chart',
    fn: (chart: SVGSVGElement | HTMLElement, states: { law: FlowLaw }[], eps: number) => {
      // On the flow curve (true stress vs true plastic strain) the proof point sits at ε̄ + 0.002 with
      // its TRUE stress; the Rp0.2 shown in the numbers is that times e^(−0.002), the engineering value.
      markPrestrain(chart, eps, states.map((x) => ({ strain: eps + PROOF_OFFSET, stress: x.law.stress(eps + PROOF_OFFSET) })));
      chart.setAttribute('data-prestrain', String(eps));
      return chart;
    },
  })
  .cell({
    name: 'lurChart', inputs: ['lawSet', 'prestrain', 'lurWidth'], into: 'cell-lur-chart',
    fn: (s: LawSet, eps: number, width: number) => {
      const law = s.laws[0]!.law;
      const E = (ep: number) => chordModulus(s.elasticModulus, s.modulusDecay, ep);
      const N = 60;
      const s0 = law.stress(0);
      const loading = [{ strain: 0, stress: 0 }, { strain: s0 / E(0), stress: s0 }];
      for (let i = 1; i <= N; i++) { const ep = (eps * i) / N; const sg = law.stress(ep); loading.push({ strain: ep + sg / E(ep), stress: sg }); }
      const top = law.stress(eps);
      const Eu = E(eps);
      const unloading = [{ strain: eps + top / Eu, stress: top }, { strain: eps, stress: 0 }];
      const extra = Math.max(0.02, eps * 0.25);
      const reloading = [{ strain: eps, stress: 0 }];
      for (let i = 0; i <= N; i++) { const ep = eps + (extra * i) / N; const sg = law.stress(ep); reloading.push({ strain: ep + sg / Eu, stress: sg }); }
      // While the slider moves: the three legs retraced on the kept chart (the recovery bracket and its
      // label hidden until Plot redraws the chart when the slider rests).
      return chartStream('lurChart', String(width), [loading, unloading, reloading].map((leg) => leg.map((p) => ({ x: p.strain, y: p.stress }))), undefined,
        () => loadUnloadChart({ loading, unloading, reloading, recovery: { from: eps, to: eps + top / Eu } }, { stressUnit: 'MPa', width }) as Element,
        ['g[aria-label="line"] ~ g[aria-label="rule"]', 'g[aria-label="text"]']);
    },
  })
  .cell({
    name: 'laws', inputs: ['states', 'curves', 'lawSet'], into: 'cell-laws',
    fn: (states: { label: string; uniformStrain: number; props: ReturnType<typeof stateProperties> }[], curves: { points: { strain: number; stress: number }[] }[], s: LawSet) => {
      const head = ['law', 'εu', 'flow stress MPa (true)', 'reload yield Rp0.2 MPa (eng.)', 'Rm MPa (eng.)', 'Rp0.2/Rm', 'recovery % strain', 'remaining uniform elongation %', 'HV (Tabor estimate)'];
      const table = h('table', { class: 'sl-table', id: 'law-table' },
        h('thead', {}, h('tr', {}, ...head.map((x) => h('th', { scope: 'col' }, x)))),
        h('tbody', {}, ...states.map((x) => h('tr', {},
          h('td', { class: 'text' }, x.label), h('td', {}, fixed(x.uniformStrain, DIGITS.strain)), h('td', {}, fixed(x.props.flowStress, DIGITS.stress)),
          h('td', {}, fixed(x.props.reloadYield, DIGITS.stress)), h('td', {}, fixed(x.props.tensileStrength, DIGITS.stress)),
          h('td', {}, fixed(x.props.yieldRatio, DIGITS.ratio)), h('td', {}, fixed(x.props.elasticRecoveryStrain * 100, DIGITS.recoveryPct)),
          h('td', {}, fixed(x.props.remainingUniformElongationPct, DIGITS.pct)), h('td', {}, fixed(x.props.hardnessHV, 1))))));
      if (states.length < 2) return h('div', {}, table, h('p', {}, 'Only one law for this material. Fit every law to a record in the record bench (or type several laws in) to see where they part ways beyond the tested range.'));
      // Where the laws part ways: their largest spread inside the tested range, and the first
      // sampled strain beyond it at which their stresses differ by more than 5 %.
      const tested = s.testedRange ?? [PROOF_OFFSET, Math.min(...states.map((x) => x.uniformStrain))];
      const pts = curves[0]!.points;
      const spreadAt = (i: number) => {
        const ys = curves.map((c) => c.points[i]!.stress);
        return Math.min(...ys) > 0 ? (Math.max(...ys) - Math.min(...ys)) / Math.min(...ys) : 0;
      };
      let inside = 0;
      let from: number | null = null;
      for (let i = 0; i < pts.length; i++) {
        const e = pts[i]!.strain;
        if (e >= tested[0] && e <= tested[1]) inside = Math.max(inside, spreadAt(i));
        else if (e > tested[1] && from === null && spreadAt(i) > 0.05) from = e;
      }
      const ry = states.map((x) => x.props.reloadYield);
      const spread = (Math.max(...ry) - Math.min(...ry)) / Math.min(...ry) * 100;
      return h('div', {}, table, h('p', { id: 'law-spread' },
        `At this prestrain the laws' reload yields differ by ${fixed(spread, 1)} %. `,
        `Inside the strain range they rest on (${fixed(tested[0], 3)} to ${fixed(tested[1], 3)}) their flow stresses differ by at most ${fixed(inside * 100, 1)} %; `,
        from === null ? 'beyond it they stay within 5 % of each other over the whole chart.' : `beyond it they differ by more than 5 % from ε̄ ≈ ${fixed(from, 3)} on.`));
    },
  });

expose('prestrain', nb);
