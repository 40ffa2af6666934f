/**
 * Hold-out C: a third seeded generator of INVENTED tensile records with known truth, written apart from the record
 * analysis (its author read neither the analysis under src/core/tensile/, beyond the type declarations, nor the two
 * other generators). Every record, parameter and material class here is INVENTED; nothing is measured data.
 *
 * What it does differently from the other generators (as far as the brief that asked for it says):
 * - The hardening laws are parameterised from engineering targets a user would know (a yield stress, Rm/Rp0.2 and Ag),
 *   solved through Considère's criterion, then checked on the engineering curve and redrawn when off.
 * - The elastic range is sampled under constant STRESS rate (samples evenly spaced in stress), switching to constant
 *   strain rate once the stress passes 0.8–1.0 of the yield stress; the strain step after the switch is 0.7–1.5 times
 *   the elastic strain step. The switch is at yield, so it is not a change of rate on the plastic part: rateRatio = 1.
 * - The elastic part follows the same large-strain conversion as the plastic part (true stress σ = E·ln(1 + e)), so the
 *   engineering elastic line bends very slightly (slope E at the origin).
 * - A seating toe is a parabola tangent to the elastic curve at its end; the truth's strains are toe-compensated.
 * - Yield drops fall over 1–3 samples into a first trough (an initial transient) and a Lüders plateau with sinusoidal or
 *   random-walk serrations; necking is a smooth fall with zero slope at maximum force; fracture falls in 1–2 samples.
 *
 * Laws (true stress σ, MPa, against true plastic strain εp), by their published names; the references are from memory:
 * - Swift σ = K(ε0 + εp)^n (H. W. Swift, J. Mech. Phys. Solids 1 (1952) 1–18);
 * - Voce σ = σs − (σs − σ0)·exp(−εp/εc) (E. Voce, J. Inst. Metals 74 (1948) 537–562);
 * - Hollomon with an offset, Ludwik form σ = σ0 + K·εp^n (J. H. Hollomon, Trans. AIME 162 (1945) 268–290; P. Ludwik,
 *   Elemente der technologischen Mechanik, 1909);
 * - Hockett–Sherby σ = σs − (σs − σ0)·exp(−a·εp^p) (J. E. Hockett & O. D. Sherby, J. Mech. Phys. Solids 23 (1975) 87–98).
 * Maximum force where dσ/dε = σ (A. Considère, 1885; used only to aim the parameters, the truth is searched on the
 * curve). Engineering curve: e = exp(εp + σ/E) − 1, s = σ/(1 + e) (volume constancy, common practice).
 * Gaussian noise by the Box–Muller transform (G. E. P. Box & M. E. Muller, Ann. Math. Statist. 29 (1958) 610–611).
 *
 * Truth, on the noise-free curve, by the definitions of ISO 6892-1 (from memory):
 * - E: the slope of the engineering elastic line at the origin (the modulus drawn per material class ±3 %);
 * - Rp0.2: the first crossing of s = E·(e − 0.002), solved to below 1e-9 strain on the continuous curve (a serrated
 *   plateau's first crossing);
 * - Rm: the highest engineering stress once work hardening has begun (after the plateau where there is a drop; ReH
 *   excluded), by golden-section search on the continuous curve;
 * - Ag = (e at Rm − Rm/E)·100; A = (e_f − s_f/E)·100 at the last sample before the fracture fall begins;
 * - ReH: the highest recorded noise-free sample at the drop; ReL: the lowest recorded noise-free sample on the plateau
 *   after the initial transient (the fall from ReH and the first trough ignored, unless that trough is the only one);
 *   Ae: strain from the ReH sample to the start of work hardening, %; all null without a drop, and null (with
 *   "peak not caught, no drop recorded" in `what`) when the recorded samples show no drop at all;
 * - serration: the largest peak-to-trough of the plateau (first trough included), fraction of ReL; 0 when continuous;
 * - elasticPoints: samples on the rise past the toe below 0.9 of Rp0.2 (of ReH with a drop);
 * - dropEvidence: √Σ(sᵢ − ReL)² over the recorded noise-free samples of the rise and fall above ReL, over the load
 *   noise sd (null without noise or drop).
 */
