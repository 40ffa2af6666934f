/**
 * Hold-out generator D: INVENTED tensile-test records with known truth, written apart from the analysis (it was not
 * read, run or tuned against while this file was written). All data here are INVENTED; no record comes from a real
 * specimen, machine or data set.
 *
 * What a record is made of
 * - A flow law in TRUE stress σ versus TRUE plastic strain x: Swift K(x0 + x)^n, Voce σ0 + Q(1 − e^(−bx)),
 *   Ludwik (Hollomon with an offset) σ0 + K·x^n, Hockett–Sherby σs − (σs − σ0)·e^(−N·x^p), and two sums
 *   (Voce + linear, Swift + Voce). Each is built so that Considère's condition dσ/dx = σ holds at a drawn uniform
 *   strain, then accepted only if the family's Ag and Rm/Rp0.2 come out in range (shape drawn again otherwise; the law
 *   itself is kept for 600 draws, so the laws of a family are about equally common).
 * - Continuous-yielding families get a gradual elastic–plastic transition of our own form,
 *   σ(x) = law(x) − D·exp(−(x/λ)^m) with 0 < m < 1, so the curve leaves the elastic line with no kink.
 * - Engineering values from the law: s = σ·e^(−x), plastic engineering strain e^x − 1, total engineering strain
 *   e = e^x − 1 + s/E (so an elastic unloading of slope E from any point lands on the plastic strain e^x − 1).
 * - Necking past the force maximum (Considère, the top of s): s = law·e^(−x)·(1 − β·((x − xm)/(xf − xm))^γ),
 *   γ 1.8–3.5 (own form; the factor has zero slope at the top, so the maximum stays where Considère puts it).
 * - Mild steel: a linear rise to a rounded upper yield point ReH, a fall of 3–10 % (cosine shaped, as fast as the
 *   machine's springback allows), an optional initial transient trough, a serrated Lüders plateau (saw-teeth of
 *   0.5–3 % of ReL, slightly sloping), then the law takes over where its engineering curve meets the plateau's last
 *   trough (its Lüders strain).
 * - Al-Mg: Portevin–Le Chatelier serrations on the hardening part, type A (regular saw-teeth) or type B (irregular),
 *   peak-to-trough 0.1–0.5 % of the stress, from a critical plastic strain of 0.4–2 % on to fracture.
 * - Elastic part: slope E; on some records a seating toe (0.01–0.3 % strain, smooth, ending at 5–20 % of the yield
 *   stress), on others a preload (the record starts at 1–5 % of the yield stress with the strain channel zeroed there,
 *   so the elastic line, extended, meets zero stress at a negative strain).
 *
 * Acquisition (common practice): samples uniform in TIME at a constant crosshead speed; the machine's compliance
 * adds s/K to the crosshead travel (E/K 1.5–9, our choice, so the specimen's strain rate in the elastic part is 2.5–10 times
 * lower than in the plastic part); 1,000–150,000 samples; on some records the crosshead speed is raised ×2–×10 after
 * the yield region or after 1–2 % plastic strain (ISO 6892-1 allows a change there, from memory); the flow stress
 * does not follow the rate. The extensometer stays on to fracture. Fracture falls over 1–3 samples, then 0–30
 * samples at zero load (noise only), the strain holding its last value or reading the elastic strain coming back.
 * Load noise 0.1–1 % of Rm, white or AR(1) (lag-1 correlation 0.3–0.9, acquisition filtering), on some records a slow
 * drift; strain noise 0.2–3 µε; load quantised to 0.05–2 MPa on some records, strain to 0.5–5 µε on some, on a few
 * of those the strain moving only in whole multiples of 2–3 resolution steps.
 *
 * noiseScale scales every random term (load noise, drift, strain noise). noiseScale = 0 gives the noise-free,
 * UNQUANTISED record (quantisation is applied only for noiseScale > 0), with the same curve and the same sampling;
 * `what` then drops the noise flags and says `noise-free`.
 *
 * Material families (values from memory unless marked; strengths in MPa, E in GPa, Ag and A − Ag in %)
 * | family            | share | E        | yield (Rp0.2, ReH) | Rm       | Rm/yield   | Ag     | A − Ag | s at fracture/Rm |
 * |-------------------|-------|----------|--------------------|----------|------------|--------|--------|------------------|
 * | mild steel (drop) | 37 %  | 200–210  | ReH 220–380        | –        | 1.25–1.65¹ | 15–30  | 8–16   | 0.60–0.85        |
 * | annealed copper   |  7 %  | 115–125  | 55–95              | 200–260  | 2.2–4.2    | 30–50  | 5–15   | 0.55–0.80        |
 * | annealed brass    |  5 %  | 110–115  | 95–150             | 290–370  | 2.2–3.6    | 35–50  | 5–12   | 0.60–0.80        |
 * | Al-Mg (5xxx-O)    | 10 %  | 68–71    | 85–150             | 190–320  | 1.7–2.6    | 14–25  | 1–5    | 0.85–0.97        |
 * | Al 6xxx-T6        |  5 %  | 68.5–71  | 240–300            | 265–340  | 1.06–1.2   | 5–10   | 2–6    | 0.80–0.93        |
 * | Al 3xxx-O         |  5 %  | 68–70.5  | 35–70              | 95–145   | 1.6–3.0    | 15–28  | 3–8    | 0.70–0.90        |
 * | austenitic stainl.| 10 %  | 190–200  | 250–350            | 550–750  | 1.7–2.9    | 40–60  | 3–10   | 0.75–0.92        |
 * | high-strength /   | 10 %  | 200–210  | 700–1400           | –        | 1.02–1.15  | 1.5–5  | 2–8    | 0.75–0.95        |
 * |   cold-drawn steel|       |          |                    |          |            |        |        |                  |
 * | dual-phase steel  | 11 %  | 200–210  | 300–600            | –        | 1.5–1.9    | 8–18   | 4–10   | 0.70–0.90        |
 * ¹ mild steel: Rm over the stress at the end of the Lüders plateau; drop (ReH − ReL)/ReH 3–10 %, Lüders plateau
 *   Ae 0.5–4 %, plateau serrations 0.5–3 % of ReL (from memory).
 *
 * Truth (ISO 6892-1 definitions, from memory, on the noise-free unquantised curve). The strain origin of every
 * reported elongation (the Rp0.2 offset line, Ag, A, Ae) is where the elastic line, extended, meets zero stress: after
 * a toe it lies to the right of the record's first sample, after a preload to its left (at −preload/E).
 * - E: the modulus the curve was built with (the slope of its straight elastic part).
 * - rp02: where the line of slope E through 0.2 % strain (from the origin above) meets the continuous noise-free curve.
 * - rm: the highest noise-free stress among the recorded samples (PLC serrations included; on a drop record the
 *   highest after work hardening begins, which is also the highest overall).
 * - agPct: plastic extension at maximum force, 100·(total strain at Fm − Rm/E), taken at the top of the
 *   serration-free curve (the Considère point); for a flat or serrated top that is the middle of the top (ISO 6892-1
 *   takes the middle of a plateau at maximum force, from memory).
 * - aPct: 100·(strain of the last loaded sample before the fracture fall − its stress/E), from the origin above.
 * - reH: the highest noise-free sample before the drop (when sparse sampling stepped over the upper yield point so
 *   that no sample stands 0.5 % above ReL: the curve's own peak, and `what` says `peak not caught`).
 * - reL: the lowest noise-free sample on the plateau after the initial transient (the fall and the first trough, up
 *   to the first plateau peak, are left out).
 * - aePct: 100·(strain where uniform hardening begins, i.e. the plateau's last trough, − strain at the upper yield
 *   point of the curve).
 * - serration: largest peak-to-trough of the plateau (after the transient) over ReL; for PLC records the largest
 *   peak-to-trough of the serrations as a fraction of the stress; 0 otherwise.
 * - elasticPoints: recorded samples on the rise, past the toe (or from the first sample), below 0.9 of the yield
 *   stress (ReH for a drop, Rp0.2 otherwise).
 * - dropEvidence: √Σ(sᵢ − ReL)² over the noise-free samples of the rise, top and fall above ReL, over the load noise
 *   sd at this noiseScale (the marginal sd of the white or AR(1) noise, with a quantisation step q adding q²/12 to
 *   the variance; drift left out); +Infinity at noiseScale 0; null when there is no drop.
 * - rateRatio: the crosshead speed ratio after the change (1 when none).
 */
