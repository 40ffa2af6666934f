// Record bench: a tensile record in, properties and law fits out — through the same record parser
// (src/records) and analysis (analyzeRecord, fitAllLaws) as the runner, computed in a web worker
// (worker.ts) so that a large record never freezes the page.
import {
  Notebook, expose, h, fixed, formatLawParam, DIGITS, fileDrop, readRecordFileDecoded, errorBox, byId, autosave, choice, restore,
  widthStream,
} from '../../src/cells/index.js';
import { InputError, LAW_PARAMETERS, LAW_TITLES } from '../../src/core/index.js';
import type { LawName, TensileAnalysis } from '../../src/core/index.js';
import { PlanError } from '../../src/plan/problems.js';
import { ENCODING_NOTE, layoutOf, readingWarnings, STRESS_UNITS, FORCE_UNITS, LENGTH_UNITS, type RecordEncoding } from '../../src/records/index.js';
import type { WorkerError, WorkerReply, WorkerRequest } from './worker.js';
import type { RecordOptions, TensileRecord } from '../../src/records/index.js';
import { recordCurveChart, residualChart } from '../../src/charts/records.js';
import { BENCH_MATERIAL_KEY, pageChrome } from '../shared/page.js';
import { sig4 } from '../../src/core/numeric/sig4.js';
import { noiseStatement } from '../../src/report/noise.js';

pageChrome('records/', 'Record bench');

interface Input { name: string; text: string; demo?: boolean; encoding?: RecordEncoding }
type Parsed = { ok: true; input: Input; record: TensileRecord; analysis: TensileAnalysis | null; analysisError: unknown; tests: { count: number; shown: number } } | { ok: false; input: Input; error: unknown };

/** The error a worker sent as data, as the class the error cells know. */
function rebuild(e: WorkerError): Error {
  if (e.kind === 'plan') return new PlanError(e.problems);
  if (e.kind === 'input') {
    const x = new InputError(e.path, e.value, e.allowed);
    x.message = e.message;
    return x;
  }
  return new Error(e.message);
}

// One worker for the page; a newer record supersedes a reply still on its way.
let worker: Worker | null = null;
let nextId = 0;
const waiting = new Map<number, (r: WorkerReply) => void>();
function readInWorker(input: Input, options: RecordOptions, test: number, modulus: number | undefined): Promise<WorkerReply> {
  if (!worker) {
    worker = new Worker(new URL('./worker.ts', import.meta.url), { type: 'module' });
    worker.onmessage = (e: MessageEvent<WorkerReply>) => { waiting.get(e.data.id)?.(e.data); waiting.delete(e.data.id); };
    worker.onerror = (e) => {
      for (const [id, done] of waiting) done({ id, ok: false, error: { kind: 'other', message: `the record worker failed: ${e.message}` } });
      waiting.clear();
      worker?.terminate();
      worker = null;
    };
  }
  const id = ++nextId;
  return new Promise((resolve) => {
    waiting.set(id, resolve);
    const msg: WorkerRequest = { id, name: input.name, text: input.text, options, test, ...(modulus !== undefined ? { modulus } : {}) };
    worker!.postMessage(msg);
  });
}

const nb = new Notebook();
let options: RecordOptions = {};
/** The specimen's Young's modulus the user gave (MPa), for the analysis: used instead of the measured one. */
let modulus: number | undefined;
let current: Input | null = null;
let lastGood: Extract<Parsed, { ok: true }> | null = null;

// Choose or drop a file; examples/*.csv (if any) are offered as INVENTED demo records.
const EXAMPLE_RECORDS = import.meta.glob('../../examples/*.{csv,tsv,txt}', { query: '?raw', import: 'default', eager: true }) as Record<string, string>;
const fileInput = h('input', { type: 'file', id: 'record-file', accept: '.csv,.tsv,.txt,text/csv,text/plain' });
const drop = h('div', { class: 'sl-drop', id: 'record-drop', role: 'button', 'aria-label': 'Record file: drop it here or press Enter to choose' },
  'Drop a tensile-test export (CSV, tab-separated or fixed-width text) here, or ', h('label', { for: 'record-file' }, 'choose one: '), fileInput);
