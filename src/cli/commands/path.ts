import { integratePath } from '../../core/path/integrate.js';
import { withLocation } from '../../plan/resolve.js';
import { loadPlanOrMaterial } from '../../plan/material.js';
import { PlanError } from '../../plan/problems.js';
import { CAUTIONS } from '../../report/cautions.js';
import { defineCommand } from '../command.js';
import { readText, writeFileAtomic } from '../io.js';

const CLI = '(command line)';

/** Parses `--history "0.02,0,-0.02"`: total strains, in order. */
function parseHistory(s: string): number[] {
  const parts = s.split(',').map((x) => x.trim());
  return parts.map((p, i) => {
    const v = p === '' ? Number.NaN : Number(p);
    if (!Number.isFinite(v)) throw new PlanError([{ file: CLI, path: `--history[${i}]`, message: `got ${JSON.stringify(p)}, allowed a number (true strain), e.g. --history "0.02,0,-0.02,0.03"` }]);
    return v;
  });
}

/**
 * `strainledger path PLAN_OR_MATERIAL --history "0.02,0,-0.02,0.03" [--increment H] [--format json|csv] [--out FILE]`:
 * the stress–strain points of a strain history (each entry a total true strain to reach, in order, from
 * the annealed state at 0) by the 1-D return-mapping integrator, with the plan's kinematic parameters
 * when it has them. Stresses in the plan's unit. Exit 0 ok; 1 an increment missed its tolerance; 2 invalid input.
 */
export const path = defineCommand({
  name: 'path',
  summary: 'stress–strain points of a strain history (1-D return mapping, with the material\'s backstresses when it has them)',
  args: 'PLAN_OR_MATERIAL',
  details: 'stresses in the plan\'s unit. exit codes: 0 done, 1 an increment missed its tolerance, 2 invalid input',
  options: {
    history: { type: 'string', value: 'STRAINS', required: true, help: 'comma-separated total true strains to reach in order from the annealed state, e.g. "0.02,0,-0.02,0.03"' },
    increment: { type: 'string', value: 'H', help: 'largest strain increment of the integrator, 1e-7 to 0.05' },
    format: { type: 'string', default: 'json', value: 'FORMAT', help: 'output, one of json, csv' },
    out: { type: 'string', value: 'FILE', help: 'write the points to FILE (atomically) instead of stdout' },
  },
  run({ values, positionals }, io) {
    if (positionals.length !== 1) throw new PlanError([{ file: CLI, path: 'PLAN_OR_MATERIAL', message: `got ${positionals.length} files, allowed exactly one` }]);
    const format = values.format!;
    if (format !== 'json' && format !== 'csv') throw new PlanError([{ file: CLI, path: '--format', message: `got ${JSON.stringify(format)}, allowed one of json, csv` }]);
    if (values.history === undefined) throw new PlanError([{ file: CLI, path: '--history', message: 'missing; allowed a comma-separated list of total true strains, e.g. --history "0.02,0,-0.02,0.03"' }]);
    const history = parseHistory(values.history);
    let maxIncrement: number | undefined;
    if (values.increment !== undefined) {
      maxIncrement = Number(values.increment);
      if (!Number.isFinite(maxIncrement)) throw new PlanError([{ file: CLI, path: '--increment', message: `got ${JSON.stringify(values.increment)}, allowed a number in [1e-7, 0.05]` }]);
    }
    const file = positionals[0]!;
    const plan = loadPlanOrMaterial(readText(file), file);
    const m = plan.route.material;
    const result = withLocation(CLI, undefined, () => integratePath(m, history, maxIncrement === undefined ? {} : { maxIncrement }));
    const u = plan.units;
    const S = u.fromMPa;
    let text: string;
    if (format === 'csv') {
      const head = ['strain', `stress_${u.stress}`, 'plasticStrain', 'accumulatedPlasticStrain', `backstress_${u.stress}`, `yieldSurfaceSize_${u.stress}`, `modulus_${u.stress}`];
      const lines = result.points.map((p) => [p.strain, S(p.stress), p.plasticStrain, p.accumulatedPlasticStrain, S(p.backstress), S(p.yieldSurfaceSize), S(p.modulus)].join(','));
      text = [head.join(','), ...lines].join('\n') + '\n';
    } else {
      text = JSON.stringify({
        material: m.name,
        units: { stress: u.stress, strain: 'true (logarithmic), dimensionless' },
        hardening: m.kinematic ? 'combined (flow curve split into yield-surface size and Armstrong–Frederick backstresses)' : 'isotropic',
        history,
        converged: result.converged,
        iterations: result.iterations,
        residual: result.residual,
        increments: result.increments,
        points: result.points.map((p) => ({
          strain: p.strain, stress: S(p.stress), plasticStrain: p.plasticStrain, accumulatedPlasticStrain: p.accumulatedPlasticStrain,
          backstress: S(p.backstress), yieldSurfaceSize: S(p.yieldSurfaceSize), modulus: S(p.modulus),
        })),
        cautions: [...CAUTIONS],
      }, null, 2) + '\n';
    }
    if (values.out !== undefined) writeFileAtomic(values.out, text);
    else io.stdout(text);
    if (!result.converged) {
      io.stderr(`strainledger path: some increments missed the tolerance (largest relative residual ${result.residual.toExponential(2)}); try a smaller --increment\n`);
      return 1;
    }
    return 0;
  },
});