import { xoshiro128ss } from '../../../src/core/index.js';
import type { HoldoutRecordLike, HoldoutTruthLike } from './holdout-tally.js';

interface Draw {
  u(a: number, b: number): number;
  int(a: number, b: number): number;
  chance(p: number): boolean;
  normal(): number;
}

function draws(seed: number, stream: number): Draw {
  const r = xoshiro128ss(seed, stream);
  let spare = 0, hasSpare = false;
  return {
    u: (a, b) => a + (b - a) * r.nextFloat(),
    int: (a, b) => Math.min(b, a + Math.floor((b - a + 1) * r.nextFloat())),
    chance: (p) => r.nextFloat() < p,
    normal: () => {
      if (hasSpare) { hasSpare = false; return spare; }
      const u1 = 1 - r.nextFloat(), u2 = r.nextFloat();
      const m = Math.sqrt(-2 * Math.log(u1));
      spare = m * Math.sin(2 * Math.PI * u2); hasSpare = true;
      return m * Math.cos(2 * Math.PI * u2);
    },
  };
}

/** A hardening law: true stress and its slope against true plastic strain. */
interface FlowLaw { name: string; params: string; sigma(ep: number): number; slope(ep: number): number }

/** Root of a function that changes sign on [lo, hi] (f(lo) ≤ 0 ≤ f(hi) or the reverse), by bisection. */
function bisect(f: (x: number) => number, lo: number, hi: number, tol = 1e-15): number {
  let flo = f(lo);
  for (let k = 0; k < 400 && hi - lo > tol; k++) {
    const m = 0.5 * (lo + hi), fm = f(m);
    if ((fm <= 0) === (flo <= 0)) { lo = m; flo = fm; } else hi = m;
  }
  return 0.5 * (lo + hi);
}

const P0 = 0.002; // plastic strain at which the yield target is set

/** Swift from targets: σ(0.002) = Y, σ(εu)/σ(0.002) = H, Considère at εu (ε0 + εu = n). */
function swiftFrom(Y: number, H: number, epsU: number): FlowLaw | null {
  const F = (n: number) => n * Math.log(n / (n - epsU + P0)) - Math.log(H); // decreasing in n
  const lo = epsU + 1e-4, hi = 0.8;
  if (!(F(lo) >= 0 && F(hi) <= 0)) return null;
  const n = bisect(F, lo, hi, 1e-13);
  const eps0 = n - epsU;
  if (eps0 < 1e-4 || eps0 > 0.08) return null;
  const K = Y / Math.pow(eps0 + P0, n);
  return {
    name: 'Swift', params: `K ${K.toFixed(1)} MPa, ε0 ${eps0.toFixed(4)}, n ${n.toFixed(3)}`,
    sigma: (ep) => K * Math.pow(eps0 + ep, n), slope: (ep) => n * K * Math.pow(eps0 + ep, n - 1),
  };
}

/** Voce from targets (σs = σu(1 + εc), Q = σu·εc·exp(εu/εc)). */
function voceFrom(Y: number, H: number, epsU: number): FlowLaw | null {
  const target = 1 - 1 / H;
  const phi = (lc: number) => { const c = Math.exp(lc); return c * Math.expm1((epsU - P0) / c) - target; }; // decreasing
  const lo = Math.log(0.003), hi = Math.log(2);
  if (!(phi(lo) >= 0 && phi(hi) <= 0)) return null;
  const c = Math.exp(bisect(phi, lo, hi, 1e-13));
  const su = H * Y;
  const Q = su * c * Math.exp(epsU / c);
  const ss = su * (1 + c), s0 = ss - Q;
  if (!(s0 >= 0.4 * Y) || !Number.isFinite(Q)) return null;
  return {
    name: 'Voce', params: `σ0 ${s0.toFixed(1)} MPa, σs ${ss.toFixed(1)} MPa, εc ${c.toFixed(4)}`,
    sigma: (ep) => ss - Q * Math.exp(-ep / c), slope: (ep) => (Q / c) * Math.exp(-ep / c),
  };
}

