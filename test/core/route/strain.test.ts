import { describe, expect, it } from 'vitest';
import { biaxialStrain, coldWorkPct, drawingStrain, PLANE_STRAIN_FACTOR, reductionPctFromStrain, rollingStrain, shearStrain, trueFromEngineering, upsetStrain } from '../../../src/core/index.js';
import { expectAbsClose, expectRelClose } from '../../helpers.js';

describe('equivalent strains of the forming modes', () => {
  it('PLANE_STRAIN_FACTOR is 2/√3 (Marciniak, Duncan & Hu, Mechanics of Sheet Metal Forming, §3.4: ε̄ = (2/√3)·ε1)', () => {
    expectRelClose(PLANE_STRAIN_FACTOR, 1.1547005383792515, 1e-15);
  });
  it('rollingStrain(2, 1) = (2/√3)·ln 2', () => {
    expectRelClose(rollingStrain(2, 1), (2 / Math.sqrt(3)) * Math.LN2, 1e-15);
  });
  it('drawingStrain(d0, d) = ln(A0/A)', () => {
    expectRelClose(drawingStrain(15.2, 12.2), Math.log((15.2 * 15.2) / (12.2 * 12.2)), 1e-14);
  });
  it('biaxialStrain doubles ε1 (ε3 = −2ε1 by constant volume); shearStrain is γ/√3; upsetStrain is ln(h0/h)', () => {
    expect(biaxialStrain(0.1)).toBe(0.2);
    expectRelClose(shearStrain(Math.sqrt(3)), 1, 1e-15);
    expectRelClose(upsetStrain(20, 10), Math.LN2, 1e-15);
  });
  it('trueFromEngineering(e) = ln(1+e) (Dowling §4.5)', () => {
    expectRelClose(trueFromEngineering(0.1), Math.log(1.1), 1e-15);
  });
});

describe('percent cold work', () => {
  it('a round bar drawn 15.2 → 12.2 mm has %CW 35.6 (Callister, %CW = (A0 − Ad)/A0 × 100; CHECKS.md, printed to 0.1)', () => {
    const a = (d: number) => (Math.PI * d * d) / 4;
    expectAbsClose(coldWorkPct(a(15.2), a(12.2)), 35.6, 0.05);
  });
  it('reductionPctFromStrain inverts the rolling and drawing strains', () => {
    expectRelClose(reductionPctFromStrain('thickness', rollingStrain(2, 1.5)), 25, 1e-12);
    expectRelClose(reductionPctFromStrain('area', drawingStrain(15.2, 12.2)), (1 - (12.2 / 15.2) ** 2) * 100, 1e-12);
  });
});
