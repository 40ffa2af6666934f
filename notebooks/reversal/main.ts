// Reversal and springback: a load path with reversal (combined against isotropic hardening) and the
// springback of a bend, both following the prestrain slider. Every number comes from the core
// (integratePath, springback, backstressAfter); the page only arranges and formats them.
import { Notebook, expose, slider, choice, valueStream, widthStream, h, quantity, DIGITS, byId, fileDrop, errorBox, downloadText } from '../../src/cells/index.js';
import { integratePath, springback, backstressAfter, chordModulus, fitKinematic, trueCurve } from '../../src/core/index.js';
import type { KinematicFit, Material, PathResult, SpringbackResult } from '../../src/core/index.js';
import { parseRecordText } from '../../src/records/index.js';
import { reversalChart, residualStressChart } from '../../src/charts/reversal.js';
import { chartStreams, type Pts } from '../shared/chartStream.js';
import { demoPlans, pageChrome } from '../shared/page.js';

pageChrome('reversal/', 'Reversal and springback');

const demos = demoPlans();
const withKin = demos.findIndex((d) => d.plan.route.material.kinematic !== undefined);
const sourceInput = choice({
  label: 'Material', id: 'material', value: Math.max(0, withKin),
  options: demos.map((d, i) => ({ value: i, text: `${d.plan.route.material.name} — INVENTED demo (${d.file})` })),
});
byId('material-input').append(sourceInput);
const prestrainInput = slider({ label: 'Prestrain ε̄', min: 0, max: 0.5, step: 0.001, value: 0.05, unit: '(equivalent true plastic strain)', id: 'prestrain' });
byId('prestrain-input').append(prestrainInput);
const reverseInput = slider({ label: 'Push back past zero stress by', min: 0.002, max: 0.05, step: 0.001, value: 0.02, unit: '(true strain)', id: 'reverse' });
byId('reverse-input').append(reverseInput);
const thicknessInput = slider({ label: 'Strip thickness', min: 0.2, max: 6, step: 0.05, value: 1.8, unit: 'mm', id: 'thickness' });
byId('thickness-input').append(thicknessInput);
const radiusInput = slider({ label: 'Tool inner radius', min: 0.5, max: 60, step: 0.5, value: 4, unit: 'mm', id: 'radius' });
byId('radius-input').append(radiusInput);
const angleInput = slider({ label: 'Tool bend angle', min: 5, max: 180, step: 1, value: 90, unit: '°', id: 'angle' });
byId('angle-input').append(angleInput);

// Reversal records: choose or drop a file, or open the INVENTED demo record (examples/reversal/).
const REVERSAL_RECORDS = import.meta.glob('../../examples/reversal/*.{csv,tsv,txt}', { query: '?raw', import: 'default', eager: true }) as Record<string, string>;
const recFile = h('input', { type: 'file', id: 'kinfit-file', accept: '.csv,.tsv,.txt,text/csv,text/plain' });
const recDrop = h('div', { class: 'sl-drop', id: 'kinfit-drop', role: 'button', 'aria-label': 'Reversal record: drop it here or press Enter to choose' },
  'Drop a record with a reversal (CSV or tab-separated; compression negative) here, or ', h('label', { for: 'kinfit-file' }, 'choose one: '), recFile);
const valuesInput = choice({ label: 'Columns hold', id: 'kinfit-values', value: 'engineering' as 'engineering' | 'true', options: [
  { value: 'engineering' as const, text: 'engineering strain and stress (converted: ε = ln(1 + e), σ = s(1 + e))' },
  { value: 'true' as const, text: 'true strain and stress' }] });
const termsInput = choice({ label: 'Backstresses', id: 'kinfit-terms', value: 1, options: [1, 2, 3].map((n) => ({ value: n, text: String(n) })) });
const demoRecords = Object.entries(REVERSAL_RECORDS);
byId('kinfit-input').append(recDrop, valuesInput, termsInput,
  ...(demoRecords.length ? [h('button', { type: 'button', id: 'kinfit-demo', onclick: () => nb.set('recordInput', { name: demoRecords[0]![0].split('/').pop()!, text: demoRecords[0]![1] }) }, `open the INVENTED demo record (${demoRecords[0]![0].split('/').pop()})`)] : []));