import type { HoldoutRecordLike, HoldoutTruthLike } from './holdout-tally.js';

/* ------------------------------------------------------------------ seeded random numbers */

function mix(seed: number, stream: number): number {
  let h = Math.imul(seed ^ 0x5bd1e995, 0x9e3779b1) ^ Math.imul(stream + 0x27d4eb2f, 0x85ebca6b);
  h ^= h >>> 15; h = Math.imul(h, 0xc2b2ae35); h ^= h >>> 13; h = Math.imul(h, 0x27d4eb2f); h ^= h >>> 16;
  return h >>> 0;
}

/** mulberry32 with Box–Muller normals. */
class Dice {
  private a: number;
  private spare: number | null = null;
  constructor(seed: number) { this.a = seed | 0; }
  next(): number {
    this.a = (this.a + 0x6d2b79f5) | 0;
    let t = Math.imul(this.a ^ (this.a >>> 15), 1 | this.a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  }
  uni(lo: number, hi: number): number { return lo + (hi - lo) * this.next(); }
  logUni(lo: number, hi: number): number { return lo * Math.pow(hi / lo, this.next()); }
  int(lo: number, hi: number): number { return lo + Math.floor(this.next() * (hi - lo + 1)); }
  chance(p: number): boolean { return this.next() < p; }
  pick<T>(xs: readonly T[]): T { return xs[Math.floor(this.next() * xs.length)]!; }
  gauss(): number {
    if (this.spare !== null) { const g = this.spare; this.spare = null; return g; }
    let u = this.next();
    while (u <= 1e-300) u = this.next();
    const v = this.next();
    const r = Math.sqrt(-2 * Math.log(u));
    this.spare = r * Math.sin(2 * Math.PI * v);
    return r * Math.cos(2 * Math.PI * v);
  }
}

/* ------------------------------------------------------------------ families and laws */

type LawKind = 'swift' | 'voce' | 'ludwik' | 'hockett-sherby' | 'voce+linear' | 'swift+voce';
type Range = readonly [number, number];

interface Family {
  key: string; share: number; E: Range;
  /** Rp0.2 (continuous) or ReH (drop), MPa. */
  yieldStress: Range;
  rm?: Range; ratio: Range; ag: Range; neck: Range; fracture: Range;
  laws: readonly LawKind[];
  /** Depth of the gradual elastic–plastic transition (fraction of the law's starting stress) and its strain scale. */
  micro: Range; microLen: Range;
  drop?: boolean; plc?: boolean;
}

const GPA = 1000;
const FAMILIES: readonly Family[] = [
  { key: 'mild-steel', share: 0.37, E: [200 * GPA, 210 * GPA], yieldStress: [220, 380], ratio: [1.25, 1.65], ag: [15, 30], neck: [8, 16], fracture: [0.6, 0.85],
    laws: ['swift', 'ludwik', 'voce', 'hockett-sherby', 'voce+linear'], micro: [0, 0], microLen: [1e-4, 1e-4], drop: true },
  { key: 'annealed-copper', share: 0.07, E: [115 * GPA, 125 * GPA], yieldStress: [55, 95], rm: [200, 260], ratio: [2.2, 4.2], ag: [30, 50], neck: [5, 15], fracture: [0.55, 0.8],
    laws: ['swift', 'ludwik', 'voce+linear', 'hockett-sherby'], micro: [0.2, 0.45], microLen: [1e-4, 8e-4] },
  { key: 'annealed-brass', share: 0.05, E: [110 * GPA, 115 * GPA], yieldStress: [95, 150], rm: [290, 370], ratio: [2.2, 3.6], ag: [35, 50], neck: [5, 12], fracture: [0.6, 0.8],
    laws: ['swift', 'ludwik', 'voce+linear'], micro: [0.15, 0.4], microLen: [1e-4, 6e-4] },
  { key: 'al-mg', share: 0.10, E: [68 * GPA, 71 * GPA], yieldStress: [85, 150], rm: [190, 320], ratio: [1.7, 2.6], ag: [14, 25], neck: [1, 5], fracture: [0.85, 0.97],
    laws: ['voce', 'hockett-sherby', 'swift', 'ludwik', 'voce+linear'], micro: [0.1, 0.3], microLen: [5e-5, 4e-4], plc: true },
  { key: 'al-6xxx-t6', share: 0.05, E: [68.5 * GPA, 71 * GPA], yieldStress: [240, 300], rm: [265, 340], ratio: [1.06, 1.2], ag: [5, 10], neck: [2, 6], fracture: [0.8, 0.93],
    laws: ['voce', 'hockett-sherby', 'swift'], micro: [0.15, 0.35], microLen: [5e-5, 3e-4] },
  { key: 'al-3xxx-o', share: 0.05, E: [68 * GPA, 70.5 * GPA], yieldStress: [35, 70], rm: [95, 145], ratio: [1.6, 3.0], ag: [15, 28], neck: [3, 8], fracture: [0.7, 0.9],
    laws: ['voce', 'swift', 'ludwik', 'hockett-sherby'], micro: [0.15, 0.4], microLen: [1e-4, 6e-4] },
  { key: 'austenitic', share: 0.10, E: [190 * GPA, 200 * GPA], yieldStress: [250, 350], rm: [550, 750], ratio: [1.7, 2.9], ag: [40, 60], neck: [3, 10], fracture: [0.75, 0.92],
    laws: ['voce+linear', 'ludwik', 'swift', 'swift+voce'], micro: [0.15, 0.35], microLen: [1e-4, 5e-4] },
  { key: 'hs-steel', share: 0.10, E: [200 * GPA, 210 * GPA], yieldStress: [700, 1400], ratio: [1.02, 1.15], ag: [1.5, 5], neck: [2, 8], fracture: [0.75, 0.95],
    laws: ['voce', 'hockett-sherby', 'swift', 'swift+voce'], micro: [0.2, 0.45], microLen: [3e-5, 2e-4] },
  { key: 'dp-steel', share: 0.11, E: [200 * GPA, 210 * GPA], yieldStress: [300, 600], ratio: [1.5, 1.9], ag: [8, 18], neck: [4, 10], fracture: [0.7, 0.9],
    laws: ['swift', 'hockett-sherby', 'swift+voce', 'ludwik'], micro: [0.15, 0.4], microLen: [5e-5, 4e-4] },
];

/** b above which (1 + b)·e^(−b·eu) < 1 (Voce can meet Considère at eu only below it). */
function voceLimit(eu: number): number {
  const phi = (b: number) => Math.log1p(b) - b * eu;
  let lo = Math.max(1e-9, 1 / eu - 1), hi = lo + 10;
  while (phi(hi) > 0) hi *= 2;
  for (let i = 0; i < 80; i++) { const m = (lo + hi) / 2; if (phi(m) > 0) lo = m; else hi = m; }
  return lo;
}

/** Voce in units of σ0 with Considère at eu, plus a linear term h·x (h = 0: plain Voce). */
function voceUnit(eu: number, d: Dice, h: number): ((x: number) => number) | null {
  const b = d.uni(0.15, 0.92) * voceLimit(eu);
  const den = (1 + b) * Math.exp(-b * eu) - 1;
  const num = 1 - h * (1 - eu);
  if (!(den > 0) || !(num > 0)) return null;
  const q = num / den;
  return (x) => 1 + q * (1 - Math.exp(-b * x)) + h * x;
}

/** A law in arbitrary stress units whose engineering curve peaks (Considère) at true plastic strain eu. */
function makeLaw(kind: LawKind, eu: number, d: Dice): ((x: number) => number) | null {
  switch (kind) {
    case 'swift': {
      const x0 = d.logUni(1e-5, 0.03), n = eu + x0, c = x0 + eu;
      return (x) => Math.pow((x0 + x) / c, n);
    }
    case 'ludwik': {
      const n = d.uni(eu + 0.03, Math.min(0.95, eu + 0.55));
      if (!(n > eu + 0.01)) return null;
      const k = 1 / (Math.pow(eu, n - 1) * (n - eu));
      return (x) => 1 + k * Math.pow(x, n);
    }
    case 'voce': return voceUnit(eu, d, 0);
    case 'voce+linear': return voceUnit(eu, d, d.uni(0.05, 0.85) / (1 - eu));
    case 'hockett-sherby': {
      const pLo = Math.max(0.4, eu + 0.05);
      if (pLo >= 0.95) return null;
      const p = d.uni(pLo, 0.95);
      // y = N·eu^p must satisfy p·y/eu > e^y − 1.
      const psi = (y: number) => (p * y) / eu - Math.expm1(y);
      let lo = Math.log(p / eu), hi = lo + 1;
      while (psi(hi) > 0) hi *= 2;
      for (let i = 0; i < 80; i++) { const m = (lo + hi) / 2; if (psi(m) > 0) lo = m; else hi = m; }
      const y = d.uni(0.15, 0.92) * lo, N = y / Math.pow(eu, p), ey = Math.exp(-y);
      const den = (p / eu) * y * ey - 1 + ey;
      if (!(den > 0)) return null;
      const D = 1 / den;
      return (x) => 1 + D * (1 - Math.exp(-N * Math.pow(x, p)));
    }
    case 'swift+voce': {
      const x0 = d.logUni(1e-4, 0.02), n = eu + x0, c = x0 + eu;
      const v = voceUnit(eu, d, 0);
      if (!v) return null;
      const w = d.uni(0.3, 0.7), v1 = v(eu);
      return (x) => w * Math.pow((x0 + x) / c, n) + (1 - w) * v(x) / v1;
    }
  }
}

/** Maximum of sig(x)·e^(−x) over [lo, hi]: grid, then golden section. NaN when it sits at the end. */
function engineeringTop(sig: (x: number) => number, lo: number, hi: number): number {
  const n = 500;
  let best = -Infinity, bi = 0;
  const xs: number[] = [];
  for (let i = 0; i <= n; i++) {
    const x = lo + (hi - lo) * (i / n) * (i / n);
    xs.push(x);
    const v = sig(x) * Math.exp(-x);
    if (v > best) { best = v; bi = i; }
  }
  if (bi === 0 || bi === n) return NaN;
  let a = xs[bi - 1]!, b = xs[bi + 1]!;
  const g = (Math.sqrt(5) - 1) / 2;
  const f = (x: number) => sig(x) * Math.exp(-x);
  let c = b - g * (b - a), dd = a + g * (b - a), fc = f(c), fd = f(dd);
  for (let i = 0; i < 100; i++) {
    if (fc > fd) { b = dd; dd = c; fd = fc; c = b - g * (b - a); fc = f(c); }
    else { a = c; c = dd; fc = fd; dd = a + g * (b - a); fd = f(dd); }
  }
  return (a + b) / 2;
}

/** Cosine interpolation through knots (zero slope at every knot). */
function cosKnots(xs: readonly number[], vs: readonly number[], x: number): number {
  const n = xs.length;
  if (x <= xs[0]!) return vs[0]!;
  if (x >= xs[n - 1]!) return vs[n - 1]!;
  let lo = 0, hi = n - 1;
  while (hi - lo > 1) { const m = (lo + hi) >> 1; if (xs[m]! <= x) lo = m; else hi = m; }
  const u = (x - xs[lo]!) / (xs[hi]! - xs[lo]!);
  return vs[lo]! + (vs[hi]! - vs[lo]!) * (1 - Math.cos(Math.PI * u)) / 2;
}

/* ------------------------------------------------------------------ the curve as pieces */

interface Piece {
  kind: 'elastic' | 'top' | 'fall' | 'plateau' | 'flow';
  a: number; b: number;
  /** [strain from the ISO origin, stress] at local parameter p. */
  at: (p: number) => [number, number];
  grid: number[];
}

function linGrid(a: number, b: number, n: number): number[] {
  const g: number[] = [];
  for (let i = 0; i <= n; i++) g.push(a + (b - a) * (i / n));
  return g;
}

/** The record the generator builds, before noise. */
interface Built {
  pieces: Piece[]; E: number; K: number; offset: number; what: string[];
  rp02: number; agPct: number; xRate: number | null; rate: number;
  yieldForCount: number | null; toeEnd: number;
  drop: null | { ePeak: number; eL: number; firstPeakE: number; serrationAbs: number; };
  plcAmp: number;
}

function buildCurve(seed: number, d: Dice): Built {
  // Family.
  let u = d.next(), fam = FAMILIES[FAMILIES.length - 1]!;
  for (const f of FAMILIES) { if (u < f.share) { fam = f; break; } u -= f.share; }
  const E = d.uni(fam.E[0], fam.E[1]);
  let K = E / d.uni(1.5, 9);
  const what: string[] = [fam.key];
  const startKind = d.next();
  const toe = startKind < 0.3, preload = !toe && startKind < 0.5;
  const rateChange = d.chance(0.25);
  const rate = rateChange ? Math.round(d.uni(2, 10) * 10) / 10 : 1;
  const gamma = d.uni(1.8, 3.5), rho = d.uni(fam.fracture[0], fam.fracture[1]);
  const neckPts = d.uni(fam.neck[0], fam.neck[1]);

  // Drop records: the yield region first (it fixes where the law must start).
  let dropPlan: null | {
    reH: number; sK: number; eK: number; eP: number; delta: number; eF: number; eL: number; xL: number; lEnd: number;
    knotE: number[]; knotS: number[]; firstPeakE: number; serrationAbs: number;
  } = null;
  if (fam.drop) {
    const reH = d.uni(fam.yieldStress[0], fam.yieldStress[1]);
    const drop = d.uni(0.03, 0.10);
    const kappa = d.uni(0.002, 0.015);
    const reLd = reH * (1 - drop);
    const transient = d.chance(0.4) ? 0 : d.uni(0.002, 0.015);
    const T = reLd * (1 - transient);
    const sK = reH * (1 - kappa), eK = sK / E, eP = eK + 2 * (reH - sK) / E;
    const delta = d.uni(1.15, 2) * (Math.PI / 2) * (reH - T) / K;
    let ae = d.uni(0.005, 0.04);
    if (delta > 0.4 * ae) ae = delta / 0.4;
    const eF = eP + delta, eL = eP + ae, len = eL - eF;
    const amp = d.uni(0.005, Math.min(0.03, 0.6 * drop));
    const slope = d.uni(-0.008, 0.012);
    const wantTeeth = d.int(3, 30);
    const fallW = 1.4 * (Math.PI / 2) * amp * reLd / K;
    const teeth = Math.max(1, Math.min(wantTeeth, Math.floor(len / (2.2 * fallW))));
    const w = len / teeth;
    const knotE: number[] = [eF], knotS: number[] = [T];
    const troughs: number[] = [], peaks: number[] = [];
    for (let j = 0; j < teeth; j++) {
      const e0 = eF + j * w;
      const fw = Math.min(0.5 * w, fallW * d.uni(1, 1.6));
      const frac = (e0 + w - eF) / len;
      const base = reLd * (1 + slope * (frac - 0.5) + d.uni(0, 0.3) * amp);
      const a = (j === teeth - 1 ? 1 : d.uni(0.4, 1)) * amp * reLd;
      knotE.push(e0 + w - fw); peaks.push(knotS.length); knotS.push(base + a);
      knotE.push(e0 + w); troughs.push(knotS.length); knotS.push(base);
    }
    // The lowest plateau trough is ReL (design); no plateau peak reaches near ReH.
    let minT = Infinity;
    for (const i of troughs) minT = Math.min(minT, knotS[i]!);
    for (let i = 1; i < knotS.length; i++) knotS[i] = knotS[i]! * (reLd / minT);
    for (const i of peaks) knotS[i] = Math.min(knotS[i]!, reH * (1 - 0.3 * drop));
    let serrationAbs = 0;
    for (let i = 2; i < knotS.length; i++) serrationAbs = Math.max(serrationAbs, Math.abs(knotS[i]! - knotS[i - 1]!));
    const lEnd = knotS[knotS.length - 1]!;
    const xL = Math.log(1 + eL - lEnd / E);
    dropPlan = { reH, sK, eK, eP, delta, eF, eL, xL, lEnd, knotE, knotS, firstPeakE: knotE[1]!, serrationAbs };
    what.push('drop');
  }

  // The law (rejection until the family's Ag and Rm ratio come out).
  let sig: ((x: number) => number) | null = null, lawName = '', xm = NaN, scale = 1;
  let rpTarget = 0;
  // The law is drawn first and kept for up to 600 shapes, so each law of a family is about equally common.
  let kind = d.pick(fam.laws);
  for (let tryNo = 0; tryNo < 6000 && !sig; tryNo++) {
    if (tryNo > 0 && tryNo % 600 === 0) kind = d.pick(fam.laws);
    const agT = d.uni(fam.ag[0], fam.ag[1]);
    const eu = Math.log1p(agT / 100);
    const law = makeLaw(kind, eu, d);
    const dep = d.uni(fam.micro[0], fam.micro[1]), lam = d.logUni(fam.microLen[0], fam.microLen[1]), mm = d.uni(0.4, 0.7);
    if (!law) continue;
    const D = dep * law(0);
    const s = (x: number) => law(x) - D * Math.exp(-Math.pow(x / lam, mm));
    if (dropPlan) {
      const x = engineeringTop(s, dropPlan.xL, 1.5);
      if (!Number.isFinite(x) || x < dropPlan.xL + 0.04) continue;
      const ag = Math.expm1(x) * 100;
      if (ag < fam.ag[0] || ag > fam.ag[1]) continue;
      const ratio = (s(x) * Math.exp(-x)) / (s(dropPlan.xL) * Math.exp(-dropPlan.xL));
      if (ratio < fam.ratio[0] || ratio > fam.ratio[1]) continue;
      const sc = dropPlan.lEnd / (s(dropPlan.xL) * Math.exp(-dropPlan.xL));
      if (sc * s(x) * Math.exp(-x) < 1.1 * dropPlan.reH) continue;
      sig = s; xm = x; scale = sc; lawName = kind;
    } else {
      const rp = d.uni(fam.yieldStress[0], fam.yieldStress[1]);
      const lo = Math.max(fam.ratio[0], fam.rm ? fam.rm[0] / rp : 0), hi = Math.min(fam.ratio[1], fam.rm ? fam.rm[1] / rp : Infinity);
      if (!(lo < hi)) continue;
      const x = engineeringTop(s, 0, 1.5);
      if (!Number.isFinite(x)) continue;
      const ag = Math.expm1(x) * 100;
      if (ag < fam.ag[0] || ag > fam.ag[1]) continue;
      const rpUnit = s(Math.log(1.002)) / 1.002;
      const ratio = (s(x) * Math.exp(-x)) / rpUnit;
      if (ratio < lo || ratio > hi) continue;
      if (s(0) < 0.4 * rpUnit) continue; // proportional limit at least 0.4 Rp0.2
      sig = s; xm = x; scale = rp / rpUnit; lawName = kind; rpTarget = rp;
    }
  }
  if (!sig) throw new Error(`holdout-d ${seed}: no law found for ${fam.key}`);
  what.push(lawName);
  const law = sig;
  const sSmooth = (x: number) => scale * law(x) * Math.exp(-x);
  const rmSmooth = sSmooth(xm);
  const agPct = Math.expm1(xm) * 100;
  const xF = Math.log1p((agPct + neckPts) / 100);
  const beta = Math.min(0.9, Math.max(0.03, 1 - (rho * rmSmooth) / sSmooth(xF)));
  const neck = (x: number) => (x <= xm ? 1 : 1 - beta * Math.pow((x - xm) / (xF - xm), gamma));

  // Portevin–Le Chatelier serrations (fractions of the stress), cosine between knots in plastic strain.
  const plcX: number[] = [], plcV: number[] = [];
  let plcAmp = 0;
  if (fam.plc) {
    const typeA = d.chance(0.5);
    const amp = d.uni(0.001, 0.005);
    const xc = Math.min(d.uni(0.004, 0.02), 0.6 * xm);
    const period = typeA ? d.uni(0.003, 0.012) : d.uni(0.001, 0.004);
    const minFall = 2.5 * (Math.PI / 2) * amp * rmSmooth / K;
    plcX.push(xc); plcV.push(0);
    let x = xc, up = true, prev = 0;
    while (x < xF + period) {
      const grow = 0.5 + 0.5 * Math.min(1, (x - xc) / Math.max(1e-9, xm - xc));
      const a = amp * grow * (typeA ? d.uni(0.85, 1) : d.uni(0.3, 1));
      const v = up ? a / 2 : -a / 2;
      const full = typeA ? period : period * d.uni(0.4, 1.6);
      const width = up ? Math.max(full * (typeA ? 0.8 : 0.6), minFall) : Math.max(full * (typeA ? 0.2 : 0.4), minFall * d.uni(1, 1.5));
      x += width; plcX.push(x); plcV.push(v);
      plcAmp = Math.max(plcAmp, Math.abs(v - prev)); prev = v; up = !up;
    }
    what.push(typeA ? 'plc-A' : 'plc-B');
  }
  const plc = (x: number) => (plcX.length && x > plcX[0]! ? cosKnots(plcX, plcV, x) : 0);

  // Elastic start: toe or preload.
  const yieldForCount = dropPlan ? dropPlan.reH : rpTarget;
  let t0 = 0, sT = 0, s0 = 0, offset = 0;
  if (toe) {
    t0 = d.logUni(1e-4, 3e-3); sT = d.uni(0.05, 0.2) * yieldForCount; offset = t0; what.push('toe');
  } else if (preload) {
    s0 = d.uni(0.01, 0.05) * yieldForCount; offset = -s0 / E; what.push('preload');
  }
  const toeStrain = (s: number) => (s < sT ? t0 * (1 - s / sT) * (1 - s / sT) : 0);
  const pieces: Piece[] = [];
  const elasticEnd = dropPlan ? dropPlan.sK : scale * law(0);
  const elasticGrid = linGrid(s0, elasticEnd, 100);
  if (toe) for (let i = 1; i < 60; i++) elasticGrid.push(s0 + (sT - s0) * i / 60);
  elasticGrid.sort((a, b) => a - b);
  pieces.push({ kind: 'elastic', a: s0, b: elasticEnd, at: (s) => [s / E - toeStrain(s), s], grid: elasticGrid });
  const flow = (x: number): [number, number] => {
    const s = sSmooth(x) * neck(x) * (1 + plc(x));
    return [Math.expm1(x) + s / E, s];
  };
  const flowGrid = (x0: number): number[] => {
    const g: number[] = [];
    const n = 4000;
    for (let i = 0; i <= n; i++) g.push(x0 + (xF - x0) * (i / n) * (i / n));
    for (let i = 0; i + 1 < plcX.length; i++) for (let k = 0; k < 8; k++) { const x = plcX[i]! + (plcX[i + 1]! - plcX[i]!) * k / 8; if (x > x0 && x < xF) g.push(x); }
    g.sort((a, b) => a - b);
    return g;
  };
  if (dropPlan) {
    const P = dropPlan;
    pieces.push({ kind: 'top', a: 0, b: 1, grid: linGrid(0, 1, 40), at: (v) => [P.eK + v * (P.eP - P.eK), P.reH - (P.reH - P.sK) * (1 - v) * (1 - v)] });
    const T = P.knotS[0]!;
    pieces.push({ kind: 'fall', a: 0, b: 1, grid: linGrid(0, 1, 40), at: (v) => [P.eP + v * P.delta, P.reH + (T - P.reH) * (1 - Math.cos(Math.PI * v)) / 2] });
    const pg: number[] = [];
    for (let i = 0; i + 1 < P.knotE.length; i++) for (let k = 0; k < 16; k++) pg.push(P.knotE[i]! + (P.knotE[i + 1]! - P.knotE[i]!) * k / 16);
    pg.push(P.eL);
    pieces.push({ kind: 'plateau', a: P.eF, b: P.eL, grid: pg, at: (e) => [e, cosKnots(P.knotE, P.knotS, e)] });
    pieces.push({ kind: 'flow', a: P.xL, b: xF, grid: flowGrid(P.xL), at: flow });
  } else {
    pieces.push({ kind: 'flow', a: 0, b: xF, grid: flowGrid(0), at: flow });
  }

  // The machine: stiff enough that no falling part of the curve outruns the crosshead (no snap-back).
  let steepest = 0;
  for (const pc of pieces) {
    let prev: [number, number] | null = null;
    for (const p of pc.grid) {
      const cur = pc.at(p);
      if (prev && cur[0] > prev[0]) steepest = Math.max(steepest, -(cur[1] - prev[1]) / (cur[0] - prev[0]));
      prev = cur;
    }
  }
  K = Math.max(K, 1.8 * steepest);

  // Rp0.2: where strain − s/E − 0.002 (from the ISO origin) changes sign, by bisection on the first piece that reaches it.
  let rp02 = NaN;
  for (const pc of pieces) {
    const g = (p: number) => { const [e, s] = pc.at(p); return e - s / E - 0.002; };
    if (g(pc.b) < 0) continue;
    let lo = pc.a, hi = pc.b;
    for (let i = 0; i < 200; i++) { const m = (lo + hi) / 2; if (g(m) < 0) lo = m; else hi = m; }
    rp02 = pc.at((lo + hi) / 2)[1];
    break;
  }

  let xRate: number | null = null;
  if (rateChange) {
    if (dropPlan) xRate = Math.min(dropPlan.xL + d.uni(0.002, 0.01), dropPlan.xL + 0.7 * (xm - dropPlan.xL));
    else xRate = Math.max(Math.log(1.004), Math.min(Math.log1p(d.uni(0.01, 0.02)), Math.log1p(0.6 * agPct / 100)));
    what.push(`rate x${rate}`);
  }

  return {
    pieces, E, K, offset, what, rp02, agPct, xRate, rate, yieldForCount: dropPlan ? null : rpTarget,
    toeEnd: toe ? sT : s0,
    drop: dropPlan ? { ePeak: dropPlan.eP, eL: dropPlan.eL, firstPeakE: dropPlan.firstPeakE, serrationAbs: dropPlan.serrationAbs } : null,
    plcAmp,
  };
}

/* ------------------------------------------------------------------ the record */

/** An INVENTED tensile record (engineering strain, engineering stress in MPa) with its truth; see the header. */
export function holdoutDRecord(seed: number, noiseScale = 1): HoldoutRecordLike {
  const d = new Dice(mix(seed, 1));
  const c = buildCurve(seed, d);
  const { pieces, E, K, offset } = c;

  // Dense table of the crosshead travel X = strain + s/K along the curve.
  const tp: number[] = [], tpc: number[] = [], tx: number[] = [];
  for (let k = 0; k < pieces.length; k++) {
    const pc = pieces[k]!;
    for (const p of pc.grid) {
      const [e, s] = pc.at(p);
      const X = e + offset + s / K;
      if (tx.length && X < tx[tx.length - 1]! - 1e-15) throw new Error(`holdout-d ${seed}: crosshead travel not monotone`);
      tp.push(p); tpc.push(k); tx.push(X);
    }
  }
  const X0 = tx[0]!, Xend = tx[tx.length - 1]!;
  let Xc = Xend;
  if (c.xRate !== null) {
    const fl = pieces[pieces.length - 1]!;
    const [e, s] = fl.at(c.xRate);
    Xc = e + offset + s / K;
  }
  const tC = Xc - X0, tTotal = tC + (Xend - Xc) / c.rate;

  // Acquisition plan (drawn before any noise, so noiseScale does not move the sampling).
  const nTotal = Math.round(d.logUni(1000, 150000));
  const nFall = d.int(1, 3), nTail = d.int(0, 30);
  const springBack = d.chance(0.5);
  const fallFrac = nFall === 1 ? [d.uni(0.02, 0.5)] : nFall === 2 ? [d.uni(0.3, 0.7), d.uni(0.02, 0.2)] : [d.uni(0.6, 0.85), d.uni(0.25, 0.5), d.uni(0.02, 0.1)];
  const loadSd = d.uni(0.001, 0.01);
  const ar = d.chance(0.4) ? d.uni(0.3, 0.9) : 0;
  const drift = d.chance(0.2) ? { amp: d.uni(0.0005, 0.002), f: d.uni(0.3, 1.5), ph: d.uni(0, 2 * Math.PI) } : null;
  const strainSd = d.uni(0.2e-6, 3e-6);
  const qStress = d.chance(0.35) ? d.logUni(0.05, 2) : 0;
  const qStrain = d.chance(0.3) ? d.logUni(0.5e-6, 5e-6) : 0;
  const strainStep = qStrain > 0 && d.chance(1 / 3) ? d.int(2, 3) : 1;
  const strainStepPhase = strainStep > 1 ? d.int(1, strainStep - 1) : 0;

  const nLoaded = nTotal - nFall - nTail;
  const dt = tTotal / (nLoaded - 1);
  const n = nLoaded + nFall + nTail;
  const eNF = new Float64Array(n), sNF = new Float64Array(n), pieceOf = new Int32Array(n);
  let j = 0;
  for (let k = 0; k < nLoaded; k++) {
    let pc: number, p: number;
    if (k === nLoaded - 1) { pc = pieces.length - 1; p = pieces[pc]!.b; }
    else {
      const t = k * dt;
      const X = t <= tC ? X0 + t : Xc + (t - tC) * c.rate;
      while (j + 2 < tx.length && tx[j + 1]! < X) j++;
      const xa = tx[j]!, xb = tx[j + 1]!;
      if (tpc[j] === tpc[j + 1] && xb > xa) { pc = tpc[j]!; p = tp[j]! + (tp[j + 1]! - tp[j]!) * Math.min(1, Math.max(0, (X - xa) / (xb - xa))); }
      else { pc = tpc[j + 1]!; p = tp[j + 1]!; }
    }
    const [e, s] = pieces[pc]!.at(p);
    eNF[k] = e + offset; sNF[k] = s; pieceOf[k] = pc;
  }
  const last = nLoaded - 1;
  const eLast = eNF[last]!, sLast = sNF[last]!;
  for (let i = 0; i < nFall + nTail; i++) {
    const s = i < nFall ? sLast * fallFrac[i]! : 0;
    sNF[nLoaded + i] = s;
    eNF[nLoaded + i] = springBack ? eLast - (sLast - s) / E : eLast;
    pieceOf[nLoaded + i] = -1;
  }

  // Truth.
  let rm = -Infinity;
  const kindOf = (i: number) => (pieceOf[i]! >= 0 ? pieces[pieceOf[i]!]!.kind : 'after');
  for (let i = 0; i < nLoaded; i++) if (kindOf(i) === 'flow' && sNF[i]! > rm) rm = sNF[i]!;
  const aPct = 100 * (eLast - offset - sLast / E);
  let reH: number | null = null, reL: number | null = null, aePct: number | null = null, serration = 0;
  let dropEvidence: number | null = null, notCaught = false;
  const noiseVar = (noiseScale * loadSd * rm) ** 2 + (noiseScale > 0 && qStress > 0 ? qStress * qStress / 12 : 0);
  if (c.drop) {
    let h = -Infinity, l = Infinity;
    for (let i = 0; i < nLoaded; i++) {
      const kd = kindOf(i);
      if (kd === 'elastic' || kd === 'top' || kd === 'fall') h = Math.max(h, sNF[i]!);
      if (kd === 'plateau' && eNF[i]! - offset >= c.drop.firstPeakE) l = Math.min(l, sNF[i]!);
    }
    if (!Number.isFinite(l)) l = c.pieces[3]!.at(c.drop.eL)[1];
    // Sparse sampling can step over the upper yield point altogether; the record then shows no drop to speak of, and
    // the curve's own peak is given (flagged, so either reading is accepted).
    if (h < l * 1.005) { h = c.pieces[1]!.at(1)[1]; notCaught = true; }
    reH = h; reL = l;
    aePct = 100 * (c.drop.eL - c.drop.ePeak);
    serration = c.drop.serrationAbs / l;
    let sum = 0;
    for (let i = 0; i < nLoaded; i++) {
      const kd = kindOf(i);
      if ((kd === 'elastic' || kd === 'top' || kd === 'fall') && sNF[i]! > l) sum += (sNF[i]! - l) ** 2;
    }
    dropEvidence = noiseVar > 0 ? Math.sqrt(sum) / Math.sqrt(noiseVar) : Number.POSITIVE_INFINITY;
  } else if (c.plcAmp > 0) serration = c.plcAmp;
  const Y = reH ?? c.yieldForCount!;
  let elasticPoints = 0;
  for (let i = 0; i < nLoaded; i++) {
    if (sNF[i]! >= 0.9 * Y) break;
    if (sNF[i]! >= c.toeEnd) elasticPoints++;
  }
  const truth: HoldoutTruthLike = {
    E, rp02: c.rp02, rm, agPct: c.agPct, aPct, reH, reL, aePct, serration, elasticPoints, dropEvidence, rateRatio: c.rate,
  };

  // Noise, drift and resolution (a separate stream: the same curve and sampling at every noiseScale).
  const z = new Dice(mix(seed, 2));
  const strain = new Float64Array(n), stress = new Float64Array(n);
  const sdL = loadSd * rm, innov = Math.sqrt(1 - ar * ar);
  let arState = z.gauss();
  for (let i = 0; i < n; i++) {
    if (i > 0) arState = ar > 0 ? ar * arState + innov * z.gauss() : z.gauss();
    const zs = z.gauss();
    let s = sNF[i]! + noiseScale * sdL * arState;
    if (drift) { const tt = i / (n - 1); s += noiseScale * drift.amp * rm * (Math.sin(2 * Math.PI * drift.f * tt + drift.ph) - Math.sin(drift.ph)); }
    let e = eNF[i]! + noiseScale * strainSd * zs;
    if (noiseScale > 0) {
      if (qStress > 0) s = Math.round(s / qStress) * qStress;
      if (qStrain > 0) {
        const step = qStrain * strainStep, base = qStrain * strainStepPhase;
        e = base + Math.round((e - base) / step) * step;
      }
    }
    strain[i] = e; stress[i] = s;
  }

  const flags = [...c.what];
  if (notCaught) flags.push('peak not caught');
  if (noiseScale > 0) {
    if (ar > 0) flags.push(`ar-noise ${ar.toFixed(2)}`);
    if (drift) flags.push('drift');
    if (qStress > 0) flags.push(`quantised ${qStress.toFixed(2)}MPa`);
    if (qStrain > 0) flags.push(strainStep > 1 ? `strain-steps ${strainStep}x${(qStrain * 1e6).toFixed(1)}µε` : `strain-q ${(qStrain * 1e6).toFixed(1)}µε`);
  } else flags.push('noise-free');
  flags.push(`n=${n}`);
  return { strain, stress, truth, what: `holdout-d ${seed} ${flags.join(' ')}` };
}
