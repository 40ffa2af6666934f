import type { TensileAnalysis } from '../core/tensile/types.js';

/** Lag-1 correlation of the noise from which it is said: white noise reads 0–0.1 (core's noiseLag1). */
export const NOISE_LAG1_SAID = 0.2;

/**
 * What the record's noise is, in words, for the analyze table and the record bench: the sd estimated from the record,
 * the rounding floor of a stress column in coarse steps (step/√12, the sd of a uniform rounding error — common
 * practice), and the noise's correlation from sample to sample where it is large enough to say (it widens Rp's range).
 * @example noiseStatement({ noise: 3.94, noiseLag1: 0.79, stressSteps: null }) // "3.9 MPa (estimated from the record; …lag-1 0.79…)"
 */
export function noiseStatement(a: Pick<TensileAnalysis, 'noise' | 'noiseLag1' | 'stressSteps'>): string {
  const parts = ['estimated from the record'];
  if (a.stressSteps) parts.push(`at least the rounding of its stress steps of ${+a.stressSteps.step.toPrecision(3)} MPa, step/√12`);
  const rho = a.noiseLag1 ?? 0;
  if (rho >= NOISE_LAG1_SAID) parts.push(`correlated from sample to sample, lag-1 ${rho.toFixed(2)}: E's interval and Rp's range are widened for it`);
  return `${a.noise.toPrecision(2)} MPa (${parts.join('; ')})`;
}