// How the dropped file's bytes were read (set by the read step, which fileDrop awaits before it hands over the text).
let droppedAs: RecordEncoding = 'utf-8';
const readDropped = async (f: File) => { const d = await readRecordFileDecoded(f); droppedAs = d.encoding; return d.text; };
fileDrop(drop, fileInput, (name, text) => load({ name, text, encoding: droppedAs }, {}), (e) => byId('cell-import').replaceChildren(errorBox(e, 'The file could not be read')), readDropped);
byId('record-input').append(drop);
const examples = Object.entries(EXAMPLE_RECORDS);
const DEMO_FIRST = 'stamping-strip-loops.csv';
examples.sort(([a], [b]) => Number(b.endsWith(DEMO_FIRST)) - Number(a.endsWith(DEMO_FIRST)));
if (examples.length) {
  const ex = choice({ label: 'Demo record (INVENTED)', id: 'example', options: examples.map(([p], i) => ({ value: i, text: p.split('/').pop()! })) });
  byId('record-input').append(h('div', { class: 'sl-input' }, ex, h('button', { type: 'button', id: 'load-example', onclick: () => { const [p, t] = examples[ex.value]!; load({ name: p.split('/').pop()!, text: t, demo: true }, {}); } }, 'open')));
}

/** Reads and analyses `input`; a new file starts without a given modulus (it belongs to the specimen, not the page). */
function load(input: Input, opts: RecordOptions, test = 1, givenModulus: number | undefined = undefined): void {
  current = input;
  options = opts;
  modulus = givenModulus;
  nb.set('input', { input, options: opts, test, modulus: givenModulus });
  drawMapping();
}

/** The column and unit form: shown for every record, needed when columns or units are not recognised. */
function drawMapping(): void {
  const box = byId('mapping');
  if (!current) { box.replaceChildren(h('p', {}, 'Open a record first.')); return; }
  let header: string[] = [];
  try { header = layoutOf(current.text, current.name).layout.header; } catch { /* the import cell says why */ }
  const colSel = (role: 'strain' | 'stress' | 'force' | 'extension', text: string) => {
    const sel = h('select', { id: `map-${role}` }, h('option', { value: '' }, '(recognise by name)'), ...header.map((c, i) => h('option', { value: String(i + 1) }, `${i + 1}: ${c}`)));
    const given = options.columns?.[role];
    sel.value = given === undefined ? '' : String(given);
    return h('div', { class: 'sl-input' }, h('label', { for: `map-${role}` }, text), sel);
  };
  const unitSel = (id: string, text: string, units: readonly string[]) => {
    const sel = h('select', { id }, h('option', { value: '' }, '(from the file)'), ...units.map((u) => h('option', { value: u }, u)));
    return h('div', { class: 'sl-input' }, h('label', { for: id }, text), sel);
  };
  const num = (id: string, text: string) => h('div', { class: 'sl-input' }, h('label', { for: id }, text), h('input', { type: 'text', inputmode: 'decimal', id, class: 'sl-number' }), ' mm');
  box.replaceChildren(
    colSel('strain', 'strain column'), colSel('stress', 'stress column'), colSel('force', 'force column'), colSel('extension', 'extension column'),
    unitSel('map-strainUnit', 'strain unit', ['fraction', 'percent']), unitSel('map-stressUnit', 'stress unit', shown(['MPa', 'N/mm²', 'GPa', 'ksi', 'psi', 'kgf/mm²', 'daN/mm²', 'kN/cm²'], STRESS_UNITS)),
    unitSel('map-forceUnit', 'force unit', shown(['N', 'kN', 'daN', 'lbf', 'kip', 'kgf'], FORCE_UNITS)), unitSel('map-lengthUnit', 'extension unit', shown(['mm', 'in', 'cm', 'm', 'µm'], LENGTH_UNITS)),
    // Round specimens by diameter, flat ones (strip, sheet) by width and thickness: the cross-section a force column needs.
    num('map-diameter', 'specimen diameter'), num('map-width', 'or width'), num('map-thickness', 'and thickness'), num('map-gaugeLength', 'gauge length'),
    // With the machine's travel as the extension: the length its plastic part is read over (Ag, A; see spreadOverParallelLength).
    num('map-parallelLength', 'parallel length (crosshead records)'),
    // The specimen's E, when the record cannot measure it (too few elastic points, the machine's travel as the strain).
    h('div', { class: 'sl-input' }, h('label', { for: 'map-modulus' }, 'specimen\'s modulus E, if known'), h('input', { type: 'text', inputmode: 'decimal', id: 'map-modulus', class: 'sl-number' }), ' GPa'),
    h('button', { type: 'button', id: 'apply-mapping', onclick: applyMapping }, 'read the record again with these settings'));
  const unitKeys = ['strainUnit', 'stressUnit', 'forceUnit', 'lengthUnit'] as const;
  for (const k of unitKeys) (byId(`map-${k}`) as HTMLSelectElement).value = String(options[k] ?? '');
  for (const k of ['diameter', 'width', 'thickness', 'gaugeLength', 'parallelLength'] as const) (byId(`map-${k}`) as HTMLInputElement).value = options[k] === undefined ? '' : String(options[k]);
  (byId('map-modulus') as HTMLInputElement).value = modulus === undefined ? '' : String(modulus / 1000);
}

