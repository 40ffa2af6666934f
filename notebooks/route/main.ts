// Route planner: an editable plan (the runner's plan format, in the plan's units) and its ledger.
// The plan is kept outside the runtime as the user's document (autosaved, undoable); the cells
// validate it, run it and build the report with the same functions the runner uses.
import {
  Notebook, expose, h, fixed, formatNumber, formatTargetValue, flowCurveText, DIGITS, autosave, restore, UndoHistory, planText, planFileName, importPlan,
  downloadText, fileDrop, errorBox, byId, choice,
  widthStream,
} from '../../src/cells/index.js';
import { LAW_PARAMETERS, STEP_KIND_NAMES } from '../../src/core/index.js';
import type { LawSpec } from '../../src/core/index.js';
import { loadPlanText, runPlan, type LoadedPlan } from '../../src/plan/load.js';
import { convertLaw } from '../../src/plan/resolve.js';
import { unitsOf } from '../../src/plan/units.js';
import { buildReport, type ReportV1 } from '../../src/report/build.js';
import { hasTemper, targetUnit, temperTargetNote, temperText } from '../../src/report/columns.js';
import { TARGET_LABELS, targetLabel } from '../../src/report/labels.js';
import { TEMPER_CAUTION } from '../../src/report/cautions.js';
import { strengthByStepChart, ductilityByStepChart } from '../../src/charts/ledger.js';
import { hardnessByStepChart } from '../../src/charts/hardness.js';
import { hardnessText } from '../../src/report/fields.js';
import { BENCH_MATERIAL_KEY, demoPlans, pageChrome } from '../shared/page.js';

pageChrome('route/', 'Route planner');

/** The plan as the user edits it: the plan file's JSON (plan units), possibly invalid mid-edit. */
type Doc = Record<string, any> & { steps: Record<string, any>[] };
const SAVE_KEY = 'route-plan';
const FILE = 'route-plan.json';

/** For each step kind: the size fields it takes (first = default) and a starting value. */
const KIND_FIELDS: Record<string, { fields: string[]; start: Record<string, number> }> = {
  roll: { fields: ['reductionPct', 'thickness'], start: { reductionPct: 20 } },
  draw: { fields: ['areaReductionPct', 'diameter'], start: { areaReductionPct: 20 } },
  stretch: { fields: ['strain', 'engineeringStrain'], start: { strain: 0.05 } },
  stretchBiaxial: { fields: ['strain'], start: { strain: 0.05 } },
  upset: { fields: ['reductionPct', 'height'], start: { reductionPct: 20 } },
  shear: { fields: ['shearStrain'], start: { shearStrain: 0.2 } },
  strain: { fields: ['strain'], start: { strain: 0.1 } },
  anneal: { fields: ['softeningFraction'], start: {} },
};
const FIELD_TEXT: Record<string, string> = {
  reductionPct: 'reduction %', thickness: 'exit thickness', areaReductionPct: 'area reduction %', diameter: 'exit diameter',
  strain: 'true strain', engineeringStrain: 'engineering strain', height: 'height after', shearStrain: 'shear strain γ',
  softeningFraction: 'softening fraction (1 = full)',
};

const demos = demoPlans();
const isDoc = (raw: unknown): Doc => {
  if (typeof raw !== 'object' || raw === null || !Array.isArray((raw as Doc).steps)) throw new Error('not a plan with a list of steps');
  return raw as Doc;
};
const saved = restore(SAVE_KEY, isDoc);
let doc: Doc = saved.value ?? JSON.parse(JSON.stringify(demos[0]!.plan.doc));
const history = new UndoHistory<Doc>();
const nb = new Notebook();

const status = byId('import-status');
if (saved.problem) status.replaceChildren(h('p', { class: 'sl-notice' }, saved.problem));
else if (saved.value) status.replaceChildren(h('p', { class: 'sl-notice' }, 'Restored the route saved in this browser.'));

