import { describe, expect, it } from 'vitest';
import { designRoute, evaluateRoute, hollomon, strainForHardness, type Material } from '../../../src/core/index.js';
import { expectRelClose } from '../../helpers.js';

// Callister, Fundamentals of Materials Science and Engineering, 2nd ed., p. 199: annealed low-carbon steel
// K 600 MPa, n 0.21; E 207 GPa (Table B.2). The hardness window is INVENTED (a drawing's 150–165 HV).
const hardness = { taborFactor: 2.9, representativeStrain: 0.08, basis: 'given' as const };
const steel: Material = { name: 'low-carbon steel', elasticModulus: 207000, poissonRatio: 0.3, law: hollomon({ K: 600, n: 0.21 }), hardness };

describe('designRoute with a hardness window', () => {
  const spec = {
    material: steel, process: 'draw' as const, startSize: 5.5, finalSize: 2.5, maxPassReductionPct: 30, maxStrainBeforeAnneal: 1.3,
    window: { minHardnessHV: 150, maxHardnessHV: 165 }, dieHalfAngleDeg: 6, friction: 0.05,
  };
  const res = designRoute(spec);
  it('places the final temper inside the strain window the material\'s own c gives', () => {
    expect(res.feasible).toBe(true);
    expect(res.window.limitedBy).toEqual({ from: 'minHardnessHV', to: 'maxHardnessHV' });
    expectRelClose(res.window.strainFrom!, strainForHardness(steel.law, 150, hardness)!, 1e-12);
    expectRelClose(res.window.strainTo!, strainForHardness(steel.law, 165, hardness)!, 1e-12);
    expect(res.routes[0]!.finalStrain).toBeGreaterThanOrEqual(res.window.strainFrom!);
    expect(res.routes[0]!.finalStrain).toBeLessThanOrEqual(res.window.strainTo!);
  });
  it('every designed route meets both hardness targets when run through the ledger', () => {
    for (const r of res.routes) {
      const l = evaluateRoute({ material: steel, start: { diameter: 5.5 }, steps: r.steps, targets: spec.window });
      expect(l.allTargetsMet, `route ${r.rank}`).toBe(true);
      const hv = l.rows.at(-1)!.hardnessHV;
      expect(hv).toBeGreaterThanOrEqual(150);
      expect(hv).toBeLessThanOrEqual(165);
    }
  });
  it('an unreachable hardness makes the design infeasible, naming the target', () => {
    const r = designRoute({ ...spec, window: { minHardnessHV: 400 } });
    expect(r.feasible).toBe(false);
    expect(r.binding.limit).toMatch(/minHardnessHV/);
  });
});
