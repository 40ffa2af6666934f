import { makeLaw, xoshiro128ss, type LabRecordSpec, type LawSpec } from '../../../src/core/index.js';

// Moduli of handbook magnitude (Callister, Table B.2: steels 207 GPa, Al 69–72 GPa, Cu 115 GPa).
const MODULI = [69000, 115000, 193000, 207000];

export interface Case { seed: number; spec: Omit<LabRecordSpec, 'rng'>; what: string }

/** Case `seed`: law, modulus, points, noise, toe and yield drop drawn from a seeded stream of their own. */
export function labCase(seed: number): Case {
  const r = xoshiro128ss(seed, 7);
  const u = (a: number, b: number) => a + (b - a) * r.nextFloat();
  const E = MODULI[seed % MODULI.length]!;
  const sy = u(120, 600) * (E / 200000) ** 0.5;
  let law: LawSpec;
  switch (Math.floor(seed / MODULI.length) % 4) {
    case 0: law = { law: 'swift', K: sy / 0.01 ** 0.2 * u(0.9, 1.1), eps0: u(0.003, 0.02), n: u(0.12, 0.35) }; break;
    case 1: law = { law: 'voce', sigma0: sy, Q: sy * u(0.4, 1.2), b: u(8, 25) }; break;
    case 2: law = { law: 'ludwik', sigma0: sy, K: sy * u(1, 3), n: u(0.3, 0.6) }; break;
    default: law = { law: 'hockettSherby', sigma0: sy, sigmaSat: sy * u(1.5, 2.5), a: u(3, 10), p: u(0.6, 0.9) };
  }
  const L = makeLaw(law);
  const eu = L.uniformStrain();
  const Rm = L.stress(eu) / Math.exp(eu + L.stress(eu) / E);
  // Points log-uniform over 1,000–100,000 (the issue's range), uniform in time.
  const points = Math.round(10 ** u(3, 5));
  const noise = Rm * u(0.001, 0.01);
  const toe = seed % 3 === 1 ? (u(0.05, 0.25) * sy) / E : 0;
  // Yield drops of 3–10 % with a Lüders plateau of 0.5–3 % strain; on half of them serrations of 0.5–3 % of ReL
  // (the other half up to 0.5 %), with periods from a fifth of the sample spacing to 50 spacings, triangle or
  // sawtooth, and on a third an undershoot of the first trough (the initial transient) of up to 2 %.
  let drop: NonNullable<LabRecordSpec['yieldDrop']> | undefined;
  if (seed % 3 === 2 && eu > 0.08) {
    const eUeng = Math.expm1(eu + L.stress(eu) / E);
    const spacing = (eUeng + 0.4 * eu) / points;
    const big = r.nextFloat() < 0.5;
    drop = {
      drop: u(0.03, 0.1),
      luedersStrain: u(0.005, Math.min(0.03, eu / 3)),
      serration: big ? u(0.005, 0.03) : u(0, 0.005),
      serrationPeriod: spacing * 10 ** u(-0.7, 1.7),
      serrationShape: r.nextFloat() < 0.5 ? 'sawtooth' : 'triangle',
      undershoot: r.nextFloat() < 1 / 3 ? u(0, 0.02) : 0,
    };
  }
  const d = drop;
  return {
    seed,
    spec: { law, elasticModulus: E, points, noise, toe, ...(d ? { yieldDrop: d } : {}) },
    what: `seed ${seed}: ${JSON.stringify(law)}, E ${E}, ${points} points, noise ${(noise / Rm * 100).toFixed(2)} % Rm, toe ${toe.toExponential(1)}${d ? `, drop ${(d.drop * 100).toFixed(1)} % Lüders ${(d.luedersStrain * 100).toFixed(2)} % serration ${(d.serration! * 100).toFixed(2)} % ${d.serrationShape} period ${d.serrationPeriod!.toExponential(1)} undershoot ${(d.undershoot! * 100).toFixed(2)} %` : ''}`,
  };
}


/**
 * `stress` with AR(1) load noise added (eᵢ = ρ·eᵢ₋₁ + √(1 − ρ²)·sd·zᵢ, marginal sd `sd`, lag-1 correlation ρ; the
 * model as in Box & Jenkins, *Time Series Analysis*, ch. 3, from memory), from a seeded stream of its own.
 */
export function withArNoise(stress: Float64Array, sd: number, rho: number, seed: number): Float64Array {
  const r = xoshiro128ss(seed, 11);
  const g = () => Math.sqrt(-2 * Math.log(1 - r.nextFloat())) * Math.cos(2 * Math.PI * r.nextFloat());
  const out = new Float64Array(stress.length);
  const innov = sd * Math.sqrt(1 - rho * rho);
  let e = sd * g();
  for (let i = 0; i < stress.length; i++) { out[i] = stress[i]! + e; e = rho * e + innov * g(); }
  return out;
}