const lengthUnit = () => unitsOf(doc.units === 'US' ? 'US' : 'SI').length;
const stressUnit = () => unitsOf(doc.units === 'US' ? 'US' : 'SI').stress;

/** Publishes the document: autosave, recompute, and (for structural edits) redraw the editors. */
function commit(redraw: boolean): void {
  const ok = autosave(SAVE_KEY, doc);
  byId('autosave-state').textContent = ok ? 'autosaved in this browser' : 'autosave is off (the browser refused); export the plan to keep it';
  (byId('undo') as HTMLButtonElement).disabled = !history.canUndo;
  nb.set('doc', JSON.parse(JSON.stringify(doc)));
  if (redraw) drawEditors();
}

/** One edit: remember the state before it (for undo), apply it, publish. */
function edit(fn: (d: Doc) => void, redraw = true): void {
  history.push(doc);
  fn(doc);
  commit(redraw);
}

/** A number field bound to `obj[key]`; empty removes the key; undo restores the value before the field was entered. */
function numberField(label: string, id: string, get: () => unknown, set: (v: number | string | undefined) => void, unit = ''): HTMLElement {
  const input = h('input', { type: 'text', inputmode: 'decimal', id, class: 'sl-number', value: get() === undefined ? '' : String(get()) });
  let before: Doc | null = null;
  input.addEventListener('focus', () => { before = JSON.parse(JSON.stringify(doc)); });
  input.addEventListener('input', () => {
    const t = input.value.trim();
    const v = t === '' ? undefined : Number.isFinite(Number(t)) ? Number(t) : t;
    set(v);
    commit(false);
  });
  input.addEventListener('change', () => {
    if (before) { history.push(before); before = JSON.parse(JSON.stringify(doc)); }
    (byId('undo') as HTMLButtonElement).disabled = !history.canUndo;
  });
  return h('div', { class: 'sl-input' }, h('label', { for: id }, label), input, unit ? h('span', { class: 'sl-unit' }, unit) : null);
}

function textField(label: string, id: string, get: () => string, set: (v: string) => void): HTMLElement {
  const input = h('input', { type: 'text', id, value: get(), size: 30 });
  let before: Doc | null = null;
  input.addEventListener('focus', () => { before = JSON.parse(JSON.stringify(doc)); });
  input.addEventListener('input', () => { set(input.value); commit(false); });
  input.addEventListener('change', () => { if (before) { history.push(before); before = null; } (byId('undo') as HTMLButtonElement).disabled = false; });
  return h('div', { class: 'sl-input' }, h('label', { for: id }, label), input);
}

function drawEditors(): void {
  byId('plan-name').replaceChildren(textField('Plan name', 'plan-name-input', () => String(doc.name ?? ''), (v) => { doc.name = v; }),
    h('p', {}, `Units: ${doc.units === 'US' ? 'US (ksi, in)' : 'SI (MPa, mm)'}`, /INVENTED/i.test(String(doc.name ?? '')) ? h('span', { class: 'sl-invented' }, ' INVENTED demo') : null));
  const m = doc.material ?? {};
  const fc = m.flowCurve ?? {};
  byId('material-view').replaceChildren(
    // The plan's law as an engineer writes it (4 significant figures, "0 (at bound)"); true stress
    // against true plastic strain. The plan document itself keeps the numbers as given.
    h('p', { id: 'material-summary' }, `${m.name ?? '(no name)'}; E = ${m.elasticModulus} ${stressUnit()}; `,
      `${flowCurveText(fc as Record<string, unknown>, stressUnit())} (true stress vs true plastic strain)`),
    h('button', { type: 'button', id: 'use-bench', onclick: useBenchMaterial }, 'Use the law saved from the record bench'),
    temperSystemField());
  const s = doc.start ?? {};
  byId('start-editor').replaceChildren(...(['thickness', 'width', 'diameter', 'height'] as const).map((k) =>
    numberField(k, `start-${k}`, () => s[k], (v) => { doc.start ??= {}; if (v === undefined) delete doc.start[k]; else doc.start[k] = v; }, lengthUnit())));
  const t = doc.targets ?? {};
  const tdefs = ([['minYield', stressUnit()], ['maxYield', stressUnit()], ['minTensile', stressUnit()], ['minRemainingElongationPct', '%'],
    ['minHardnessHV', 'HV'], ['maxHardnessHV', 'HV']] as const).map(([k, unit]) => [k, TARGET_LABELS[k], unit] as const);
  byId('targets-editor').replaceChildren(...tdefs.map(([k, text, unit]) =>
    numberField(text, `target-${k}`, () => t[k], (v) => { doc.targets ??= {}; if (v === undefined) delete doc.targets[k]; else doc.targets[k] = v; }, unit)),
    textField('temper (e.g. H04; needs a temper system)', 'target-temper', () => String(t.temper ?? ''), (v) => { doc.targets ??= {}; if (v.trim() === '') delete doc.targets.temper; else doc.targets.temper = v.trim(); }));
  drawSteps();
}