/** Hollomon with an offset (Ludwik form) from targets. */
function ludwikFrom(Y: number, H: number, epsU: number): FlowLaw | null {
  const target = 1 - 1 / H;
  const psi = (n: number) => (epsU / n) * (1 - Math.pow(P0 / epsU, n)) - target; // decreasing in n
  const lo = 0.05, hi = 0.98;
  if (!(psi(lo) >= 0 && psi(hi) <= 0)) return null;
  const n = bisect(psi, lo, hi, 1e-13);
  const K = (H * Y * Math.pow(epsU, 1 - n)) / n;
  const s0 = Y - K * Math.pow(P0, n);
  if (!(s0 >= 0.4 * Y)) return null;
  return {
    name: 'Hollomon with offset', params: `σ0 ${s0.toFixed(1)} MPa, K ${K.toFixed(1)} MPa, n ${n.toFixed(3)}`,
    sigma: (ep) => s0 + K * Math.pow(ep, n), slope: (ep) => (ep > 0 ? n * K * Math.pow(ep, n - 1) : Infinity),
  };
}

/** Hockett–Sherby from targets, exponent p given. */
function hockettSherbyFrom(Y: number, H: number, epsU: number, p: number): FlowLaw | null {
  const target = 1 - 1 / H;
  const d = Math.pow(epsU, p) - Math.pow(P0, p), g = p * Math.pow(epsU, p - 1);
  const chi = (la: number) => { const a = Math.exp(la); return Math.expm1(a * d) / (a * g) - target; }; // increasing
  const lo = Math.log(1e-3), hi = Math.log(1e4);
  if (!(chi(lo) <= 0 && chi(hi) >= 0)) return null;
  const a = Math.exp(bisect(chi, lo, hi, 1e-13));
  const su = H * Y;
  const Q = su / (a * g * Math.exp(-a * Math.pow(epsU, p)));
  const ss = su + Q * Math.exp(-a * Math.pow(epsU, p)), s0 = ss - Q;
  if (!(s0 >= 0.4 * Y) || !Number.isFinite(Q)) return null;
  return {
    name: 'Hockett–Sherby', params: `σ0 ${s0.toFixed(1)} MPa, σs ${ss.toFixed(1)} MPa, a ${a.toFixed(3)}, p ${p.toFixed(3)}`,
    sigma: (ep) => ss - Q * Math.exp(-a * Math.pow(ep, p)),
    slope: (ep) => (ep > 0 ? Q * a * p * Math.pow(ep, p - 1) * Math.exp(-a * Math.pow(ep, p)) : p < 1 ? Infinity : Q * a),
  };
}

/** Engineering strain and stress of the law at true plastic strain εp. */
function engAt(law: FlowLaw, E: number, ep: number): [number, number] {
  const sg = law.sigma(ep);
  const e = Math.expm1(ep + sg / E);
  return [e, sg / (1 + e)];
}

/** Maximum engineering stress of the law on εp ∈ [from, 1] (scan, then golden section); null when it lies at εp = 1. */
function engMax(law: FlowLaw, E: number, from: number): { ep: number; e: number; s: number } | null {
  const n = 4000, a = Math.max(from, 1e-7);
  const at = (k: number) => a * Math.pow(1 / a, k / n);
  let best = -Infinity, kb = 0;
  for (let k = 0; k <= n; k++) { const s = engAt(law, E, at(k))[1]; if (s > best) { best = s; kb = k; } }
  if (kb >= n - 1) return null;
  let lo = at(Math.max(0, kb - 1)), hi = at(kb + 1);
  const gr = (Math.sqrt(5) - 1) / 2;
  let x1 = hi - gr * (hi - lo), x2 = lo + gr * (hi - lo);
  let f1 = engAt(law, E, x1)[1], f2 = engAt(law, E, x2)[1];
  for (let k = 0; k < 200 && hi - lo > 1e-14; k++) {
    if (f1 < f2) { lo = x1; x1 = x2; f1 = f2; x2 = lo + gr * (hi - lo); f2 = engAt(law, E, x2)[1]; }
    else { hi = x2; x2 = x1; f2 = f1; x1 = hi - gr * (hi - lo); f1 = engAt(law, E, x1)[1]; }
  }
  const ep = 0.5 * (lo + hi);
  const [e, s] = engAt(law, E, ep);
  return { ep, e, s };
}