interface Paths { kin: PathResult | null; iso: PathResult; reverseYieldKin: number | null; reverseYieldIso: number; top: number }

/** Stress at which the reversed leg starts to flow: the far side of the yield surface at the turning point, X − R. */
function reverseYield(r: PathResult, topIndex: number): number {
  const top = r.points[topIndex]!;
  return top.backstress - top.yieldSurfaceSize;
}

const chartStream = chartStreams(() => nb);
const xy = (pts: readonly { strain: number; stress: number }[]): Pts => pts.map((p) => ({ x: p.strain, y: p.stress }));

const nb = new Notebook();
nb.cell({ name: 'source', fn: () => valueStream(sourceInput) })
  .cell({ name: 'prestrain', fn: () => valueStream(prestrainInput) })
  .cell({ name: 'reverse', fn: () => valueStream(reverseInput) })
  .cell({ name: 'thickness', fn: () => valueStream(thicknessInput) })
  .cell({ name: 'radius', fn: () => valueStream(radiusInput) })
  .cell({ name: 'angle', fn: () => valueStream(angleInput) })
  .cell({ name: 'pathWidth', fn: () => widthStream(byId('cell-path-chart')) })
  .cell({ name: 'residualWidth', fn: () => widthStream(byId('cell-residual-chart')) })
  .cell({
    name: 'material', inputs: ['source'], into: 'material-note',
    fn: (i: number): Material => demos[i]!.plan.route.material,
    render: (v) => {
      const m = v as Material;
      return h('p', {}, `E = ${m.elasticModulus} MPa, ν = ${m.poissonRatio}; `,
        m.kinematic ? `${m.kinematic.backstresses.length} backstress${m.kinematic.backstresses.length === 1 ? '' : 'es'}: ${m.kinematic.backstresses.map((b) => `C ${b.C} MPa, γ ${b.gamma}`).join('; ')}. ` : 'no kinematic parameters: only the isotropic path is drawn, and the reversed yield it shows is overstated. ',
        h('span', { class: 'sl-invented' }, 'INVENTED demo data'));
    },
  })
  .cell({
    name: 'paths', inputs: ['material', 'prestrain', 'reverse'],
    fn: (m: Material, pre: number, rev: number): Paths => {
      // Total strain at which the plastic strain equals the prestrain on first loading: εp + σ(εp)/E(εp).
      const top = pre + m.law.stress(pre) / chordModulus(m.elasticModulus, m.modulusDecay, pre);
      const back = top - (2 * m.law.stress(pre)) / m.elasticModulus - rev;
      // The return mapping is exact for each monotonic leg whatever the increment (core/path/integrate.ts),
      // so the increment only sets how many points the chart gets: ~400 over the whole path (was a fixed
      // 1e-4, i.e. up to 10,000 points, which cost a slider move 25–45 ms in bench/notebook-latency.mjs).
      const opts = { maxIncrement: Math.min(0.05, Math.max(1e-4, (top + (top - back)) / 400)) };
      const base = { elasticModulus: m.elasticModulus, law: m.law, ...(m.modulusDecay ? { modulusDecay: m.modulusDecay } : {}) };
      const iso = integratePath(base, [top, back], opts);
      const kin = m.kinematic ? integratePath({ ...base, kinematic: m.kinematic }, [top, back], opts) : null;
      const ti = iso.points.findIndex((p) => p.strain === top);
      return { iso, kin, top, reverseYieldIso: reverseYield(iso, ti), reverseYieldKin: kin ? reverseYield(kin, kin.points.findIndex((p) => p.strain === top)) : null };
    },
  })
  .cell({
    name: 'pathNumbers', inputs: ['paths'], into: 'cell-path-numbers',
    fn: (p: Paths) => h('dl', { class: 'sl-quantities' },
      quantity('reverse yield onset, isotropic hardening (true stress)', p.reverseYieldIso, DIGITS.stress, 'MPa', 'reverseYieldIso'),
      quantity('reverse yield onset, with backstresses (true stress)', p.reverseYieldKin, DIGITS.stress, 'MPa', 'reverseYieldKin')),
  })
  .cell({
    name: 'pathChart', inputs: ['paths', 'pathWidth'], into: 'cell-path-chart',
    fn: (p: Paths, width: number) => {
      const series = [
        ...(p.kin ? [{ label: 'with backstresses (combined)', points: p.kin.points }] : []),
        { label: 'isotropic only', points: p.iso.points },
      ];
      return chartStream('pathChart', `${width}|${series.map((s) => s.label).join('|')}`, series.map((s) => xy(s.points)), undefined,
        () => reversalChart(series, { stressUnit: 'MPa', width }) as Element);
    },
  })
  .cell({
    // The push-back in detail: on the whole path it is a short stretch drawn over the loading branch (a
    // prestrain of 0.3 and a push-back of 0.01 leave it 3 % of the width), so it gets its own axis:
    // strain pushed back from the turning point, from 0 to the end of the push-back.
    name: 'pushChart', inputs: ['paths', 'pathWidth'], into: 'cell-push-chart',
    fn: (p: Paths, width: number) => {
      const back = (pts: readonly { strain: number; stress: number }[]) => {
        const i = pts.findIndex((q) => q.strain === p.top);
        return pts.slice(i).map((q) => ({ strain: p.top - q.strain, stress: q.stress }));
      };
      const series = [
        ...(p.kin ? [{ label: 'with backstresses (combined)', points: back(p.kin.points) }] : []),
        { label: 'isotropic only', points: back(p.iso.points) },
      ];
      return chartStream('pushChart', `${width}|${series.map((s) => s.label).join('|')}`, series.map((s) => xy(s.points)), undefined,
        () => reversalChart(series, { stressUnit: 'MPa', width, height: 260, xLabel: 'strain pushed back from the turning point (true, –)' }) as Element);
    },
  })
  .cell({
    name: 'bend', inputs: ['material', 'prestrain', 'thickness', 'radius', 'angle'],
    fn: (m: Material, pre: number, t: number, R: number, angle: number): SpringbackResult => springback({
      elasticModulus: m.elasticModulus, poissonRatio: m.poissonRatio, law: m.law, thickness: t, prestrain: pre,
      ...(m.modulusDecay ? { modulusDecay: m.modulusDecay } : {}),
      ...(m.kinematic ? { kinematic: m.kinematic, backstresses: m.kinematic.backstresses.map((b) => backstressAfter(0, b.C, b.gamma, 1, pre)) } : {}),
    }, { radius: R, angleDeg: angle }),
  })
  .cell({
    name: 'bendNumbers', inputs: ['bend'], into: 'cell-bend-numbers',
    fn: (b: SpringbackResult) => h('dl', { class: 'sl-quantities' },
      quantity('springback', b.springbackDeg, 2, '°', 'springbackDeg'),
      quantity('final angle', b.finalAngleDeg, 2, '°', 'finalAngleDeg'),
      quantity('final inner radius', b.finalRadius, DIGITS.size, b.finalRadius === null ? '(springs back flat)' : 'mm', 'finalRadius'),
      quantity('outer-fibre strain (from the neutral surface)', b.outerFibreStrain, DIGITS.strain, '', 'outerFibreStrain'),
      b.reverseYield ? h('p', { class: 'sl-warning' }, 'The residual stress reaches reverse yield: unloading is not purely elastic, springback is somewhat overstated.') : null),
  })
  .cell({
    name: 'residualChart', inputs: ['bend', 'residualWidth'], into: 'cell-residual-chart',
    fn: (b: SpringbackResult, width: number) => {
      // Same order as the chart draws them (by position through the thickness).
      const pts = [...b.residualStress].sort((a, c) => a.y - c.y).map((p) => ({ x: p.stress, y: p.y }));
      return chartStream('residualChart', String(width), [pts], pts, () => residualStressChart(b.residualStress, { stressUnit: 'MPa', lengthUnit: 'mm', width }) as Element);
    },
  });

