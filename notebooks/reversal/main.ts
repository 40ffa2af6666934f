// Reversal and springback: a load path with reversal (combined against isotropic hardening) and the
// springback of a bend, both following the prestrain slider. Every number comes from the core
// (integratePath, springback, backstressAfter); the page only arranges and formats them.
import { Notebook, expose, slider, choice, valueStream, h, quantity, DIGITS, byId } from '../../src/cells/index.js';
import { integratePath, springback, backstressAfter, chordModulus } from '../../src/core/index.js';
import type { Material, PathResult, SpringbackResult } from '../../src/core/index.js';
import { reversalChart, residualStressChart } from '../../src/charts/reversal.js';
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

interface Paths { kin: PathResult | null; iso: PathResult; reverseYieldKin: number | null; reverseYieldIso: number; top: number }

/** Stress at which the reversed leg starts to flow: the far side of the yield surface at the turning point, X − R. */
function reverseYield(r: PathResult, topIndex: number): number {
  const top = r.points[topIndex]!;
  return top.backstress - top.yieldSurfaceSize;
}

const nb = new Notebook();
nb.cell({ name: 'source', fn: () => valueStream(sourceInput) })
  .cell({ name: 'prestrain', fn: () => valueStream(prestrainInput) })
  .cell({ name: 'reverse', fn: () => valueStream(reverseInput) })
  .cell({ name: 'thickness', fn: () => valueStream(thicknessInput) })
  .cell({ name: 'radius', fn: () => valueStream(radiusInput) })
  .cell({ name: 'angle', fn: () => valueStream(angleInput) })
  .cell({
    name: 'material', inputs: ['source'], into: 'material-note',
    fn: (i: number): Material => demos[i]!.plan.route.material,
    render: (v) => {
      const m = v as Material;
      return h('p', {}, `E = ${m.elasticModulus} MPa, ν = ${m.poissonRatio}; `,
        m.kinematic ? `${m.kinematic.backstresses.length} backstress(es): ${m.kinematic.backstresses.map((b) => `C ${b.C} MPa, γ ${b.gamma}`).join('; ')}. ` : 'no kinematic parameters: only the isotropic path is drawn, and the reversed yield it shows is overstated. ',
        h('span', { class: 'sl-invented' }, 'INVENTED demo data'));
    },
  })
  .cell({
    name: 'paths', inputs: ['material', 'prestrain', 'reverse'],
    fn: (m: Material, pre: number, rev: number): Paths => {
      // Total strain at which the plastic strain equals the prestrain on first loading: εp + σ(εp)/E(εp).
      const top = pre + m.law.stress(pre) / chordModulus(m.elasticModulus, m.modulusDecay, pre);
      const back = top - (2 * m.law.stress(pre)) / m.elasticModulus - rev;
      const opts = { maxIncrement: 1e-4 };
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
      quantity('reverse yield, isotropic hardening', p.reverseYieldIso, DIGITS.stress, 'MPa', 'reverseYieldIso'),
      quantity('reverse yield, with backstresses', p.reverseYieldKin, DIGITS.stress, 'MPa', 'reverseYieldKin')),
  })
  .cell({
    name: 'pathChart', inputs: ['paths'], into: 'cell-path-chart',
    fn: (p: Paths) => reversalChart([
      ...(p.kin ? [{ label: 'with backstresses (combined)', points: p.kin.points }] : []),
      { label: 'isotropic only', points: p.iso.points },
    ], { stressUnit: 'MPa' }),
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
      quantity('outer-fibre strain t/(2ρ)', b.outerFibreStrain, DIGITS.strain, '', 'outerFibreStrain'),
      b.reverseYield ? h('p', { class: 'sl-warning' }, 'The residual stress reaches reverse yield: unloading is not purely elastic, springback is somewhat overstated.') : null),
  })
  .cell({
    name: 'residualChart', inputs: ['bend'], into: 'cell-residual-chart',
    fn: (b: SpringbackResult) => residualStressChart(b.residualStress, { stressUnit: 'MPa', lengthUnit: 'mm' }),
  });
expose('reversal', nb);
