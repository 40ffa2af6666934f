import { xoshiro128ss } from '../../../src/core/index.js';

// A SECOND hold-out generator of INVENTED lab-style tensile records, written after the record analysis was
// tuned and kept away from whoever tuned it. It shares no code with `synthesizeLabRecord`, with the first
// hold-out generator, nor with the project's law code. What it does differently:
// - material families the others do not have: gradual yielding by the Ramberg–Osgood relation (Ramberg &
//   Osgood, NACA TN 902, 1943) in true stress — an aluminium-like alloy (E ≈ 70 GPa), an austenitic-stainless-
//   like one (high hardening, large Ag) and a high-strength steel (Rp/Rm 0.9–0.97, small Ag) — and a mild
//   steel with a rounded upper yield peak, a sloping Lüders plateau with sawtooth serrations, then Hollomon
//   hardening joined at the end of the plateau;
// - sampling uniform in time with the strain rate raised 1–27× once the yield region is passed (ISO 6892-1
//   method A's ranges; the factor 27 is 0.00025 → 0.0067 s⁻¹, from memory) and a small timing jitter;
// - load noise that is white, proportional to the load, or low-pass filtered (a moving average over 1–8
//   samples, as an acquisition filter leaves it), never AR(1); extensometer quantisation (1–10 µε steps);
// - an exponential seating toe; a necking branch s = Rm + ½c·d² − q·d⁴ (smooth to the second derivative at
//   maximum force); a fracture fall spread over 1–4 samples, then samples at about zero load, some negative.
// The truth is computed from the noise-free curve by the ISO 6892-1 definitions (strain origin at the elastic
// line's intercept), as in the first hold-out.

export interface HoldoutBTruth {
  E: number; rp02: number; rm: number; agPct: number; aPct: number;
  reH: number | null; reL: number | null; aePct: number | null;
  /** Largest serration on the plateau, fraction of ReL (0 for a continuous curve). */
  serration: number;
  /** Samples on the rise below 0.9 of the yield stress (the elastic line). */
  elasticPoints: number;
  /** The strain rate after the yield region over that before it (sampling uniform in time); the flow stress does not follow it (m = 0). */
  rateRatio: number;
  /** Signal-to-noise ratio of a recorded drop (see the truth's computation); null without a drop or without noise. */
  dropEvidence: number | null;
}

export interface HoldoutBRecord { strain: Float64Array; stress: Float64Array; truth: HoldoutBTruth; what: string }

/** Engineering curve point of a true-stress law given as true strain of true stress. */
interface Family { name: string; E: number; drop: boolean; yieldStress: number; eng: (sig: number) => { e: number; s: number }; sigMax: number; sigStart: number }