/** Unit names as people write them, kept only where the record parser knows them (it compares lower-cased). */
function shown(names: readonly string[], table: Readonly<Record<string, number>>): string[] {
  return names.filter((n) => table[n.toLowerCase()] !== undefined);
}

function applyMapping(): void {
  if (!current) return;
  const o: RecordOptions = {};
  const columns: NonNullable<RecordOptions['columns']> = {};
  for (const role of ['strain', 'stress', 'force', 'extension'] as const) {
    const v = (byId(`map-${role}`) as HTMLSelectElement).value;
    if (v) columns[role] = Number(v);
  }
  if (Object.keys(columns).length) o.columns = columns;
  for (const k of ['strainUnit', 'stressUnit', 'forceUnit', 'lengthUnit'] as const) {
    const v = (byId(`map-${k}`) as HTMLSelectElement).value;
    if (v) o[k] = v;
  }
  for (const k of ['diameter', 'width', 'thickness', 'gaugeLength', 'parallelLength'] as const) {
    const t = (byId(`map-${k}`) as HTMLInputElement).value.trim();
    if (t) o[k] = Number(t); // the parser validates the number and names the field when it is wrong
  }
  // GPa on the page, MPa in the analysis (which validates it and names elasticModulus when it is wrong).
  const e = (byId('map-modulus') as HTMLInputElement).value.trim().replace(',', '.');
  load(current, o, 1, e ? Number(e) * 1000 : undefined);
}

/**
 * The choice of test in a file that holds several (specimens one after another): which one the page shows, each read
 * and analysed as a record of its own in the worker.
 */
function testChoice(p: Extract<Parsed, { ok: true }>): HTMLElement {
  const sel = h('select', { id: 'test-choice' }, ...Array.from({ length: p.tests.count }, (_, i) => h('option', { value: String(i + 1) }, `test ${i + 1} of ${p.tests.count}`))) as HTMLSelectElement;
  sel.value = String(p.tests.shown);
  sel.addEventListener('change', () => load(p.input, options, Number(sel.value), modulus));
  return h('div', { class: 'sl-input', id: 'tests' },
    h('p', {}, `This file holds ${p.tests.count} tests, one after another (the record starts over where strain and stress fall back near zero and the stress rises again). Each is analysed on its own; showing test ${p.tests.shown}.`),
    h('label', { for: 'test-choice' }, 'test shown '), sel);
}

/** (max − min)/min·100 over the given stresses, as text; '—' when fewer than two. */
function spreadAll(xs: (number | undefined)[]): string {
  const v = xs.filter((x): x is number => x !== undefined && x > 0);
  return v.length < 2 ? '—' : fixed(((Math.max(...v) - Math.min(...v)) / Math.min(...v)) * 100, 1);
}