/** The standard temper system each ledger row is named in (docs/tempers-and-anneals.md); "none" removes it. */
const TEMPER_SYSTEM_TEXT: [string, string][] = [
  ['', 'none'], ['copperRolled', 'copper strip, B&S numbers of reduction (ASTM B601 H01–H10)'],
  ['aluminiumH1x', 'aluminium, strain-hardened H12–H19 by tensile strength (EN 515 / ANSI H35.1)'],
  ['steelStrip', 'carbon steel strip No. 5–No. 1 (ASTM A109 names, approximate)'],
];
function temperSystemField(): HTMLElement {
  const sel = h('select', { id: 'material-temper-system' }, ...TEMPER_SYSTEM_TEXT.map(([v, text]) => h('option', { value: v }, text)));
  sel.value = String(doc.material?.temperSystem ?? '');
  sel.addEventListener('change', () => edit((d) => { d.material ??= {}; if (sel.value === '') delete d.material.temperSystem; else d.material.temperSystem = sel.value; }));
  return h('div', { class: 'sl-input' }, h('label', { for: 'material-temper-system' }, 'temper system'), sel);
}

function drawSteps(): void {
  const rows = doc.steps.map((step, i) => {
    const kindSel = h('select', { id: `step-${i}-kind`, 'aria-label': `step ${i + 1} kind` }, ...STEP_KIND_NAMES.map((k) => h('option', { value: k }, k)));
    kindSel.value = String(step.kind);
    kindSel.addEventListener('change', () => edit((d) => { d.steps[i] = { kind: kindSel.value, ...(step.label ? { label: step.label } : {}), ...KIND_FIELDS[kindSel.value]!.start }; }));
    const def = KIND_FIELDS[String(step.kind)] ?? { fields: [], start: {} };
    const field = def.fields.find((f) => step[f] !== undefined) ?? def.fields[0];
    const fieldSel = h('select', { id: `step-${i}-field`, 'aria-label': `step ${i + 1} size given as` }, ...def.fields.map((f) => h('option', { value: f }, FIELD_TEXT[f] ?? f)));
    if (field) fieldSel.value = field;
    fieldSel.addEventListener('change', () => edit((d) => { const v = field ? d.steps[i]![field] : undefined; if (field) delete d.steps[i]![field]; d.steps[i]![fieldSel.value] = v ?? KIND_FIELDS[String(step.kind)]!.start[fieldSel.value] ?? 0; }));
    const unit = field && ['thickness', 'diameter', 'height'].includes(field) ? lengthUnit() : '';
    const value = h('input', { type: 'text', inputmode: 'decimal', class: 'sl-number', id: `step-${i}-value`, 'aria-label': `step ${i + 1} ${field ? FIELD_TEXT[field] : 'value'}`, value: field && step[field] !== undefined ? String(step[field]) : '' });
    let before: Doc | null = null;
    value.addEventListener('focus', () => { before = JSON.parse(JSON.stringify(doc)); });
    value.addEventListener('input', () => {
      if (!field) return;
      const t = value.value.trim();
      if (t === '') delete doc.steps[i]![field];
      else doc.steps[i]![field] = Number.isFinite(Number(t)) ? Number(t) : t;
      commit(false);
    });
    value.addEventListener('change', () => { if (before) { history.push(before); before = JSON.parse(JSON.stringify(doc)); (byId('undo') as HTMLButtonElement).disabled = false; } });
    const label = h('input', { type: 'text', id: `step-${i}-label`, 'aria-label': `step ${i + 1} label`, value: String(step.label ?? ''), size: 12 });
    label.addEventListener('change', () => edit((d) => { if (label.value) d.steps[i]!.label = label.value; else delete d.steps[i]!.label; }, false));
    const move = (to: number) => () => edit((d) => { const [s] = d.steps.splice(i, 1); d.steps.splice(to, 0, s!); });
    return h('tr', {},
      h('td', {}, String(i + 1)), h('td', { class: 'text' }, kindSel), h('td', { class: 'text' }, fieldSel), h('td', {}, value, unit ? ` ${unit}` : ''), h('td', { class: 'text' }, label),
      h('td', { class: 'text' },
        h('button', { type: 'button', id: `step-${i}-up`, 'aria-label': `move step ${i + 1} up`, disabled: i === 0, onclick: move(i - 1) }, '↑'),
        h('button', { type: 'button', id: `step-${i}-down`, 'aria-label': `move step ${i + 1} down`, disabled: i === doc.steps.length - 1, onclick: move(i + 1) }, '↓'),
        h('button', { type: 'button', id: `step-${i}-remove`, 'aria-label': `remove step ${i + 1}`, onclick: () => edit((d) => { d.steps.splice(i, 1); }) }, 'remove')));
  });
  const addKind = choice({ label: 'Add a step of kind', id: 'add-kind', options: STEP_KIND_NAMES.map((k) => ({ value: k, text: k })), value: 'roll' });
  byId('steps-editor').replaceChildren(
    h('table', { class: 'sl-table', id: 'steps-table' },
      h('thead', {}, h('tr', {}, ...['#', 'kind', 'size given as', 'value', 'label', ''].map((x) => h('th', { scope: 'col' }, x)))),
      h('tbody', {}, ...rows)),
    h('div', { class: 'sl-input' }, addKind, h('button', { type: 'button', id: 'add-step', onclick: () => edit((d) => { d.steps.push({ kind: addKind.value, ...KIND_FIELDS[addKind.value]!.start }); }) }, 'add step')));
}

