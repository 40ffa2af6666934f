import { xoshiro128ss } from '../../../src/core/index.js';

// A HOLD-OUT generator of INVENTED lab-style tensile records, written apart from `synthesizeLabRecord` and
// sharing none of its code (nor the project's law code): other hardening laws (a Swift–Voce blend among them),
// a two-rate test (slow elastic part, faster after yielding, as ISO 6892-1 method A allows — common practice),
// a cubic seating toe, correlated (AR(1)) load noise with load-cell quantisation, extensometer noise, random
// (not sawtooth) serrations with an optional undershoot transient after the yield drop, a necking branch of
// its own shape and a fracture followed by a varying number of samples at about zero load. Its purpose is to
// check that the record analysis is right on curves it was not tuned on. The truth is computed from the
// noise-free curve by the ISO 6892-1 definitions (toe-compensated strain origin: the elastic line's intercept).

export interface HoldoutTruth {
  E: number;
  rp02: number;
  rm: number;
  agPct: number;
  aPct: number;
  reH: number | null;
  reL: number | null;
  aePct: number | null;
  /** Largest serration on the plateau, fraction of ReL (0 for a continuous curve). */
  serration: number;
  /** Samples on the elastic line below 0.9 of the yield stress. */
  elasticPoints: number;
  /**
   * Evidence of a recorded yield drop: √Σ(sᵢ − ReL)² over the noise-free samples of the rise and fall above ReL,
   * divided by the noise's marginal sd (load noise and quantisation) — the signal-to-noise ratio of the best test
   * that knows the drop's shape (matched filter), as in the project's generator. Correlated noise makes the real
   * ratio lower still, so this overstates it (acceptances are rarer). Null without a recorded drop.
   */
  dropEvidence: number | null;
  /** The strain rate after the switch over that before it (sampling uniform in time); the flow stress does not follow it (m = 0). */
  rateRatio: number;
}

export interface HoldoutRecord { strain: Float64Array; stress: Float64Array; truth: HoldoutTruth; what: string }

interface Law { s: (ep: number) => number; d: (ep: number) => number; name: string }

function pickLaw(u: (a: number, b: number) => number, kind: number, sy: number): Law {
  switch (kind) {
    case 0: { // Hollomon with an offset (Swift): σ = K(ε0 + εp)^n
      const n = u(0.1, 0.4), e0 = u(0.002, 0.015), K = sy / e0 ** n;
      return { name: `swift K ${K.toFixed(0)} ε0 ${e0.toFixed(4)} n ${n.toFixed(3)}`, s: (p) => K * (e0 + p) ** n, d: (p) => K * n * (e0 + p) ** (n - 1) };
    }
    case 1: { // Voce with a linear term: σ = σ0 + Q(1 − e^(−bεp)) + Hεp
      const Q = sy * u(0.3, 1.0), b = u(6, 30), H = sy * u(0, 0.4);
      return { name: `voce+linear σ0 ${sy.toFixed(0)} Q ${Q.toFixed(0)} b ${b.toFixed(1)} H ${H.toFixed(0)}`, s: (p) => sy + Q * (1 - Math.exp(-b * p)) + H * p, d: (p) => Q * b * Math.exp(-b * p) + H };
    }
    case 2: { // Hockett–Sherby: σ = σs − (σs − σ0)e^(−a εp^m)
      const ss = sy * u(1.4, 2.6), a = u(2, 12), m = u(0.5, 0.95);
      return { name: `hockett–sherby σ0 ${sy.toFixed(0)} σs ${ss.toFixed(0)} a ${a.toFixed(2)} p ${m.toFixed(2)}`, s: (p) => ss - (ss - sy) * Math.exp(-a * p ** m), d: (p) => (p <= 0 ? 1e12 : (ss - sy) * a * m * p ** (m - 1) * Math.exp(-a * p ** m)) };
    }
    default: { // blend α·Swift + (1 − α)·Voce
      const al = u(0.3, 0.7), n = u(0.15, 0.3), e0 = u(0.003, 0.01), K = sy / e0 ** n, Q = sy * u(0.4, 0.9), b = u(8, 20);
      return { name: `swift–voce α ${al.toFixed(2)}`, s: (p) => al * K * (e0 + p) ** n + (1 - al) * (sy + Q * (1 - Math.exp(-b * p))), d: (p) => al * K * n * (e0 + p) ** (n - 1) + (1 - al) * Q * b * Math.exp(-b * p) };
    }
  }
}