nb.cell({ name: 'input', fn: () => null })
  .cell({
    // Reading and analysing run in the worker. This cell never rejects: a malformed record is shown
    // as an error here while the last good record (and everything computed from it) stays on screen.
    name: 'parsed', inputs: ['input'], into: 'cell-import',
    fn: async (x: { input: Input; options: RecordOptions; test: number; modulus: number | undefined } | null): Promise<Parsed | null> => {
      if (!x) return null;
      const r = await readInWorker(x.input, x.options, x.test, x.modulus);
      if (!r.ok) return { ok: false, input: x.input, error: rebuild(r.error) };
      return { ok: true, input: x.input, record: r.record, analysis: r.analysis, analysisError: r.analysisError ? rebuild(r.analysisError) : null, tests: r.tests };
    },
    render: (v) => {
      const p = v as Parsed | null;
      if (!p) return h('p', {}, 'No record yet: drop a tensile-test export above, or open the INVENTED demo record. The bench reads comma-, semicolon- or tab-separated exports, or columns aligned by spaces, with a header line.');
      if (!p.ok) return h('div', {}, errorBox(p.error, `${p.input.name} could not be read`), lastGood ? h('p', { class: 'sl-notice' }, `Still showing ${lastGood.record.name}. Map the columns and units below if they were not recognised.`) : null);
      const c = p.record.columns;
      return h('div', {},
        p.input.demo ? h('p', { class: 'sl-invented', id: 'demo-note' }, 'INVENTED demo record (generated from a known law, not a test): drop your own export above.') : null,
        h('p', { id: 'record-summary' }, `${p.input.name}: ${p.record.rows} rows, ${p.record.basis === 'stress-strain' ? 'stress and strain columns' : p.record.basis === 'force-strain' ? `force and strain columns, stress = force / ${p.record.geometry!.area.toPrecision(4)} mm²` : 'force and extension columns'} (${Object.entries(c).map(([k, v]) => `${k}: ${v!.averagedWith ? `the mean of "${v!.name}" and "${v!.averagedWith.name}"` : `"${v!.name}"`} ${v!.unit}`).join('; ')}).`),
        ((w) => (w.length ? h('ul', { class: 'sl-notice' }, ...w.map((x) => h('li', {}, x))) : null))([...(p.input.encoding === 'windows-1252' ? [ENCODING_NOTE] : []), ...readingWarnings(p.record, p.analysis)]),
        p.tests.count > 1 ? testChoice(p) : null);
    },
  })
  .cell({
    // The last record read, with its analysis (or the reason it could not be analysed).
    name: 'current', inputs: ['parsed'],
    fn: (p: Parsed | null): Extract<Parsed, { ok: true }> => {
      if (p?.ok) lastGood = p;
      if (!lastGood) throw new Error('no record has been read yet: choose or drop a file');
      return lastGood;
    },
  })
  .cell({ name: 'record', inputs: ['current'], fn: (c: Extract<Parsed, { ok: true }>) => c.record })
  .cell({ name: 'recordName', inputs: ['current'], into: 'cell-record-name', fn: (c: Extract<Parsed, { ok: true }>) => h('span', {}, `— ${c.record.name}${c.input.demo ? ' (INVENTED demo record)' : ''}`) })
  .cell({
    name: 'analysis', inputs: ['current'],
    fn: (c: Extract<Parsed, { ok: true }>): TensileAnalysis => {
      if (!c.analysis) throw c.analysisError;
      return c.analysis;
    },
  })
  .cell({
    name: 'properties', inputs: ['analysis'], into: 'cell-properties',
    fn: (a: TensileAnalysis) => {
      // `prefix` marks a lower bound (the record stopped before maximum force or fracture); `none` is the words
      // shown instead of a number that does not exist for this record (e.g. no yield drop).
      const q = (label: string, v: number | null, d: number, unit: string, id: string, opt: { prefix?: string; none?: string } = {}) =>
        h('div', { class: 'sl-quantity' }, h('dt', {}, label), v === null && opt.none
          ? h('dd', { 'data-q': id }, h('span', { class: 'sl-none' }, opt.none))
          : h('dd', { 'data-q': id }, opt.prefix ? `${opt.prefix} ` : '', h('span', { class: 'sl-num' }, fixed(v, d)), unit ? ` ${unit}` : ''));
      const w = a.elasticWindow;
      // Lower bounds (the test stopped before maximum force, or the strain channel ended before fracture): ≥.
      const lower = (k: TensileAnalysis['lowerBounds'][number]) => (a.lowerBounds.includes(k) ? { prefix: '≥' } : {});
      const stopped = a.lowerBounds.includes('tensileStrength');
      // A plateau without a peak clear of the noise is not continuous yielding: say what it is (yieldPlateau).
      const continuous = a.yieldPlateau ? 'none clear of the noise (yield plateau, see below)' : 'none (continuous yielding)';
      return h('div', {},
        h('dl', { class: 'sl-quantities', id: 'properties' },
          q(`Rp${a.proofOffsetPct}`, a.proofStrength, DIGITS.stress, 'MPa', 'proofStrength', { none: 'not reached' }),
          q(a.forceTop ? 'Rm (from the force after the strain ended)' : 'Rm', a.tensileStrength, DIGITS.stress, 'MPa', 'tensileStrength', lower('tensileStrength')),
          q('Ag (uniform elongation)', a.uniformElongationPct, 2, '%', 'uniformElongation', lower('uniformElongationPct')),
          q(stopped ? 'A (record ends before fracture)' : a.strainChannelEnd ? 'A (strain channel ends before fracture)' : a.lowerBounds.includes('totalElongationPct') ? 'A (test stopped before fracture)' : 'A (after fracture)', a.totalElongationPct, 2, '%', 'totalElongation', lower('totalElongationPct')),
          q(a.elasticModulusSource === 'given' ? 'E (given)' : 'E (elastic window)', a.elasticModulus / 1000, 1, 'GPa', 'elasticModulus'),
          q('n-value', a.nValue, 3, '', 'nValue', { none: 'not determined' }),
          q('ReH (upper yield)', a.upperYield, DIGITS.stress, 'MPa', 'upperYield', { none: continuous }),
          ...(a.upperYield !== null ? [
            q('ReL (lower yield)', a.lowerYield, DIGITS.stress, 'MPa', 'lowerYield'),
            q('Ae (yield point extension)', a.yieldPointElongationPct, 2, '%', 'yieldPointElongation')] : []),
          q('yield ratio Rp/Rm', a.proofStrength === null ? null : a.proofStrength / a.tensileStrength, DIGITS.ratio, '', 'yieldRatio', { none: 'not determined' })),
        h('p', { id: 'stress-basis' }, 'Rp, ReH, ReL and Rm are engineering stresses (force over the original section), as a test certificate gives them; the n-value and the fitted laws below are true stress against true plastic strain.'),
        h('p', { id: 'ag-basis' }, agBasis(a)),
        h('p', { id: 'elastic-window' }, `Elastic window: ${fixed(w.fromStress, 0)} to ${fixed(w.toStress, 0)} MPa, ${w.points} points, R² ${fixed(w.r2, 5)}, standard error of E ${fixed(w.standardError, 0)} MPa (${w.method}).`),
        h('p', { id: 'record-noise' }, `Noise of the stress (standard deviation): ${noiseStatement(a)}.`),
        a.cycles.length ? h('p', { id: 'modulus-decay' }, `${a.cycles.length} unload–reload loops; unloading chord modulus ${a.cycles.map((c) => fixed(c.unloadModulus, 0)).join(', ')} MPa`,
          a.modulusDecay?.converged ? `; fitted E(ε̄) = E0 − (E0 − Ea)(1 − exp(−ξ·ε̄)) with Ea ${fixed(a.modulusDecay.Ea, 0)} MPa, ξ ${fixed(a.modulusDecay.xi, 1)} (sent with the law).` : '.') : null,
        a.warnings.length ? h('ul', { class: 'sl-notice' }, ...a.warnings.map((x) => h('li', {}, x.message))) : null);
    },
  })
  .cell({ name: 'curveWidth', fn: () => widthStream(byId('cell-curve-chart')) })
  .cell({ name: 'residualWidth', fn: () => widthStream(byId('cell-residual-chart')) })
  .cell({ name: 'curveChart', inputs: ['record', 'analysis', 'curveWidth'], into: 'cell-curve-chart', fn: (r: TensileRecord, a: TensileAnalysis, width: number) => recordCurveChart(r, a, { width }) })
  .cell({
    name: 'residualChart', inputs: ['analysis', 'residualWidth'], into: 'cell-residual-chart',
    fn: (a: TensileAnalysis, width: number) => (a.fits ? residualChart(a.flowCurve.strain, a.fits.fits.filter((f) => f.converged), { width }) : h('p', {}, 'No fits.')),
  })
  .cell({
    name: 'fits', inputs: ['analysis'], into: 'cell-fits',
    fn: (a: TensileAnalysis) => {
      if (!a.fits) return h('p', {}, 'No fits.');
      const c = a.fits;
      const param = (f: (typeof c.fits)[number], p: string) => {
        const iv = f.intervals95[p];
        const v = f.params[p]!;
        const info = LAW_PARAMETERS[f.law].find((x) => x.name === p)!;
        const held = f.basis.held?.includes(p); // the blend's α: one flow curve does not fix it (docs/records-and-fits.md)
        const cut = f.basis.intervalsClipped?.includes(p) ? ', cut at the end of its range' : '';
        return `${info.symbol} ${formatLawParam(info, v)}${iv ? ` (95 %: ${sig4(iv[0])} to ${sig4(iv[1])}${cut})` : held ? ' (held, not fitted: one curve does not fix it)' : ' (interval not identifiable)'}`;
      };
      const basis = c.fits.find((f) => f.law === c.best)?.basis ?? c.fits[0]?.basis;
      const n = c.fits[0]?.points ?? 0;
      const how = h('p', { id: 'fit-basis' },
        basis && basis.blockSize > 1 ? `Fitted on ${basis.fittedPoints} averages of ${basis.blockSize} consecutive points (the flow curve has ${n}); RMSE, R² and AIC are those of the full curve. ` : `Fitted on all ${n} points of the flow curve. `,
        `95 % intervals allow for residuals that are not independent: each standard error is widened by √(n/n_eff), with n_eff = n(1 − ρ)/(1 + ρ) from the residuals' lag-1 autocorrelation ρ`,
        basis ? ` (${LAW_TITLES[c.best ?? c.fits[0]!.law]}: ρ ${fixed(basis.lag1Autocorrelation, 3)}, n_eff ${fixed(basis.effectivePoints, 0)}, ×${fixed(basis.inflation, 1)}).` : '.');
      const table = h('table', { class: 'sl-table', id: 'fits-table' },
        h('thead', {}, h('tr', {}, ...['law', 'parameters (true stress, MPa)', 'RMSE MPa', 'R²', 'AIC', 'state'].map((x) => h('th', { scope: 'col' }, x)))),
        h('tbody', {}, ...c.fits.map((f) => h('tr', { 'data-law': f.law },
          h('td', { class: 'text' }, LAW_TITLES[f.law] + (c.best === f.law ? ' (best AIC)' : '')),
          h('td', { class: 'text' }, LAW_PARAMETERS[f.law].map((p) => param(f, p.name)).join('; ')),
          h('td', {}, fixed(f.rmse, 2)), h('td', {}, fixed(f.r2, 5)), h('td', {}, fixed(f.aic, 1)),
          h('td', { class: 'text' }, !f.converged ? 'did not converge' : c.goodLaws.includes(f.law) ? 'fits well' : 'fits worse')))));
      return h('div', {}, table, how);
    },
  })
  .cell({
    name: 'spread', inputs: ['analysis'], into: 'cell-spread',
    fn: (a: TensileAnalysis) => {
      if (!a.fits) return h('p', {}, 'No fits.');
      const laws = a.fits.fits.filter((f) => f.converged).map((f) => f.law);
      return h('div', {},
        h('table', { class: 'sl-table', id: 'spread-table' },
          h('thead', {}, h('tr', {}, h('th', { scope: 'col' }, 'true plastic strain'), ...laws.map((l) => h('th', { scope: 'col' }, `${LAW_TITLES[l]} MPa`)), h('th', { scope: 'col' }, 'spread of the laws that fit well %'), h('th', { scope: 'col' }, 'spread of all converged laws %'))),
          h('tbody', {}, ...a.fits.extrapolation.map((x) => h('tr', {},
            h('td', { class: 'text' }, `${fixed(x.strain, 3)} (${x.note})`), ...laws.map((l) => h('td', {}, fixed(x.stress[l] ?? null, DIGITS.stress))), h('td', {}, fixed(x.spreadPct, 1)), h('td', {}, spreadAll(laws.map((l) => x.stress[l]))))))),
        h('p', {}, `Fitted on true plastic strain ${fixed(a.flowCurve.strain[0] ?? null, 4)} to ${fixed(a.flowCurve.strain[a.flowCurve.strain.length - 1] ?? null, 4)}. Beyond that every law is an extrapolation: test the formed material.`));
    },
  })
  .cell({
    name: 'save', inputs: ['analysis', 'record'], into: 'cell-save',
    fn: (a: TensileAnalysis, r: TensileRecord) => {
      const fits = a.fits?.fits.filter((f) => f.converged) ?? [];
      if (!fits.length) return h('p', {}, 'No converged fit to send.');
      // The machine's travel: its own slope is the machine's and grips' compliance, and its plastic part counts all of
      // Lc over L0 — a law and E from it would be wrong in every other notebook (as `analyze --material-block` refuses).
      if (r.machineTravel && (a.elasticModulusSource !== 'given' || a.parallelLengthRatio === null)) {
        const need = [a.elasticModulusSource !== 'given' ? `the specimen's modulus (the travel's own slope, ${fixed(a.elasticModulus / 1000, 1)} GPa, is the machine's and grips' compliance, not the metal's)` : '',
          a.parallelLengthRatio === null ? "the specimen's parallel length (the travel's plastic part is spread over it)" : ''].filter(Boolean);
        return h('p', { id: 'save-state', role: 'status' }, `This record's extension is the machine's travel: give ${need.join(' and ')} in the fields above before a law from it is sent to the other notebooks.`);
      }
      const pick = choice<LawName>({ label: 'Law', id: 'save-law', options: fits.map((f) => ({ value: f.law, text: LAW_TITLES[f.law] })), value: a.fits!.best ?? fits[0]!.law });
      const out = h('p', { id: 'save-state', role: 'status' });
      const prev = restore(BENCH_MATERIAL_KEY, (x) => x as { name: string });
      if (prev.value) out.textContent = `The other notebooks currently have "${prev.value.name}".`;
      const send = () => {
        const f = fits.find((x) => x.law === pick.value)!;
        const spec = { law: f.law, ...f.params };
        const ok = autosave(BENCH_MATERIAL_KEY, {
          name: `${r.name} (${LAW_TITLES[f.law]} fit)`, elasticModulus: a.elasticModulus, flowCurve: spec,
          alternatives: fits.map((x) => ({ law: x.law, ...x.params })), fittedStrainRange: f.strainRange, source: `fitted from ${r.file}`,
          ...(a.modulusDecay?.converged && a.modulusDecay.Ea <= a.elasticModulus ? { modulusDecay: { Ea: a.modulusDecay.Ea, xi: a.modulusDecay.xi } } : {}),
        });
        out.textContent = ok ? `Saved "${r.name} (${LAW_TITLES[f.law]} fit)": the route planner ("use the law saved from the record bench") and the prestrain explorer can use it now.` : 'The browser refused to save; nothing was sent.';
      };
      return h('div', {}, pick, h('button', { type: 'button', id: 'save-material', onclick: send }, 'use in the other notebooks'), out);
    },
  });