/** True plastic strain at engineering strain e on the law (e increases with εp), Newton safeguarded by bisection. */
function epAtE(law: FlowLaw, E: number, e: number, lo: number, hi: number, guess: number): number {
  let x = Math.min(hi, Math.max(lo, guess));
  for (let k = 0; k < 200; k++) {
    const ex = Math.exp(x + law.sigma(x) / E);
    const f = ex - 1 - e;
    if (f === 0) return x;
    if (f > 0) hi = x; else lo = x;
    if (hi - lo < 1e-15) break;
    const d = ex * (1 + law.slope(x) / E);
    let nx = x - f / d;
    if (!(Number.isFinite(nx) && nx > lo && nx < hi)) nx = 0.5 * (lo + hi);
    if (Math.abs(nx - x) < 1e-16) { x = nx; break; }
    x = nx;
  }
  return x;
}

/** The engineering elastic curve: true stress E·ln(1 + e), engineering stress over (1 + e); slope E at the origin. */
const sEl = (E: number, e: number) => (E * Math.log1p(e)) / (1 + e);
const sElSlope = (E: number, e: number) => (E * (1 - Math.log1p(e))) / ((1 + e) * (1 + e));
const eEl = (E: number, s: number) => bisect((e) => sEl(E, e) - s, 0, 0.1, 1e-16);

const CLASSES = [
  { name: 'magnesium-like', E: 45000, y: [150, 300], ag: [0.03, 0.2], drop: 0.2 },
  { name: 'aluminium-like', E: 70000, y: [150, 500], ag: [0.03, 0.25], drop: 0.2 },
  { name: 'copper/titanium-like', E: 115000, y: [150, 900], ag: [0.03, 0.4], drop: 0.2 },
  { name: 'steel-like', E: 205000, y: [200, 900], ag: [0.03, 0.4], drop: 0.7 },
] as const;

interface Drop {
  reHTop: number; eH: number; eL: number; epL: number; sL: number; d: number;
  dropSpan: number; recSpan: number; trough: number; eP0: number; w: (e: number) => number; kind: string; amp: number; samplesK: number;
}

/**
 * A hold-out C record for `seed`: noise scaled by `noiseScale` (0: the same record noise-free, same sampling).
 * INVENTED data. Strain as a fraction, stress in MPa.
 */