function useBenchMaterial(): void {
  const stored = restore(BENCH_MATERIAL_KEY, (raw) => raw as { name: string; elasticModulus: number; flowCurve: LawSpec; fittedStrainRange?: [number, number]; modulusDecay?: { Ea: number; xi: number }; source?: string });
  if (!stored.value) {
    status.replaceChildren(errorBox(new Error(stored.problem ?? 'no law has been saved from the record bench yet'), 'No material from the record bench'));
    return;
  }
  const b = stored.value;
  const u = unitsOf(doc.units === 'US' ? 'US' : 'SI');
  const law = convertLaw(b.flowCurve, u.fromMPa) as unknown as Record<string, number | string>;
  const flowCurve: Record<string, unknown> = { law: law.law };
  for (const p of LAW_PARAMETERS[b.flowCurve.law]) flowCurve[p.name] = +Number(law[p.name]).toPrecision(6);
  edit((d) => {
    d.material = {
      name: b.name, elasticModulus: +u.fromMPa(b.elasticModulus).toPrecision(6), flowCurve,
      ...(b.modulusDecay ? { modulusDecay: { Ea: Math.min(+u.fromMPa(b.modulusDecay.Ea).toPrecision(6), +u.fromMPa(b.elasticModulus).toPrecision(6)), xi: +b.modulusDecay.xi.toPrecision(6) } } : {}),
      ...(b.fittedStrainRange ? { fittedStrainRange: b.fittedStrainRange } : {}),
    };
  });
  status.replaceChildren(h('p', { class: 'sl-notice' }, `Material replaced by "${b.name}" from the record bench (undo to go back).`));
}