/** Hold-out B record `seed` (noiseScale 0: noise-free). */
export function holdoutBRecord(seed: number, noiseScale = 1): HoldoutBRecord {
  const r = xoshiro128ss(seed, 9090);
  const u = (a: number, b: number) => a + (b - a) * r.nextFloat();
  const pick = <T>(xs: T[]) => xs[Math.floor(r.nextFloat() * xs.length)]!;
  const fam = seed % 4;
  let f: Family;
  // Ramberg–Osgood in true measures: ε = σ/E + 0.002·(σ/σ0.2)^n. Engineering: e = exp(ε) − 1, s = σ/(1 + e).
  const ro = (name: string, E: number, s02: number, n: number): Family => ({
    name: `${name} Ramberg–Osgood E ${E.toFixed(0)} σ0.2 ${s02.toFixed(0)} n ${n.toFixed(1)}`, E, drop: false, yieldStress: s02,
    eng: (sig) => { const eps = sig / E + 0.002 * (sig / s02) ** n; const e = Math.expm1(eps); return { e, s: sig / (1 + e) }; },
    sigMax: s02 * 1000 ** (1 / n), sigStart: 0, // εp = 2 at sigMax: beyond any maximum force, e finite
  });
  let lud = { reH: 0, reL: 0, eH: 0, eL: 0, slope: 0, amp: 0, period: 0, round: 0, K: 0, nH: 0, luders: 0 };
  if (fam === 0) f = ro('aluminium-like', u(68000, 72000), u(120, 350), u(8, 30));
  else if (fam === 1) f = ro('stainless-like', u(190000, 200000), u(220, 320), u(3.5, 6));
  else if (fam === 3) f = ro('high-strength', u(205000, 212000), u(500, 1000), u(15, 40));
  else {
    // Mild steel: ReL, a Lüders strain, Hollomon σ = K·εp^n after it with K·luders^n = ReL (true measures).
    // The plateau's level is the branch's ENGINEERING stress where it starts, so the curve is continuous there.
    const E = u(200000, 210000), sigL = u(200, 350), luders = u(0.005, 0.03), nH = u(0.15, 0.3);
    const K = sigL / luders ** nH;
    const eL0 = Math.expm1(sigL / E + luders), reL = sigL / (1 + eL0);
    lud = { reH: reL * (1 + u(0.03, 0.1)), reL, eH: 0, eL: 0, slope: u(-0.005, 0.005), amp: pick([0, u(0, 0.004), u(0.004, 0.01)]), period: u(0.0008, 0.004), round: u(0, 0.4), K, nH, luders };
    f = {
      name: `mild steel E ${E.toFixed(0)} ReL ${reL.toFixed(0)} Lüders ${(luders * 100).toFixed(2)} % Hollomon n ${nH.toFixed(2)}`, E, drop: true, yieldStress: reL,
      // Hardening branch, parametrised by true stress above ReL: εp = (σ/K)^(1/n).
      eng: (sig) => { const eps = sig / E + (sig / K) ** (1 / nH); const e = Math.expm1(eps); return { e, s: sig / (1 + e) }; },
      sigMax: K * 2 ** nH, sigStart: sigL, // εp = 2
    };
  }
  const E = f.E;
  // Maximum engineering stress: golden section over true stress (s rises then falls along the branch).
  let a0 = f.sigStart, b0 = f.sigMax;
  const g = 0.5 * (Math.sqrt(5) - 1);
  for (let k = 0; k < 300; k++) { const c = b0 - g * (b0 - a0), d = a0 + g * (b0 - a0); if (f.eng(c).s > f.eng(d).s) b0 = d; else a0 = c; }
  const sigU = 0.5 * (a0 + b0);
  const { e: eU, s: rm } = f.eng(sigU);
  // Engineering stress at engineering strain e on the branch: bisection over true stress.
  let sGuess = f.sigStart;
  const branch = (e: number): number => {
    let lo = f.sigStart, hi = sigU;
    if (f.eng(sGuess).e <= e) {
      // Warm start for increasing e: bracket upward from the last answer by doubling steps.
      lo = sGuess;
      for (let step = 1e-3 * rm; lo + step < sigU && f.eng(lo + step).e < e; step *= 2) { lo += step; hi = Math.min(lo + 2 * step, sigU); }
      if (hi > lo + 1e-3 * rm) hi = Math.min(hi, sigU); else hi = Math.min(lo + 1e-3 * rm, sigU);
      if (f.eng(hi).e < e) hi = sigU;
    }
    for (let k = 0; k < 80 && hi - lo > 1e-12 * rm; k++) { const m = 0.5 * (lo + hi); if (f.eng(m).e < e) lo = m; else hi = m; }
    sGuess = lo;
    return f.eng(0.5 * (lo + hi)).s;
  };
  if (f.drop) {
    lud.eH = lud.reH / E;
    lud.eL = f.eng(f.sigStart).e; // end of the plateau: where the hardening branch starts (at ReL, engineering)
  }
  // Rounded upper yield peak: the rise leaves the elastic line over the last `round` fraction of (ReH − ReL)
  // along a parabola whose top is ReH; the drop then falls linearly to the plateau over dropSpan.
  const dropSpan = u(1e-4, 5e-4);
  const plateau = (e: number) => {
    const t = (e - lud.eH - dropSpan) / Math.max(lud.eL - lud.eH - dropSpan, 1e-12);
    const saw = lud.amp > 0 ? lud.amp * ((((e - lud.eH) / lud.period) % 1 + 1) % 1) : 0; // sawtooth rising then snapping back
    return lud.reL * (1 + lud.slope * (t - 1) + saw);
  };
  const roundW = lud.round * (lud.reH - lud.reL) / E; // strain width of the rounded top
  const eTop = lud.eH + roundW / 2; // strain of the rounded peak
  const curveClean = (e: number): number => {
    if (!f.drop) {
      if (e <= 0) return E * e;
      if (e <= eU) return branch(e);
    } else {
      if (e <= lud.eH - roundW / 2) return E * e;
      if (roundW > 0 && e <= eTop) { const d = e - eTop; return lud.reH - (E / (2 * roundW)) * d * d; }
      if (e < eTop + dropSpan) return lud.reH - ((lud.reH - plateau(eTop + dropSpan)) * (e - eTop)) / dropSpan;
      if (e < lud.eL) return plateau(e);
      if (e <= eU) return branch(e);
    }
    return NaN;
  };
  // Necking: s = Rm + ½c·d² − q·d⁴, c = d²s/de² of the branch at its maximum, q from s(eF) = fF·Rm.
  const h = 1e-4 * Math.max(eU, 1e-3);
  const c = Math.min((branch(eU - 2 * h) - 2 * branch(eU - h) + rm) / (h * h), -1e-6 * rm); // one-sided, left of the top
  const fF = u(0.55, 0.9), eF = eU + u(0.15, 0.7) * Math.max(eU, 0.04);
  const dF = eF - eU;
  const q = Math.max(((1 - fF) * rm + 0.5 * c * dF * dF) / dF ** 4, 0);
  const curve = (e: number): number => {
    if (e <= eU) return curveClean(e);
    const d = e - eU;
    return Math.max(rm + 0.5 * c * d * d - q * d ** 4, 0.05 * rm);
  };

  // Exponential seating toe on a third: s = E·(x − xt(1 − e^(−x/xt))), i.e. strain origin shifted by xt; its
  // slope is 95 % of E at 3·xt, where the stress is about 2·E·xt.
  const xt = seed % 3 === 1 ? (u(0.01, 0.05) * f.yieldStress) / E : 0; // the toe bends into the line by about 10–15 % of the yield stress
  const measuredAt = (x: number): number => {
    if (xt === 0) return curve(x);
    const e = x - xt * (1 - Math.exp(-x / xt)); // the toe's engineering strain as the material sees it
    return curve(e);
  };

  // Sampling uniform in time, the strain rate raised kRate× after the yield region, timing jitter ±3 %.
  const N = Math.round(pick([1000, 1500, 3000, 6000]) * 10 ** u(0, 1.2));
  const kRate = pick([1, 2, 5, 27]);
  const yieldEnd = f.drop ? lud.eL + 0.002 : Math.max(0.01, rm / E * 3);
  const trailing = Math.floor(u(0, 60));
  const fallN = 1 + Math.floor(u(0, 4));
  const nMain = Math.max(300, N - trailing - fallN);
  const dt = (yieldEnd + (eF - yieldEnd) / kRate) / nMain; // strain step at the slow rate
  const xs: number[] = [];
  for (let x = 0; ; ) {
    const e = x - xt;
    if (e >= eF) break;
    xs.push(x);
    x += (e < yieldEnd ? dt : kRate * dt) * (1 + 0.03 * (2 * r.nextFloat() - 1));
  }
  const nCurve = xs.length;
  const lastX = xs[nCurve - 1]!;
  const lastE = lastX - xt;
  const sF = curve(lastE);
  // Fracture: the load falls over fallN samples to about zero; the strain keeps the extensometer's last
  // reading plus a little (the specimen halves part; some extensometers read on).
  const fracRest = u(-0.005, 0.01) * rm;
  const tail: { x: number; s: number }[] = [];
  for (let k = 1; k <= fallN + trailing; k++) {
    const frac = Math.min(k / (fallN + 1), 1);
    tail.push({ x: lastX + k * 1e-6, s: k <= fallN ? sF + (fracRest - sF) * frac : fracRest }); // strain about still while the load falls
  }

  // Noise.
  const kind = pick(['white', 'proportional', 'filtered']);
  const sn = rm * u(0.001, 0.01); // marginal sd at Rm
  const win = kind === 'filtered' ? 1 + Math.floor(u(1, 8)) : 1;
  const qStrain = pick([0, 1e-6, 5e-6, 1e-5]);
  let spare: number | null = null;
  const gauss = () => {
    if (spare !== null) { const s = spare; spare = null; return s; }
    const a = Math.max(r.nextFloat(), 1e-300), b = r.nextFloat();
    const m = Math.sqrt(-2 * Math.log(a));
    spare = m * Math.sin(2 * Math.PI * b);
    return m * Math.cos(2 * Math.PI * b);
  };
  const total = nCurve + tail.length;
  const white = new Float64Array(total + win);
  for (let i = 0; i < white.length; i++) white[i] = gauss();
  const strain = new Float64Array(total), stress = new Float64Array(total);
  let reHrec = -Infinity, reLrec = Infinity, serrMax = 0, elasticPoints = 0;
  const yTop = f.drop ? lud.reH : rm;
  const transientEnd = eTop + 2 * dropSpan;
  for (let i = 0; i < total; i++) {
    const x = i < nCurve ? xs[i]! : tail[i - nCurve]!.x;
    const clean = i < nCurve ? measuredAt(x) : tail[i - nCurve]!.s;
    // Moving average over `win` white values, rescaled to unit variance.
    let w = 0;
    for (let k = 0; k < win; k++) w += white[i + k]!;
    w /= Math.sqrt(win);
    const sd = kind === 'proportional' ? sn * (0.15 + 0.85 * Math.abs(clean) / rm) : sn;
    stress[i] = clean + noiseScale * sd * w;
    const xq = qStrain > 0 && noiseScale > 0 ? Math.round(x / qStrain) * qStrain : x;
    strain[i] = xq;
    const e = x - xt;
    if (i < nCurve) {
      if (f.drop) {
        if (e <= eTop + dropSpan / 2 && e > 0.5 * lud.eH) reHrec = Math.max(reHrec, clean);
        if (e >= transientEnd && e < lud.eL) { reLrec = Math.min(reLrec, clean); serrMax = Math.max(serrMax, clean / lud.reL - 1); }
      }
    }
  }
  // Truth Rp0.2: where the curve meets E(e − 0.002), bisection from the rise.
  const off = (e: number) => curve(e) - E * (e - 0.002);
  let lo = 0, hi = 0.002;
  while (off(hi) > 0 && hi < eF) { lo = hi; hi += 0.002; }
  for (let k = 0; k < 100 && hi - lo > 1e-13; k++) { const m = 0.5 * (lo + hi); if (off(m) > 0) lo = m; else hi = m; }
  const rp02 = curve(0.5 * (lo + hi));
  for (let i = 0; i < nCurve; i++) {
    const e = xs[i]! - xt;
    const s = curve(e);
    if (e > 0 && s < 0.9 * (f.drop ? lud.reH : rp02) && Math.abs(s - E * e) < 0.01 * s + 1e-9) elasticPoints++;
  }
  const recorded = f.drop && reHrec > reLrec + 0.5 * (lud.reH - lud.reL);
  // How clearly the samples show the drop (as the other two generators give it): √Σ(sᵢ − ReL)² over the recorded
  // noise-free samples above ReL from the rise through the rounded top and the fall to the transient's end, over the
  // noise sd at ReL (the matched filter's signal-to-noise ratio for white noise; the fall's samples counted too,
  // and filtered noise treated as white, both of which make it larger, so the acceptance stricter). Null without noise.
  let dropEvidence: number | null = null;
  if (recorded && noiseScale > 0) {
    let ss = 0;
    for (let i = 0; i < nCurve; i++) {
      const e = xs[i]! - xt;
      if (e > 0.5 * lud.eH && e < transientEnd) { const d = measuredAt(xs[i]!) - reLrec; if (d > 0) ss += d * d; }
    }
    const sdL = (kind === 'proportional' ? sn * (0.15 + 0.85 * reLrec / rm) : sn) * noiseScale;
    dropEvidence = Math.sqrt(ss) / sdL;
  }
  const truth: HoldoutBTruth = {
    E, rp02, rm,
    agPct: (eU - rm / E) * 100,
    aPct: (lastE - sF / E) * 100,
    reH: recorded ? reHrec : null,
    reL: recorded ? reLrec : null,
    aePct: recorded ? (lud.eL - eTop) * 100 : null,
    serration: serrMax,
    elasticPoints,
    rateRatio: kRate,
    dropEvidence,
  };
  const what = `holdout-b ${seed}: ${f.name}, ${total} points (rate ×${kRate} after ${(yieldEnd * 100).toFixed(2)} %), noise ${kind} ${(sn / rm * 100).toFixed(2)} % Rm window ${win}, strain step ${qStrain}, toe ${xt.toExponential(1)}${f.drop ? `, drop ${((lud.reH / lud.reL - 1) * 100).toFixed(1)} % slope ${(lud.slope * 100).toFixed(2)} % serration ${(lud.amp * 100).toFixed(2)} % round ${lud.round.toFixed(2)}${recorded ? '' : ' (peak not caught)'}` : ''}, fracture fall ${fallN}, trailing ${trailing}`;
  return { strain, stress, truth, what };
}
