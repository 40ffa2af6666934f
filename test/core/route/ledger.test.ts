import { describe, expect, it } from 'vitest';
import { evaluateRoute, hollomon, InputError, voce, type Material, type Step } from '../../../src/core/index.js';
import { expectAbsClose, expectRelClose } from '../../helpers.js';

// Callister's annealed copper (2nd ed., p. 199): K = 530 MPa, n = 0.44; E = 115 GPa (Table B.2, C11000).
const copper: Material = { name: 'copper', elasticModulus: 115000, poissonRatio: 0.3, law: hollomon({ K: 530, n: 0.44 }) };

describe('evaluateRoute: one roll pass of Callister copper', () => {
  const ledger = evaluateRoute({ material: copper, start: { thickness: 2 }, steps: [{ kind: 'roll', thickness: 1.6 }] });
  const r = ledger.rows[0]!;
  const eps = (2 / Math.sqrt(3)) * Math.log(2 / 1.6);
  it('strain increment is the plane-strain equivalent (2/√3)·ln(t0/t)', () => {
    expectRelClose(r.strainIncrement, eps, 1e-15);
    expectRelClose(r.accumulatedStrain, eps, 1e-15);
  });
  it('%CW is the thickness reduction, 20 %', () => expectRelClose(r.coldWorkPct, 20, 1e-12));
  it('reload yield is the engineering proof strength on the rolled section, σ(ε̄ + 0.002)·e^(−0.002) (ISO 6892-1 Rp0.2, offset 0.2 %; constant volume)', () => {
    // Rp0.2 is force over the specimen's original section (ISO 6892-1 §3.10.3); the formed strip is
    // that specimen, so F/A₁ = σ·A/A₁ = σ(ε̄ + 0.002)·e^(−0.002). The factor is 0.998002, not 1.
    expectRelClose(r.reloadYield, 530 * (eps + 0.002) ** 0.44 * Math.exp(-0.002), 1e-14);
    expect(Math.abs(r.reloadYield / (530 * (eps + 0.002) ** 0.44) - 1)).toBeGreaterThan(1.9e-3);
  });
  it('tensile strength below εu is σ(εu)·exp(ε̄ − εu) on the new section', () => {
    expectRelClose(r.tensileStrength, 530 * 0.44 ** 0.44 * Math.exp(eps - 0.44), 1e-14);
  });
  it('remaining uniform strain is n − ε̄ and the elongation 100·(e^(n−ε̄) − 1)', () => {
    expectRelClose(r.remainingUniformStrain, 0.44 - eps, 1e-14);
    expectRelClose(r.remainingUniformElongationPct, 100 * Math.expm1(0.44 - eps), 1e-13);
  });
  it('elastic recovery is σ/E and recovered energy σ²/(2E)', () => {
    const s = 530 * eps ** 0.44;
    expectRelClose(r.elasticRecoveryStrain, s / 115000, 1e-14);
    expectRelClose(r.recoveredElasticEnergy, (s * s) / 230000, 1e-14);
  });
  it('plastic work is K·ε^(n+1)/(n+1) and the mean flow stress K·εⁿ/(1+n) (CHECKS.md mean flow stress for Hollomon)', () => {
    expectRelClose(r.plasticWork, (530 * eps ** 1.44) / 1.44, 1e-14);
    expectRelClose(r.meanFlowStress, (530 * eps ** 0.44) / 1.44, 1e-14);
  });
  it('no warnings below the uniform strain', () => expect(r.warnings).toEqual([]));
});

describe('evaluateRoute: past the uniform strain', () => {
  it('tensile strength is the flow stress and a necking warning is given', () => {
    const l = evaluateRoute({ material: copper, start: {}, steps: [{ kind: 'strain', strain: 0.6 }] });
    const r = l.rows[0]!;
    expectRelClose(r.tensileStrength, 530 * 0.6 ** 0.44, 1e-14);
    expect(r.remainingUniformStrain).toBe(0);
    expect(r.remainingUniformElongationPct).toBe(0);
    expect(r.warnings.map((w) => w.code)).toEqual(['necking']);
  });
});

describe('evaluateRoute: drawing, anneal and %CW since the last anneal', () => {
  const steps: Step[] = [
    { kind: 'draw', diameter: 12.2 },
    { kind: 'anneal' },
    { kind: 'draw', areaReductionPct: 20 },
    { kind: 'draw', areaReductionPct: 20 },
  ];
  const l = evaluateRoute({ material: copper, start: { diameter: 15.2 }, steps });
  it('draw 15.2 → 12.2 mm gives %CW 35.6 (Callister worked example) and ε̄ = ln(A0/A)', () => {
    expectAbsClose(l.rows[0]!.coldWorkPct, 35.6, 0.05);
    expectRelClose(l.rows[0]!.strainIncrement, 2 * Math.log(15.2 / 12.2), 1e-14);
  });
  it('a full anneal resets the strain and the %CW, and restores the starting properties', () => {
    const a = l.rows[1]!;
    expect(a.accumulatedStrain).toBe(0);
    expect(a.coldWorkPct).toBe(0);
    expect(a.reloadYield).toBe(l.initial.reloadYield);
    expect(a.tensileStrength).toBe(l.initial.tensileStrength);
  });
  it('%CW after two 20 % area reductions is 36 % and the diameter is 12.2·0.8', () => {
    expectRelClose(l.rows[3]!.coldWorkPct, 36, 1e-12);
    expectRelClose(l.rows[3]!.size.diameter!, 12.2 * 0.8, 1e-12);
  });
});