// Plan tools: demo, import (choose or drop), export, undo.
const fileInput = h('input', { type: 'file', id: 'import-file', accept: '.json,.yaml,.yml,application/json' });
const drop = h('div', { class: 'sl-drop', id: 'import-drop', role: 'button', 'aria-label': 'Import a plan file: drop it here or press Enter to choose' }, 'Drop a plan file (JSON or YAML) here, or ', h('label', { for: 'import-file' }, 'choose one: '), fileInput);
fileDrop(drop, fileInput, (name, text) => {
  try {
    const loaded = importPlan(text, name);
    edit((d) => { for (const k of Object.keys(d)) delete d[k]; Object.assign(d, JSON.parse(JSON.stringify(loaded.doc))); });
    status.replaceChildren(h('p', { class: 'sl-notice' }, `Imported ${name}.`));
  } catch (e) {
    // The plan on screen stays as it was; the message names line, field, value and range.
    status.replaceChildren(errorBox(e, `${name} was not imported`));
  }
}, (e) => status.replaceChildren(errorBox(e, 'The file could not be read')));
const demoSel = choice({ label: 'Demo plan', id: 'demo', options: demos.map((d, i) => ({ value: i, text: `${d.file} (INVENTED)` })) });
byId('plan-tools').append(
  h('div', { class: 'sl-input' }, demoSel, h('button', { type: 'button', id: 'load-demo', onclick: () => edit((d) => { for (const k of Object.keys(d)) delete d[k]; Object.assign(d, JSON.parse(JSON.stringify(demos[demoSel.value]!.plan.doc))); }) }, 'start from this demo')),
  drop,
  h('div', { class: 'sl-input' },
    h('button', { type: 'button', id: 'export', onclick: () => downloadText(planFileName(String(doc.name ?? 'plan')), planText(doc as never)) }, 'export plan file'),
    h('button', { type: 'button', id: 'undo', disabled: true, onclick: () => { const prev = history.undo(); if (prev) { doc = prev; commit(true); } } }, 'undo last edit'),
    h('span', { id: 'autosave-state', role: 'status' }, '')),
  h('p', {}, 'Run the exported file headless: ', h('code', {}, 'npx strainledger run FILE --format json')));