/** Hold-out record `seed`. */
export function holdoutRecord(seed: number, noiseScale = 1): HoldoutRecord {
  const r = xoshiro128ss(seed, 4242);
  const u = (a: number, b: number) => a + (b - a) * r.nextFloat();
  const pick = <T>(xs: T[]) => xs[Math.floor(r.nextFloat() * xs.length)]!;
  const E = u(65000, 215000);
  const sy = u(100, 650) * Math.sqrt(E / 200000);
  const law = pickLaw(u, seed % 4, sy);

  // Engineering curve on the law from plastic strain p: e = exp(p + σ/E) − 1, s = σ/(1 + e).
  const engOf = (p: number) => { const sg = law.s(p); const e = Math.expm1(p + sg / E); return { e, s: sg / (1 + e) }; };
  // Plastic strain at engineering strain e (monotone): bisection.
  const pAt = (e: number, lo0 = 0) => { let lo = lo0, hi = Math.max(lo0 + 1e-9, Math.log1p(e)); for (let k = 0; k < 80; k++) { const m = 0.5 * (lo + hi); if (engOf(m).e < e) lo = m; else hi = m; } return 0.5 * (lo + hi); };
  // Maximum engineering stress on the law (golden section on p over [0, 1]; s(p) is unimodal for these laws).
  let pa = 0, pb = 1;
  const g = 0.5 * (Math.sqrt(5) - 1);
  for (let k = 0; k < 200; k++) { const c = pb - g * (pb - pa), d = pa + g * (pb - pa); if (engOf(c).s > engOf(d).s) pb = d; else pa = c; }
  const pU = 0.5 * (pa + pb);
  const { e: eU, s: rm0 } = engOf(pU);

  // Yield drop on a third of the seeds, where the law leaves room for a plateau before maximum force.
  const drop = seed % 3 === 0 && pU > 0.08;
  const luders = drop ? u(0.005, Math.min(0.03, pU / 3)) : 0;
  const { e: eL, s: reL } = engOf(luders);
  const dropFrac = drop ? u(0.03, 0.1) : 0;
  const reH = drop ? (1 + dropFrac) * reL : null;
  const eH = reH !== null ? reH / E : engOf(0).s / E;
  const dropSpan = u(1e-4, 6e-4);
  const undershoot = drop && r.nextFloat() < 0.5 ? u(0.01, 0.03) : 0;
  const amp = drop ? pick([0, u(0, 0.005), u(0.005, 0.02)]) : 0;
  // Random serrations: piecewise-linear knots ReL·(1 + amp·U) spaced 0.0005–0.003, one knot exactly at ReL.
  const knots: { e: number; v: number }[] = [];
  const plateauStart = eH + 2 * dropSpan;
  if (drop) {
    for (let e = plateauStart; e < eL; e += u(0.0005, 0.003)) knots.push({ e, v: reL * (1 + amp * r.nextFloat()) });
    knots.push({ e: eL, v: reL });
    knots[Math.floor(r.nextFloat() * knots.length)]!.v = reL;
  }
  const plateau = (e: number) => {
    let k = 0;
    while (k + 1 < knots.length && knots[k + 1]!.e < e) k++;
    const a = knots[k]!, b = knots[Math.min(k + 1, knots.length - 1)]!;
    return b.e > a.e ? a.v + ((b.v - a.v) * (e - a.e)) / (b.e - a.e) : a.v;
  };

  // Necking: a curve smooth to its second derivative at maximum force (as a real record is), falling to about
  // f·Rm at fracture: s = Rm + ½c·d² + k·d³, d = e − eU, c = d²s/de² of the hardening branch at its maximum
  // (= s_pp/e_p² there, since s_p = 0), k from s(eF) = f·Rm, limited so that s keeps falling.
  const hp = 1e-4 * Math.max(pU, 1e-3);
  const spp = (engOf(pU + hp).s - 2 * rm0 + engOf(pU - hp).s) / (hp * hp);
  const ep = (engOf(pU + hp).e - engOf(pU - hp).e) / (2 * hp);
  const cN = Math.min(spp / (ep * ep), -1e-6 * rm0);
  const fWanted = u(0.6, 0.9), eF = eU + u(0.2, 0.6) * Math.max(eU, 0.05);
  const dF = eF - eU;
  let kN = ((fWanted - 1) * rm0 - 0.5 * cN * dF * dF) / (dF * dF * dF);
  if (cN + 3 * kN * dF >= 0) kN = (-0.9 * cN) / (3 * dF);
  let pGuess = luders;
  /** Noise-free engineering stress at engineering strain e (toe-compensated origin). */
  const curve = (e: number): number => {
    if (e <= eH) return E * e;
    if (reH !== null && e < eL) {
      if (e < eH + dropSpan) return reH - ((reH - reL * (1 - undershoot)) * (e - eH)) / dropSpan;
      if (e < plateauStart) return reL * (1 - undershoot) + (plateau(plateauStart) - reL * (1 - undershoot)) * ((e - eH - dropSpan) / dropSpan);
      return plateau(e);
    }
    if (e <= eU) { const p = pAt(e, Math.min(pGuess, luders)); pGuess = p; return engOf(p).s; }
    const d = e - eU;
    return Math.max(rm0 + 0.5 * cN * d * d + kN * d * d * d, 0.05 * rm0);
  };

  // Seating toe on a third: cubic s = a·x² + b·x³ on [0, 2.5·x0], then the elastic line E(x − x0).
  const x0 = seed % 5 === 1 ? (u(0.03, 0.2) * sy) / E : 0;
  const L = 2.5 * x0, ta = (0.32 * E) / Math.max(x0, 1e-300), tb = (-0.032 * E) / Math.max(x0 * x0, 1e-300);
  const measured = (x: number) => (x0 > 0 && x < L ? ta * x * x + tb * x * x * x : curve(x - x0));

  // Time-uniform sampling at two rates: spacing dx1 up to the switch, k·dx1 after (k = 1: one rate).
  const N = Math.round(pick([1000, 2000, 5000]) * 10 ** u(0, 1) * (r.nextFloat() < 0.08 ? 10 : 1));
  const kRate = pick([1, 1, 4, 10]);
  const trailing = 1 + Math.floor(u(0, 40));
  const xSwitch = x0 + (reH ?? engOf(0).s) / E + (drop ? eL - eH : 0.004);
  const xEnd = x0 + eF;
  const nMain = Math.max(200, N - trailing - 1);
  const dx1 = (xSwitch + (xEnd - xSwitch) / kRate) / nMain;
  const xs: number[] = [];
  for (let x = 0; x < xSwitch; x += dx1) xs.push(x);
  for (let x = xSwitch; x < xEnd; x += kRate * dx1) xs.push(x);
  xs.push(xEnd);
  const nCurve = xs.length;
  const total = nCurve + trailing;
  const dxEnd = kRate * dx1;
  for (let k = 1; k <= trailing; k++) xs.push(xEnd + k * dxEnd);

  // Noise: AR(1) load noise of marginal sd sn (ρ 0 on a third), quantised to a load-cell step; extensometer noise.
  const sn = rm0 * u(0.001, 0.01);
  const rho = r.nextFloat() < 1 / 3 ? 0 : u(0.2, 0.7);
  const quant = sn * u(0, 0.5);
  const sx = u(0, 3e-6);
  let spare: number | null = null;
  const gauss = () => {
    if (spare !== null) { const s = spare; spare = null; return s; }
    const a = Math.max(r.nextFloat(), 1e-300), b = r.nextFloat();
    const m = Math.sqrt(-2 * Math.log(a));
    spare = m * Math.sin(2 * Math.PI * b);
    return m * Math.cos(2 * Math.PI * b);
  };
  const strain = new Float64Array(total), stress = new Float64Array(total);
  let ar = gauss() * sn;
  let reHrec = -Infinity, reLrec = Infinity, elasticPoints = 0, serrMax = 0, ev = 0;
  const yieldTop = reH ?? engOf(0).s;
  const fracRest = u(0, 0.02) * rm0;
  for (let i = 0; i < total; i++) {
    const x = xs[i]!;
    const clean = i < nCurve ? measured(x) : fracRest;
    const e = x - x0;
    if (i < nCurve && e > 0 && E * e < 0.9 * yieldTop && e <= eH) elasticPoints++;
    if (reH !== null && i < nCurve) {
      if (e <= eH + dropSpan / 2 && e > 0.5 * eH) reHrec = Math.max(reHrec, clean);
      if (e > 0 && e <= eH + dropSpan && clean > reL) ev += (clean - reL) ** 2;
      if (e >= plateauStart && e < eL) { reLrec = Math.min(reLrec, clean); serrMax = Math.max(serrMax, clean / reL - 1); }
    }
    ar = rho * ar + Math.sqrt(1 - rho * rho) * sn * gauss();
    const s = clean + noiseScale * ar;
    stress[i] = quant > 0 && noiseScale > 0 ? Math.round(s / quant) * quant : s;
    strain[i] = x + noiseScale * sx * gauss();
  }
  // Truth Rp0.2: where the curve meets E(e − 0.002), by bisection from the end of the elastic line.
  const h = (e: number) => curve(e) - E * (e - 0.002);
  let a = eH, b = eH + 0.002;
  while (h(b) > 0) { a = b; b += 0.002; }
  for (let k = 0; k < 100 && b - a > 1e-12; k++) { const m = 0.5 * (a + b); if (h(m) > 0) a = m; else b = m; }
  const rp02 = curve(0.5 * (a + b));
  const lastE = xs[nCurve - 1]! - x0;
  const recorded = reH !== null && reHrec > reLrec + 0.5 * (reH - reL);
  const truth: HoldoutTruth = {
    E, rp02, rm: rm0,
    agPct: (eU - rm0 / E) * 100,
    aPct: (lastE - curve(lastE) / E) * 100,
    reH: recorded ? reHrec : null,
    reL: recorded ? reLrec : null,
    aePct: recorded ? (eL - eH) * 100 : null,
    serration: serrMax,
    elasticPoints,
    rateRatio: kRate,
    dropEvidence: recorded && noiseScale > 0 ? Math.sqrt(ev) / (noiseScale * Math.sqrt(sn * sn + (quant * quant) / 12)) : null,
  };
  const what = `holdout ${seed}: ${law.name}, E ${E.toFixed(0)}, ${total} points (rate ×${kRate} after ${xSwitch.toFixed(4)}), noise ${(sn / rm0 * 100).toFixed(2)} % Rm ρ ${rho.toFixed(2)} quant ${quant.toFixed(2)} MPa, extensometer sd ${sx.toExponential(1)}, toe ${x0.toExponential(1)}${drop ? `, drop ${(dropFrac * 100).toFixed(1)} % Lüders ${(luders * 100).toFixed(2)} % serration ${(amp * 100).toFixed(2)} % undershoot ${(undershoot * 100).toFixed(1)} %${recorded ? '' : ' (peak not caught)'}` : ''}, trailing ${trailing}`;
  return { strain, stress, truth, what };
}