interface KinFitView { fit: KinematicFit; strain: Float64Array; stress: Float64Array; model: PathResult; name: string; material: Material }

nb.cell({ name: 'recordInput', fn: () => null })
  .cell({ name: 'recordValues', fn: () => valueStream(valuesInput) })
  .cell({ name: 'terms', fn: () => valueStream(termsInput) })
  .cell({
    // A record that cannot be read or fitted shows its problem here (file, line, field, value and
    // what is allowed); the sliders and charts above keep working.
    name: 'kinfit', inputs: ['material', 'recordInput', 'recordValues', 'terms'], into: 'cell-kinfit-numbers',
    fn: (m: Material, input: { name: string; text: string } | null, values: 'engineering' | 'true', terms: number): KinFitView | null => {
      if (!input) return null;
      const rec = parseRecordText(input.text, { file: input.name });
      const { strain, stress } = values === 'engineering' ? trueCurve(rec.strain, rec.stress) : { strain: rec.strain, stress: rec.stress };
      const fit = fitKinematic(m, strain, stress, { backstresses: terms });
      const base = { elasticModulus: m.elasticModulus, law: m.law, ...(m.modulusDecay ? { modulusDecay: m.modulusDecay } : {}), kinematic: fit.kinematic };
      const model = integratePath(base, Array.from(strain).filter((_, i) => i > 0 && i % 5 === 0 || i === strain.length - 1), { maxIncrement: 1e-4 });
      return { fit, strain, stress, model, name: input.name, material: m };
    },
    render: (v) => {
      const k = v as KinFitView | null;
      if (!k) return h('p', {}, 'No record yet: choose or drop one, or open the demo record.');
      const f = k.fit;
      return h('div', {},
        h('p', {}, `${k.name}: ${f.points} points fitted${f.converged ? '' : ' — NOT converged'}; RMSE ${f.rmse.toPrecision(3)} MPa, R² ${f.r2.toFixed(5)}.`),
        h('dl', { class: 'sl-quantities' }, ...f.kinematic.backstresses.flatMap((b, i) => [
          quantity(`C${i + 1} (± ${f.standardErrors[i]!.C === null ? '—' : f.standardErrors[i]!.C!.toPrecision(2)})`, b.C, 0, 'MPa', `kinC${i + 1}`),
          quantity(`γ${i + 1} (± ${f.standardErrors[i]!.gamma === null ? '—' : f.standardErrors[i]!.gamma!.toPrecision(2)})`, b.gamma, 2, '', `kinGamma${i + 1}`),
          quantity(`saturation C${i + 1}/γ${i + 1}`, b.C / b.gamma, DIGITS.stress, 'MPa', `kinSat${i + 1}`),
        ])),
        ...f.warnings.map((w) => h('p', { class: 'sl-warning' }, w.message)),
        h('p', { class: 'sl-notice' }, 'These backstresses describe this record; other prestrains, strain ranges or paths may need other values. Confirm on the real material before relying on reversed-yield or springback numbers.'),
        h('button', { type: 'button', id: 'kinfit-download', onclick: () => {
          const mat = k.material;
          const doc = { units: 'SI', name: `${mat.name} (backstresses fitted to ${k.name})`, elasticModulus: mat.elasticModulus, poissonRatio: mat.poissonRatio,
            flowCurve: { law: mat.law.law, ...mat.law.params }, ...(mat.modulusDecay ? { modulusDecay: mat.modulusDecay } : {}),
            kinematic: { backstresses: f.kinematic.backstresses.map((b) => ({ C: +b.C.toPrecision(6), gamma: +b.gamma.toPrecision(6) })) } };
          downloadText('material-with-backstresses.json', JSON.stringify(doc, null, 2) + '\n');
        } }, 'download the material with these backstresses'));
    },
  })
  .cell({
    name: 'kinfitChart', inputs: ['kinfit', 'pathWidth'], into: 'cell-kinfit-chart',
    // Chart and caption only with a record (the numbers cell above says how to open one).
    fn: (k: KinFitView | null, width: number) => k === null ? h('span', { hidden: '' }) : h('figure', { id: 'kinfit-figure' }, reversalChart([
      { label: 'record (true values)', points: Array.from(k.strain, (e, i) => ({ strain: e, stress: k.stress[i]! })) },
      { label: 'fitted model', points: k.model.points },
    ], { stressUnit: 'MPa', width }) as Element,
    h('figcaption', {}, `${k.name} (true values) and the fitted model driven through the same strains on the material's flow curve (true stress, total true strain).`)),
  });
fileDrop(recDrop, recFile as HTMLInputElement, (name, text) => nb.set('recordInput', { name, text }), (e) => byId('cell-kinfit-numbers').replaceChildren(errorBox(e, 'The file could not be read')));
expose('reversal', nb);