// The cells.
const S = (r: ReportV1) => r.units.stress;
/** The starting stock (step 0 of the step charts), in the plan's units like the steps. */
const startOf = (r: ReportV1) => ({ reloadYield: r.material.initial.reloadYield, tensileStrength: r.material.initial.tensileStrength, remainingUniformElongationPct: r.material.initial.uniformElongationPct });
nb.cell({ name: 'doc', fn: () => JSON.parse(JSON.stringify(doc)) })
  .cell({
    name: 'plan', inputs: ['doc'], into: 'cell-validation',
    fn: (d: Doc) => loadPlanText(planText(d as never), FILE),
    render: () => null,
  })
  .cell({
    name: 'report', inputs: ['plan'],
    // The nominal route only: a plan's scatter section is kept in the document and the exported file
    // (the runner and the scatter notebook sample it), but not sampled here on every edit — that
    // would run its Monte Carlo on the page thread for numbers this planner does not show.
    fn: (plan: LoadedPlan) => buildReport({ ...plan, scatter: undefined }, runPlan(plan), { hash: '', tool: 'strainledger notebooks' }),
  })
  .cell({
    name: 'ledgerTable', inputs: ['report'], into: 'cell-ledger',
    fn: (r: ReportV1) => {
      const L = r.units.length;
      const size = (s: Record<string, number | undefined>) => s.thickness !== undefined ? `t ${fixed(s.thickness, DIGITS.size)}` : s.diameter !== undefined ? `d ${fixed(s.diameter, DIGITS.size)}` : s.height !== undefined ? `h ${fixed(s.height, DIGITS.size)}` : '—';
      const cols: [string, string, (s: ReportV1['steps'][number]) => string][] = [
        ['step', 'index', (s) => String(s.index)],
        ['kind', 'kind', (s) => (s.label ? `${s.kind} (${s.label})` : s.kind)],
        [`size ${L}`, 'size', (s) => size(s.size as Record<string, number | undefined>)],
        ['Δε̄', 'strainIncrement', (s) => fixed(s.strainIncrement, DIGITS.strain)],
        ['ε̄ since anneal', 'accumulatedStrain', (s) => fixed(s.accumulatedStrain, DIGITS.strain)],
        ['%CW since anneal', 'coldWorkPct', (s) => fixed(s.coldWorkPct, DIGITS.pct)],
        [`reload yield Rp0.2 ${S(r)} (eng.)`, 'reloadYield', (s) => formatNumber(s.reloadYield, 'stress', S(r))],
        [`Rm ${S(r)} (eng.)`, 'tensileStrength', (s) => formatNumber(s.tensileStrength, 'stress', S(r))],
        ['Rp0.2/Rm', 'yieldRatio', (s) => fixed(s.yieldRatio, DIGITS.ratio)],
        ['uniform elongation left %', 'remainingUniformElongationPct', (s) => fixed(s.remainingUniformElongationPct, DIGITS.pct)],
        ['elastic recovery % strain', 'elasticRecoveryPct', (s) => fixed(s.elasticRecoveryStrain * 100, DIGITS.recoveryPct)],
        ['HV (Tabor estimate)', 'hardnessHV', (s) => fixed(s.hardnessHV, 1)],
        ...(hasTemper(r) ? [['temper', 'temper', temperText] as [string, string, (s: ReportV1['steps'][number]) => string]] : []),
        ['warnings', 'warnings', (s) => s.warnings.map((w) => w.message).join('; ')],
      ];
      const i0 = r.material.initial;
      return h('div', {},
        h('p', {}, `Annealed: Rp0.2 ${formatNumber(i0.reloadYield, 'stress', S(r))} ${S(r)}, Rm ${formatNumber(i0.tensileStrength, 'stress', S(r))} ${S(r)}, uniform elongation ${fixed(i0.uniformElongationPct, DIGITS.pct)} %. `,
          'Rp0.2 and Rm are engineering stresses on the part\'s own section after each step (what a tensile test of the formed part reports); ε̄ is true (von Mises equivalent) plastic strain.'),
        hasTemper(r) ? h('p', { class: 'sl-cautions', id: 'temper-caution' }, h('strong', {}, 'Caution. '), TEMPER_CAUTION) : null,
        h('table', { class: 'sl-table', id: 'ledger-table' },
          h('thead', {}, h('tr', {}, ...cols.map(([t]) => h('th', { scope: 'col' }, t)))),
          h('tbody', {}, ...r.steps.map((s) => h('tr', {}, ...cols.map(([, key, f]) => h('td', { 'data-col': key, ...(key === 'kind' || key === 'warnings' || key === 'temper' ? { class: 'text' } : {}) }, f(s))))))));
    },
  })
  .cell({
    name: 'targets', inputs: ['report'], into: 'cell-targets',
    fn: (r: ReportV1) => {
      if (r.targets.length === 0) return h('p', {}, 'No targets given.');
      return h('ul', { id: 'target-list' }, ...r.targets.map((t) => {
        const v = (x: number) => formatTargetValue(x, t.name, S(r), t.temper?.basis);
        // A temper target names both boundaries of the wanted temper and the one its margin is measured to.
        const limit = t.temper ? '' : `limit ${v(t.limit)}, `;
        return h('li', { 'data-target': t.name },
          h('span', { class: t.met && !t.caution ? 'sl-met' : 'sl-missed' }, t.met ? (t.caution ? 'met, within the model\'s error' : 'met') : 'NOT met'),
          ` — ${targetLabel(t.name, t.temper?.wanted, t.temper?.wantedName)}: predicted ${v(t.predicted)}, ${limit}`,
          t.met ? `margin ${v(t.margin)} to spare` : `short by ${v(-t.margin)}`,
          ...(t.temper ? [temperTargetNote(r, t).replace(/^ — /, '; ')] : []),
          ...(t.caution ? [h('span', { class: 'sl-notice sl-target-caution', 'data-caution': t.caution.code }, ` Caution: ${t.caution.message}.`)] : []));
      }),
        h('li', {}, h('strong', {}, r.allTargetsMet ? 'All targets met.' : 'Not every target is met.')));
    },
  })
  .cell({
    name: 'window', inputs: ['report'], into: 'cell-window',
    fn: (r: ReportV1) => {
      const w = r.coldWorkWindow;
      const red = !w.empty && w.reductionBasis && w.reductionPctFrom !== null
        ? ` As ${w.reductionBasis} reduction since the last anneal: ${fixed(w.reductionPctFrom, 1)} % to ${w.reductionPctTo === null ? 'no limit' : fixed(w.reductionPctTo, 1) + ' %'}.` : '';
      return h('p', { id: 'cold-work-window' }, h('strong', {}, 'Cold-work window: '), w.empty ? `empty — ${w.note}` : `${w.note}.${red}`);
    },
  })
  .cell({
    name: 'strengthWidth', fn: () => widthStream(byId('cell-strength-chart')),
  })
  .cell({
    name: 'ductilityWidth', fn: () => widthStream(byId('cell-ductility-chart')),
  })
  .cell({
    name: 'strengthChart', inputs: ['report', 'strengthWidth'], into: 'cell-strength-chart',
    fn: (r: ReportV1, width: number) => {
      const t = Object.fromEntries(r.targets.map((x) => [x.name, x.limit]));
      return strengthByStepChart(r.steps, { stressUnit: S(r), start: startOf(r), ...(t.minYield !== undefined ? { minYield: t.minYield } : {}), ...(t.maxYield !== undefined ? { maxYield: t.maxYield } : {}), width });
    },
  })
  .cell({
    name: 'ductilityChart', inputs: ['report', 'ductilityWidth'], into: 'cell-ductility-chart',
    fn: (r: ReportV1, width: number) => {
      const t = Object.fromEntries(r.targets.map((x) => [x.name, x.limit]));
      return ductilityByStepChart(r.steps, { stressUnit: S(r), start: startOf(r), ...(t.minRemainingElongationPct !== undefined ? { minRemainingElongationPct: t.minRemainingElongationPct } : {}), width });
    },
  })
  .cell({
    name: 'hardnessWidth', fn: () => widthStream(byId('cell-hardness-chart')),
  })
  .cell({
    name: 'hardnessChart', inputs: ['report', 'hardnessWidth'], into: 'cell-hardness-chart',
    fn: (r: ReportV1, width: number) => {
      const t = Object.fromEntries(r.targets.map((x) => [x.name, x.limit]));
      const hm = r.material.hardness;
      return h('div', {},
        hardnessByStepChart(r.steps, { ...(hm ? { initialHV: hm.initialHV } : {}), ...(t.minHardnessHV !== undefined ? { minHardnessHV: t.minHardnessHV } : {}), ...(t.maxHardnessHV !== undefined ? { maxHardnessHV: t.maxHardnessHV } : {}), width }),
        hm ? h('p', { id: 'hardness-basis', class: 'sl-note' }, hardnessText(hm)) : null);
    },
  });

drawEditors();
commit(false);
expose('route', nb);