export function holdoutCRecord(seed: number, noiseScale = 1): HoldoutRecordLike {
  const R = draws(seed, 0);
  const mat = CLASSES[R.int(0, 3)]!;
  const E = mat.E * R.u(0.97, 1.03);
  const lawKind = R.int(0, 3);
  const hasDrop = R.chance(mat.drop);

  // Parameters from engineering targets, redrawn until the engineering curve looks like the targets.
  let law: FlowLaw | null = null;
  let top: { ep: number; e: number; s: number } | null = null;
  let rpCont = 0, epY0 = 0;
  let dropPlan: { Ae: number; d: number; eH: number; eL: number; epL: number; sL: number; reH: number } | null = null;
  let targets = '';
  for (let attempt = 0; attempt < 500; attempt++) {
    const Y = R.u(mat.y[0], mat.y[1]);
    const Ag = R.u(mat.ag[0], mat.ag[1]);
    const ratio = R.u(Math.max(1.05, 1 + 1.2 * Ag), Math.min(1.9, 1.1 + 4 * Ag));
    const H = ratio * (1 + Ag), epsU = Math.log1p(Ag);
    const p = R.u(0.45, 1.0);
    const l = lawKind === 0 ? swiftFrom(Y, H, epsU) : lawKind === 1 ? voceFrom(Y, H, epsU)
      : lawKind === 2 ? ludwikFrom(Y, H, epsU) : hockettSherbyFrom(Y, H, epsU, p);
    const Ae = R.u(0.005, 0.03), d = R.u(0.03, 0.1);
    if (!l) continue;
    const t = engMax(l, E, 0);
    if (!t) continue;
    // Rp0.2 on the continuous law (the elastic part lies above the offset line).
    const h = (ep: number) => { const [e, s] = engAt(l, E, ep); return s - E * (e - P0); };
    if (!(h(0) > 0 && h(t.ep) < 0)) continue;
    const epR = bisect(h, 0, t.ep, 1e-16);
    const rp = engAt(l, E, epR)[1];
    const agReal = t.e - t.s / E;
    if (!(t.s / rp >= 1.03 && t.s / rp <= 1.95 && agReal >= 0.025 && agReal <= 0.42)) continue;
    if (hasDrop) {
      const ae = Math.min(Ae, 0.5 * t.e);
      if (ae < 0.005) continue;
      let eH = rp / E, eL = 0, epL = 0, sL = 0, reH = 0;
      for (let k = 0; k < 12; k++) {
        eL = eH + ae;
        epL = epAtE(l, E, eL, 0, t.ep, 0.5 * eL);
        sL = engAt(l, E, epL)[1];
        reH = sL / (1 - d);
        eH = eEl(E, reH);
      }
      if (!(reH < 0.98 * t.s) || eL > 0.6 * t.e) continue;
      dropPlan = { Ae: ae, d, eH, eL, epL, sL, reH };
    }
    law = l; top = t; rpCont = rp;
    targets = `targets Y ${Y.toFixed(0)} MPa, Rm/Rp ${ratio.toFixed(2)}, Ag ${(100 * Ag).toFixed(1)} %`;
    break;
  }
  if (!law || !top) throw new Error(`holdout-c ${seed}: no parameter set found`);
  const lawF = law;
  const Rm = top.s, eU = top.e, epU = top.ep;
  epY0 = 0;
  const sY0 = engAt(lawF, E, epY0)[1];
  const eY0 = engAt(lawF, E, epY0)[0];

  // Necking and fracture.
  const agFrac = eU - Rm / E;
  const neckSpan = R.u(0.2, 1.0) * agFrac;
  const sF = R.u(0.55, 0.9) * Rm;
  const q = R.u(1.8, 3);
  const eF = eU + neckSpan;

  // Toe (about half the seeds): a parabola s = αx + βx² through the origin, meeting the elastic curve at e = L/2 with
  // its value and slope; the elastic line then meets zero stress at x0 = L/2.
  const yRef = dropPlan ? dropPlan.reH : rpCont;
  const hasToe = R.chance(0.5);
  const L = hasToe ? Math.min(R.u(0, 0.003), (0.5 * yRef) / E) : 0;
  const x0 = L / 2;
  const sToe = L > 0 ? sEl(E, x0) : 0, dToe = L > 0 ? sElSlope(E, x0) : E;
  const alpha = L > 0 ? (2 * sToe) / L - dToe : 0, beta = L > 0 ? (dToe * L - sToe) / (L * L) : 0;

  // Sampling uniform in time: constant stress rate, then constant strain rate past `frac` of the yield stress.
  const frac = R.u(0.8, 1.0);
  const sSw = frac * yRef;
  const riseE = (s: number): number => {
    if (dropPlan || s <= sY0) return eEl(E, s);
    const ep = bisect((x) => engAt(lawF, E, x)[1] - s, 0, epU, 1e-16);
    return engAt(lawF, E, ep)[0];
  };
  const eSw = riseE(sSw);
  const nMain = Math.round(Math.exp(R.u(Math.log(1000), Math.log(100000))));
  const kappa = R.u(0.7, 1.5);
  const dS = (sSw + ((eF - eSw) * E) / kappa) / nMain;
  const dX = (kappa * dS) / E;
  const phase = R.u(0, 1);

  // Yield drop: fall over 1–3 samples to a first trough, recovery to the plateau, serrations, law from eL on.
  let drop: Drop | null = null;
  if (dropPlan) {
    const { eH, eL, sL, reH, d, epL } = dropPlan;
    const samplesK = R.int(1, 3);
    const dropSpan = samplesK * dX * R.u(0.6, 1.0);
    const tau = 0.015 * R.u(0, 1) ** 2;
    const trough = sL * (1 - tau);
    const recSpan = Math.min(R.u(0.0002, 0.001), 0.25 * (eL - eH - dropSpan));
    const eP0 = eH + dropSpan + recSpan;
    const amp = 0.5 * 0.03 * R.u(0, 1) ** 2 * sL; // half of the peak-to-trough, which is up to 3 % of ReL
    const plen = eL - eP0;
    const tp = Math.min(0.2 * plen, 0.002);
    const taper = (e: number) => { const v = Math.min(1, (e - eP0) / tp, (eL - e) / tp); return v <= 0 ? 0 : Math.sin((Math.PI / 2) * v) ** 2; };
    let w: (e: number) => number, kind: string;
    if (R.chance(0.5)) {
      const lam = R.u(0.001, 0.006), ph = R.u(0, 2 * Math.PI);
      w = (e) => amp * Math.sin((2 * Math.PI * (e - eP0)) / lam + ph) * taper(e);
      kind = `sinusoidal serrations (wavelength ${(100 * lam).toFixed(2)} %)`;
    } else {
      const lamK = R.u(0.0004, 0.002);
      const nk = Math.ceil(plen / lamK) + 2;
      const v: number[] = [0];
      for (let k = 1; k < nk; k++) v.push(v[k - 1]! + R.normal());
      const mn = Math.min(...v), mx = Math.max(...v), mid = 0.5 * (mn + mx), half = 0.5 * (mx - mn) || 1;
      const vv = v.map((x) => ((x - mid) / half) * amp);
      w = (e) => {
        const t = Math.max(0, (e - eP0) / lamK), k = Math.min(nk - 2, Math.floor(t)), f = Math.min(1, t - k);
        const c = (1 - Math.cos(Math.PI * f)) / 2;
        return (vv[k]! * (1 - c) + vv[k + 1]! * c) * taper(e);
      };
      kind = `random-walk serrations (step ${(100 * lamK).toFixed(2)} %)`;
    }
    drop = { reHTop: reH, eH, eL, epL, sL, d, dropSpan, recSpan, trough, eP0, w, kind, amp, samplesK };
  }

  // The continuous noise-free curve, truth strain e (toe compensated) → engineering stress.
  let hint = drop ? drop.epL : epY0;
  const eYield = drop ? drop.eH : eY0;
  const sAt = (e: number): number => {
    if (e <= eYield) return sEl(E, e);
    if (drop && e <= drop.eL) {
      if (e <= drop.eH + drop.dropSpan) { const u = (e - drop.eH) / drop.dropSpan; return drop.reHTop - (drop.reHTop - drop.trough) * (1 - Math.cos(Math.PI * u)) / 2; }
      if (e <= drop.eP0) { const u = (e - drop.eH - drop.dropSpan) / drop.recSpan; return drop.trough + (drop.sL - drop.trough) * (1 - Math.cos(Math.PI * u)) / 2; }
      return drop.sL + drop.w(e);
    }
    if (e <= eU) {
      const lo = drop ? drop.epL : 0;
      const ep = epAtE(lawF, E, e, lo, epU, Math.min(Math.max(hint, lo), epU));
      hint = ep;
      return engAt(lawF, E, ep)[1];
    }
    const u = Math.min(1, (e - eU) / neckSpan);
    return Rm - (Rm - sF) * Math.pow(u, q);
  };

  // Samples.
  const xs: number[] = [], ss: number[] = [];
  const tSw = sSw / dS, xSw = eSw + x0;
  for (let i = 0; ; i++) {
    const t = i + phase;
    if (t < tSw) {
      const s = t * dS;
      const x = L > 0 && s < sToe ? (beta > 0 ? (-alpha + Math.sqrt(alpha * alpha + 4 * beta * s)) / (2 * beta) : s / alpha) : riseE(s) + x0;
      xs.push(x); ss.push(s);
    } else {
      const x = xSw + (t - tSw) * dX;
      if (x - x0 > eF) break;
      xs.push(x); ss.push(sAt(x - x0));
    }
  }
  const iLast = xs.length - 1;
  const eLast = xs[iLast]! - x0, sLast = ss[iLast]!;
  const fallSamples = R.int(1, 2);
  const ePost = eF - sLast / E + R.u(0, 0.3) * dX;
  if (fallSamples === 2) { const rho = R.u(0.15, 0.6); xs.push(eF - ((1 - rho) * sLast) / E + x0); ss.push(rho * sLast); }
  xs.push(ePost + x0); ss.push(0);
  const trailing = R.chance(0.5) ? 0 : R.int(0, 50);
  for (let k = 0; k < trailing; k++) { xs.push(ePost + x0); ss.push(0); }

  // Noise (its own stream, drawn whatever noiseScale is, so the sampling does not depend on it).
  const loadSd = R.u(0.001, 0.01) * Rm;
  const hum = R.chance(0.4) ? { amp: R.u(0, 0.003) * Rm, period: R.u(50, 500), ph: R.u(0, 2 * Math.PI) } : null;
  const strainSd = R.u(0.5e-6, 5e-6);
  const G = draws(seed, 1);
  const clip = (z: number) => Math.max(-4.5, Math.min(4.5, z));
  const n = xs.length;
  const strain = new Float64Array(n), stress = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const zl = clip(G.normal()), ze = clip(G.normal());
    const h = hum ? hum.amp * Math.sin((2 * Math.PI * i) / hum.period + hum.ph) : 0;
    stress[i] = ss[i]! + noiseScale * (loadSd * zl + h);
    strain[i] = xs[i]! + noiseScale * strainSd * ze;
  }

  // Truth.
  let elasticPoints = 0;
  for (let i = 0; i < n && ss[i]! < 0.9 * yRef; i++) if (xs[i]! >= L) elasticPoints++;
  let reH: number | null = null, reL: number | null = null, aePct: number | null = null, serration = 0;
  let dropEvidence: number | null = null, rp02 = rpCont;
  const notes: string[] = [];
  if (drop) {
    const dr = drop;
    // The highest recorded sample of the rise and fall, the first trough after it, then the plateau's troughs.
    let iR = 0;
    for (let i = 0; i <= iLast && xs[i]! - x0 <= dr.eH + dr.dropSpan; i++) if (ss[i]! > ss[iR]!) iR = i;
    let j = iR;
    while (j + 1 <= iLast && ss[j + 1]! < ss[j]!) j++;
    let iEnd = j;
    while (iEnd + 1 <= iLast && xs[iEnd + 1]! - x0 <= dr.eL) iEnd++;
    let low = Infinity, plateauMax = -Infinity;
    for (let k = j + 1; k <= iEnd; k++) {
      plateauMax = Math.max(plateauMax, ss[k]!);
      if (k >= j + 2 && k + 1 <= iLast && ss[k]! <= ss[k - 1]! && ss[k]! <= ss[k + 1]!) low = Math.min(low, ss[k]!);
    }
    const reL0 = Number.isFinite(low) ? low : ss[j]!;
    const reHRec = ss[iR]!;
    const caught = reHRec >= dr.reHTop * (1 - 0.002);
    const visible = reHRec > Math.max(plateauMax, reL0 * 1.01) && j > iR;
    // Continuous curve over the plateau, first trough included: the largest peak-to-trough.
    let mn = Infinity, mx = -Infinity;
    for (let e = dr.eH + dr.dropSpan; e <= dr.eL; e += 1e-6) { const s = sAt(e); mn = Math.min(mn, s); mx = Math.max(mx, s); }
    serration = (mx - mn) / reL0;
    // Rp0.2: the first crossing of the offset line on the continuous curve.
    const hh = (e: number) => sAt(e) - E * (e - P0);
    let ePrev = P0, found = false;
    for (let e = P0 + 1e-6; e <= dr.eL + 0.01; e += 1e-6) {
      if (hh(e) < 0) { const ec = bisect(hh, ePrev, e, 1e-15); rp02 = sAt(ec); found = true; break; }
      ePrev = e;
    }
    if (!found) throw new Error(`holdout-c ${seed}: no Rp0.2 crossing`);
    if (visible) {
      reH = reHRec; reL = reL0; aePct = (dr.eL - (xs[iR]! - x0)) * 100;
      if (noiseScale > 0) {
        let q2 = 0;
        for (let i = 0; i <= j; i++) if (ss[i]! > reL0) q2 += (ss[i]! - reL0) ** 2;
        dropEvidence = Math.sqrt(q2) / (loadSd * noiseScale);
      }
    }
    notes.push(`yield drop ${(100 * dr.d).toFixed(1)} % from ${dr.reHTop.toFixed(1)} MPa over ${dr.samplesK} sample(s), first trough ${(100 * (1 - dr.trough / dr.sL)).toFixed(2)} % below the plateau, plateau ${(100 * (dr.eL - dr.eH)).toFixed(2)} % with ${dr.kind} of ${(200 * dr.amp / dr.sL).toFixed(2)} % peak-to-trough`);
    if (!caught) notes.push(visible ? 'peak not caught' : 'peak not caught, no drop recorded');
  }
  const truth: HoldoutTruthLike = {
    E, rp02, rm: Rm, agPct: agFrac * 100, aPct: (eLast - sLast / E) * 100,
    reH, reL, aePct, serration, elasticPoints, dropEvidence,
    // The stress-rate → strain-rate switch is at yield, not on the plastic part: one rate as far as the flow curve goes.
    rateRatio: 1,
  };
  const what = `holdout-c ${seed}: ${lawF.name} (${lawF.params}; ${targets}), E ${(E / 1000).toFixed(1)} GPa ${mat.name}, `
    + `${n} points (stress step ${dS.toFixed(3)} MPa to ${(100 * frac).toFixed(0)} % of ${drop ? 'ReH' : 'Rp0.2'}, then strain step ×${kappa.toFixed(2)}), `
    + `load noise ${(100 * loadSd / Rm).toFixed(2)} % Rm${hum ? `, hum ${(100 * hum.amp / Rm).toFixed(2)} % Rm period ${hum.period.toFixed(0)}` : ''}, strain noise ${(1e6 * strainSd).toFixed(1)} µε (×${noiseScale}), `
    + `${L > 0 ? `toe ${(100 * L).toFixed(3)} %` : 'no toe'}, ${notes.length ? notes.join(', ') : 'continuous'}, `
    + `neck to ${(100 * sF / Rm).toFixed(0)} % Rm over ${(neckSpan / agFrac).toFixed(2)}·Ag, fracture in ${fallSamples} sample(s), ${trailing} trailing`;
  for (let i = 0; i < n; i++) if (!Number.isFinite(strain[i]!) || !Number.isFinite(stress[i]!)) throw new Error(`holdout-c ${seed}: non-finite sample ${i}`);
  for (const v of [E, rp02, Rm, truth.agPct, truth.aPct, serration]) if (!Number.isFinite(v)) throw new Error(`holdout-c ${seed}: non-finite truth`);
  return { strain, stress, truth, what };
}
