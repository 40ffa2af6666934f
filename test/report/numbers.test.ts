import { describe, expect, it } from 'vitest';
import { fitAllLaws, hollomon, LAW_PARAMETERS, type LawName } from '../../src/core/index.js';
import { tightest } from '../../src/cli/summary.js';
import type { Outcome } from '../../src/cli/batch.js';
import {
  flowCurveText, formatLaw, formatLawParam, formatNumber, formatTargetValue, targetUnit, targetUnitKind,
} from '../../src/report/numbers.js';

const info = (law: LawName, name: string) => LAW_PARAMETERS[law].find((p) => p.name === name)!;

describe('formatLawParam(info, value): law parameters as an engineer writes them', () => {
  it('a value a hair above its lower bound reads "0 (at bound)", not 1.821e-18', () => {
    expect(formatLawParam(info('swift', 'eps0'), 1.821e-18)).toBe('0 (at bound)');
    expect(formatLawParam(info('ludwik', 'sigma0'), 3e-9)).toBe('0 (at bound)');
    expect(formatLawParam(info('swiftVoce', 'alpha'), 1 - 1e-12)).toBe('1 (at bound)');
  });
  it('an ordinary value has 4 significant figures and no exponent; an exact 0 is "0"', () => {
    expect(formatLawParam(info('hollomon', 'K'), 530)).toBe('530');
    expect(formatLawParam(info('hollomon', 'n'), 0.443219)).toBe('0.4432');
    expect(formatLawParam(info('voce', 'b'), 12345.6)).toBe('12350');
    expect(formatLawParam(info('swift', 'eps0'), 0.00123456)).toBe('0.001235');
    expect(formatLawParam(info('swift', 'eps0'), 0)).toBe('0');
    // A genuinely small value (not within 1e-9 of the bound) keeps its digits.
    expect(formatLawParam(info('swift', 'eps0'), 2e-6)).toBe('2.000e-6');
  });
  it('a Swift law fitted to a Hollomon curve (eps0 collapses onto 0) reads without exponent noise', () => {
    // Hollomon K 530 MPa, n 0.44 (Callister, 2nd ed., p. 199) sampled over its uniform range; Swift
    // σ = K(ε0 + ε)ⁿ contains it with ε0 = 0, so a bounded fit drives ε0 to its bound.
    const law = hollomon({ K: 530, n: 0.44 });
    const eps = Array.from({ length: 60 }, (_, i) => 0.002 + (0.438 * i) / 59);
    const fit = fitAllLaws(eps, eps.map((e) => law.stress(e)), { laws: ['swift'] }).fits[0]!;
    const text = formatLaw('swift', fit.params, 'MPa');
    expect(text).toMatch(/^Swift: K 530 MPa, ε0 0( \(at bound\))?, n 0\.44$/);
    expect(text).not.toMatch(/e-\d/);
  });
  it('formatLaw writes stresses with their unit; flowCurveText reads a report\'s flowCurve object', () => {
    expect(formatLaw('voce', { sigma0: 120, Q: 160, b: 12 }, 'ksi')).toBe('Voce: σ0 120 ksi, Q 160 ksi, b 12');
    expect(flowCurveText({ law: 'hollomon', K: 87.02, n: 0.21 }, 'ksi')).toBe('Hollomon: K 87.02 ksi, n 0.21');
  });
});

describe('targets speak their own unit', () => {
  it('targetUnit: stress targets in the stress unit, elongation in %, springback in degrees', () => {
    expect(targetUnit('minYield', 'MPa')).toBe('MPa');
    expect(targetUnit('maxYield', 'ksi')).toBe('ksi');
    expect(targetUnit('minTensile', 'MPa')).toBe('MPa');
    expect(targetUnit('minRemainingElongationPct', 'MPa')).toBe('%');
    expect(targetUnit('maxSpringbackDeg', 'MPa')).toBe('°');
  });
  it('an unknown target name throws instead of guessing the stress unit', () => {
    expect(() => targetUnitKind('minSurfaceGloss')).toThrow(/no unit known for target "minSurfaceGloss"/);
    // Hardness targets are in HV (issue 15); a temper target in its temper system's basis.
    expect(targetUnit('minHardnessHV', 'ksi')).toBe('HV');
    expect(targetUnit('temper', 'MPa', 'tensileStrength')).toBe('MPa');
    expect(targetUnit('temper', 'MPa', 'hardnessHV')).toBe('HV');
    expect(targetUnit('temper', 'MPa', 'thicknessReductionPct')).toBe('% thickness reduction');
  });
  it('formatTargetValue: precision of the kind, unit attached', () => {
    expect(formatTargetValue(4.0712, 'maxSpringbackDeg', 'MPa')).toBe('4.07°');
    expect(formatTargetValue(26.694, 'maxYield', 'MPa')).toBe('26.7 MPa');
    expect(formatTargetValue(2.894, 'minTensile', 'ksi')).toBe('2.89 ksi');
    expect(formatTargetValue(-2.88, 'minRemainingElongationPct', 'MPa')).toBe('-2.9 %');
    expect(formatNumber(-0.04, 'stress', 'MPa')).toBe('0.0');
  });
  it('the batch summary\'s tightest margin compares relative margins and prints the winner in its own unit', () => {
    // 4.07° of 6° is 68 % spare; 26.7 MPa of 470 MPa is 5.7 %: the yield target is the tighter one,
    // although 4.07 < 26.7 in raw numbers (the old summary printed "4.07 MPa (maxSpringbackDeg)").
    const o = { report: { units: { stress: 'MPa' }, targets: [
      { name: 'maxSpringbackDeg', limit: 6, predicted: 1.93, margin: 4.07, met: true },
      { name: 'maxYield', limit: 470, predicted: 443.3, margin: 26.7, met: true },
    ] } } as unknown as Outcome;
    expect(tightest(o)).toBe('26.7 MPa, maximum reload yield (Rp0.2)');
    const only = { report: { units: { stress: 'MPa' }, targets: [{ name: 'maxSpringbackDeg', limit: 6, predicted: 1.93, margin: 4.07, met: true }] } } as unknown as Outcome;
    expect(tightest(only)).toBe('4.07°, maximum springback');
  });
});