// Before any record is dropped the bench shows the INVENTED demo record (never empty error cells).
const demo = examples[0];
if (demo) load({ name: demo[0].split('/').pop()!, text: demo[1], demo: true }, {});
else drawMapping();
expose('records', nb);

/** Where Ag was read: the fitted laws' maximum of force inside the top model's interval (the laws that follow the curve best, lawTop.ts), or the top model. */
function agBasis(a: { forceMaximum: { uniformElongationInterval95: [number, number]; lawUniformElongation: { pct: number | null } | null }; lowerBounds: readonly string[]; strainChannelEnd: unknown }): string {
  // A lower bound has no interval of its own: say where it comes from instead.
  if (a.lowerBounds.includes('uniformElongationPct')) {
    return a.strainChannelEnd && !a.lowerBounds.includes('tensileStrength')
      ? 'Ag: not in the record — the strain channel ends before maximum force; the value shown is the plastic strain where it ended, a lower bound.'
      : 'Ag: not in the record — it ends before maximum force; the value shown is a lower bound.';
  }
  const [lo, hi] = a.forceMaximum.uniformElongationInterval95;
  const range = `${fixed(lo, 2)} to ${fixed(hi, 2)} %`;
  const laws = a.forceMaximum.lawUniformElongation;
  if (laws?.pct != null) return `Ag: where the fitted hardening laws reach maximum force, which the samples near the top do not rule out (95 %: ${range}).`;
  return `Ag: from a local fit of the samples near the top (95 %: ${range})${laws ? '; the fitted laws that follow the curve best put maximum force where the samples near the top rule it out, so they are not used' : ''}.`;
}
