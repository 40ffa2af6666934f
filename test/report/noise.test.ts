import { describe, expect, it } from 'vitest';
import { noiseStatement } from '../../src/report/noise.js';

// The noise line of the analyze table and the record bench (src/report/noise.ts): what it says and from when.
describe('noiseStatement', () => {
  it('gives the sd to two figures, and the correlation only from lag-1 0.2 (white noise reads 0–0.1)', () => {
    expect(noiseStatement({ noise: 1.234, noiseLag1: 0.19, stressSteps: null })).toBe('1.2 MPa (estimated from the record)');
    expect(noiseStatement({ noise: 3.94, noiseLag1: 0.79, stressSteps: null })).toBe("3.9 MPa (estimated from the record; correlated from sample to sample, lag-1 0.79: E's interval and Rp's range are widened for it)");
    // An analysis made before the correlation was reported has none.
    expect(noiseStatement({ noise: 0.5, stressSteps: null })).toBe('0.50 MPa (estimated from the record)');
  });
  it('says the rounding floor of a stress column in coarse steps', () => {
    const steps = { step: 5, samplesPerReading: 4, coarse: true } as unknown as NonNullable<Parameters<typeof noiseStatement>[0]['stressSteps']>;
    expect(noiseStatement({ noise: 1.44, noiseLag1: 0, stressSteps: steps })).toBe('1.4 MPa (estimated from the record; at least the rounding of its stress steps of 5 MPa, step/√12)');
  });
});
