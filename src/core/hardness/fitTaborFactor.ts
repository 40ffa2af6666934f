import { checkRange, ComputationError, InputError } from '../errors.js';
import { studentTQuantile } from '../fit/studentT.js';
import type { FlowLaw } from '../flow/types.js';
import { HARDNESS_DEFAULTS, HARDNESS_RANGES, STANDARD_GRAVITY } from './defaults.js';
import type { HardnessReading } from './types.js';

/** Result of {@link fitTaborFactor}. */
export interface TaborFit {
  /** Fitted c (Vickers number in MPa over σ(ε̄ + εr)), dimensionless. */
  taborFactor: number;
  /** Standard error of c. */
  standardError: number;
  /** Two-sided 95 % interval of c, Student t with n − 1 degrees of freedom. */
  interval: readonly [number, number];
  /** Root-mean-square residual of the readings, HV. */
  rmsResidualHV: number;
  /** Number of readings. */
  n: number;
  representativeStrain: number;
}

/**
 * Fits the Tabor factor c to hardness readings of states of known strain: least squares of the
 * reading in MPa, yᵢ = g₀·HVᵢ, on xᵢ = σ(ε̄ᵢ + εr) through the origin,
 *
 *   c = Σxᵢyᵢ / Σxᵢ²,  s² = Σ(yᵢ − c·xᵢ)²/(n − 1),  SE(c) = s/√Σxᵢ²,  c ± t(0.975, n − 1)·SE(c).
 *
 * Source: regression through the origin, N. R. Draper and H. Smith, *Applied Regression Analysis*,
 * 3rd ed., the straight line through the origin (chapter not looked up, from memory); Student t quantile from
 * {@link studentTQuantile}. Units: strain true plastic, HV in kgf/mm²; c dimensionless.
 * Valid: at least 2 readings (the interval needs n − 1 ≥ 1), c inside [1, 5].
 * @throws InputError naming `PATH[i].strain` / `PATH[i].hv` for a reading out of range, `PATH` for
 * fewer than 2 readings, and `PATH` when the fitted c is outside [1, 5] (readings or law inconsistent).
 * @example fitTaborFactor(hollomon({ K: 530, n: 0.44 }), [{ strain: 0, hv: 50 }, { strain: 0.3, hv: 95 }]).taborFactor
 */
export function fitTaborFactor(
  law: FlowLaw,
  readings: readonly HardnessReading[],
  representativeStrain: number = HARDNESS_DEFAULTS.representativeStrain,
  path = 'material.hardness.readings',
): TaborFit {
  const n = readings.length;
  if (n < 2) throw new InputError(path, n, 'at least 2 readings to fit the Tabor factor with an interval', 'too few hardness readings');
  checkRange(path.replace(/\.readings$/, '') + '.representativeStrain', representativeStrain, HARDNESS_RANGES.representativeStrain[0], HARDNESS_RANGES.representativeStrain[1]);
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < n; i++) {
    const r = readings[i]!;
    checkRange(`${path}[${i}].strain`, r.strain, 0, 5);
    checkRange(`${path}[${i}].hv`, r.hv, 1, 3000);
    x[i] = law.stress(r.strain + representativeStrain);
    y[i] = r.hv * STANDARD_GRAVITY;
    sxx += x[i]! * x[i]!;
    sxy += x[i]! * y[i]!;
  }
  if (!(sxx > 0)) throw new ComputationError(path, 'the flow stress is zero at every reading; no Tabor factor can be fitted');
  const c = sxy / sxx;
  let ssr = 0;
  for (let i = 0; i < n; i++) {
    const d = y[i]! - c * x[i]!;
    ssr += d * d;
  }
  const se = Math.sqrt(ssr / (n - 1) / sxx);
  const t = studentTQuantile(0.975, n - 1);
  const [lo, hi] = HARDNESS_RANGES.taborFactor;
  if (!(c >= lo && c <= hi)) {
    throw new InputError(path, +c.toPrecision(4), `readings giving a Tabor factor in [${lo}, ${hi}]`, 'the readings do not match the flow curve (check the strains, the units HV, and the law)');
  }
  const out: TaborFit = {
    taborFactor: c,
    standardError: se,
    interval: [c - t * se, c + t * se],
    rmsResidualHV: Math.sqrt(ssr / n) / STANDARD_GRAVITY,
    n,
    representativeStrain,
  };
  if (!Number.isFinite(out.standardError + out.interval[0] + out.interval[1])) throw new ComputationError(path, 'the Tabor factor fit is not finite');
  return out;
}