describe('evaluateRoute: partial anneal (fractional softening)', () => {
  it('softeningFraction f lowers the flow stress by f·(σ(ε̄) − σ(0))', () => {
    const law = voce({ sigma0: 200, Q: 180, b: 9 });
    const m: Material = { ...copper, law };
    const l = evaluateRoute({ material: m, start: {}, steps: [{ kind: 'strain', strain: 0.3 }, { kind: 'anneal', softeningFraction: 0.4 }] });
    const s1 = law.stress(0.3);
    expectRelClose(l.rows[1]!.flowStress, s1 - 0.4 * (s1 - 200), 1e-12);
  });
});

describe('invalid steps are input errors naming the field', () => {
  const run = (start: object, steps: Step[]) => () => evaluateRoute({ material: copper, start, steps });
  it('a roll to a larger thickness', () => expect(run({ thickness: 2 }, [{ kind: 'roll', thickness: 2.5 }])).toThrow(/steps\[0\]\.thickness.*cannot enlarge/));
  it('a reduction of 100 %', () => expect(run({ thickness: 2 }, [{ kind: 'roll', reductionPct: 100 }])).toThrow(/steps\[0\]\.reductionPct: got 100, allowed a number in \[0, 100\)/));
  it('a draw that enlarges the wire', () => expect(run({ diameter: 5 }, [{ kind: 'draw', diameter: 6 }])).toThrow(/steps\[0\]\.diameter/));
  it('a draw of strip', () => expect(run({ thickness: 2 }, [{ kind: 'draw', areaReductionPct: 10 }])).toThrow(/steps\[0\]\.kind.*drawing needs wire/));
  it('a roll of wire', () => expect(run({ diameter: 2 }, [{ kind: 'roll', reductionPct: 10 }])).toThrow(InputError));
  it('both thickness and reductionPct', () => expect(run({ thickness: 2 }, [{ kind: 'roll', thickness: 1, reductionPct: 10 } as Step])).toThrow(/exactly one of thickness or reductionPct/));
  it('contradictory targets', () => expect(() => evaluateRoute({ material: copper, start: {}, steps: [], targets: { minYield: 400, maxYield: 300 } })).toThrow(/targets\.maxYield/));
});

describe('targets and the cold-work window', () => {
  it('margins are predicted − limit for minimums and limit − predicted for maximums', () => {
    const l = evaluateRoute({ material: copper, start: { thickness: 2 }, steps: [{ kind: 'roll', thickness: 1.2 }], targets: { minYield: 300, maxYield: 500 } });
    const y = l.rows[0]!.reloadYield;
    expect(l.targets).toEqual([
      { name: 'minYield', limit: 300, predicted: y, margin: y - 300, met: true },
      { name: 'maxYield', limit: 500, predicted: y, margin: 500 - y, met: true },
    ]);
    expect(l.allTargetsMet).toBe(true);
  });
  it('the window edges reproduce the limits exactly when the route is run at them', () => {
    const targets = { minYield: 300, maxYield: 420, minRemainingElongationPct: 2 };
    const l = evaluateRoute({ material: copper, start: { thickness: 2 }, steps: [{ kind: 'roll', reductionPct: 10 }], targets });
    const w = l.coldWorkWindow;
    expect(w.empty).toBe(false);
    expect(w.reductionBasis).toBe('thickness');
    const atPct = (pct: number) => evaluateRoute({ material: copper, start: { thickness: 2 }, steps: [{ kind: 'roll', reductionPct: pct }], targets }).rows[0]!;
    expectRelClose(atPct(w.reductionPctFrom!).reloadYield, 300, 1e-9, 'lower edge');
    expect(w.limitedBy.from).toBe('minYield');
    expect(w.limitedBy.to).toBe('minRemainingElongationPct');
    expectRelClose(atPct(w.reductionPctTo!).remainingUniformElongationPct, 2, 1e-9, 'upper edge');
  });
  it('the window is empty, with the reason, when the targets cannot hold together', () => {
    const l = evaluateRoute({ material: copper, start: {}, steps: [{ kind: 'strain', strain: 0.1 }], targets: { minYield: 450, minRemainingElongationPct: 20 } });
    expect(l.coldWorkWindow.empty).toBe(true);
    expect(l.coldWorkWindow.note).toMatch(/the minimum reload yield \(Rp0\.2\) target needs at least .* but the minimum remaining uniform elongation target allows at most/);
  });
  it('a minYield above a Voce saturation stress gives an empty window, not an error', () => {
    const m: Material = { ...copper, law: voce({ sigma0: 200, Q: 100, b: 5 }) };
    const l = evaluateRoute({ material: m, start: {}, steps: [{ kind: 'strain', strain: 0.1 }], targets: { minYield: 400 } });
    expect(l.coldWorkWindow.empty).toBe(true);
    expect(l.allTargetsMet).toBe(false);
  });
});
