import { describe, expect, it } from 'vitest';
import { analyzeRecord, synthesizeLabRecord, xoshiro128ss } from '../../../src/core/index.js';
import { expectRelClose } from '../../helpers.js';
import { labCase } from './lab-records.helpers.js';

// Property test over seeded INVENTED lab-style records (synthesizeLabRecord, cases from labCase: Swift — that is
// Hollomon with a strain offset —, Voce, Ludwik and Hockett–Sherby laws; 1,000–100,000 points log-uniform,
// uniform in time, so the elastic rise holds only a handful to a few hundred samples; white noise of 0.1–1 % of
// Rm; toes; yield drops of 3–10 % with Lüders plateaus of 0.5–3 % strain, serrations up to 3 % of ReL at periods
// from a fifth of the sample spacing to 50 spacings, and undershoot transients). The truth is the noise-free
// curve's own Rp0.2, Rm, Ag, A, ReH, ReL and Ae by the ISO 6892-1 definitions (computed by the generator). The
// tolerances are the ones issue 12 sets (Rp0.2 1 %, Rm 0.4 %, Ag 0.4 point, A 0.5 point, ReH/ReL 1.5 %, Ae 0.4
// point).
//
// A miss is accepted only where the record itself cannot support the property within its tolerance and the
// analysis says so — each acceptance below states what shows that the information is not in the data:
// - E refused (exit 2, naming elasticModulus and --modulus) only with ≤ 8 samples on the elastic rise; rerun with
//   the modulus given, as a user would.
// - ReH off by more than 1.5 % only with the `uncertainReH` warning, a range wider than ±1.5 % that holds the truth
//   (the peak fell between two samples whose line values differ by more than the tolerance, or within the noise).
// - Rp0.2 off by more than 1 % only with the `uncertainRp` warning and a range wider than ±1 % holding the truth: the
//   offset line meets a serrated plateau wherever the serrations are when it crosses (the band they sweep is wider
//   than ±1 %), or the few noisy samples near the offset point and a coarse elastic line place the crossing no closer
//   (its 95 % interval from the local fit and the elastic line's own error is wider than ±1 %).
// - Ag off by more than 0.4 point only with `uncertainAg` and a 95 % interval wider than ±0.4 point that holds it.
// - A recorded yield drop may go unreported only when its evidence — √Σ(sᵢ − ReL)²/σ over the noise-free samples of
//   the rise above ReL, the signal-to-noise ratio of the best test that knows the drop's shape (matched filter) —
//   is below 6: a test that keeps continuous curves free of false yield points (threshold about 3.7σ at a false-
//   alarm rate of 10⁻⁴ per record) finds a drop of evidence 6 with probability ≥ 99 % and one of evidence 4 only
//   about half the time.
const SEEDS = Array.from({ length: 240 }, (_, i) => i);
const MIN_EVIDENCE = 6;

interface Tally { fails: string[]; count: Record<string, number>; accepted: Record<string, string[]>; drops: number; continuous: number; agOff: number }

function tally(seeds: number[]): Tally {
  const fails: string[] = [];
  const count: Record<string, number> = {};
  const accepted: Record<string, string[]> = {};
  let drops = 0, continuous = 0, agOff = 0;
  const miss = (k: string, msg: string) => { fails.push(`${k}: ${msg}`); count[k] = (count[k] ?? 0) + 1; };
  const accept = (k: string, seed: number) => { (accepted[k] ??= []).push(String(seed)); };
  for (const seed of seeds) {
    const c = labCase(seed);
    const rec = synthesizeLabRecord({ ...c.spec, rng: xoshiro128ss(seed) });
    const t = rec.truth;
    let a;
    try { a = analyzeRecord(rec, { fit: false }); } catch (e) {
      const msg = (e as Error).message;
      if (!(t.elasticPoints <= 8 && /elasticModulus/.test(msg) && /--modulus/.test(msg))) { miss('threw', `${c.what}: ${msg}`); continue; }
      accept('E refused', seed);
      a = analyzeRecord(rec, { fit: false, elasticModulus: t.elasticModulus });
    }
    const has = (code: string) => a.warnings.some((w) => w.code === code);
    // Rp0.2
    const rpErr = Math.abs(a.proofStrength! - t.proofStrength) / t.proofStrength;
    const pr = a.proofStrengthRange;
    if (!(rpErr <= 0.01)) {
      if (has('uncertainRp') && pr && (pr[1] - pr[0]) / 2 > 0.01 * a.proofStrength! && pr[0] <= t.proofStrength && t.proofStrength <= pr[1]) accept('Rp0.2 (warned, inside its range)', seed);
      else miss('Rp0.2', `${c.what}: ${a.proofStrength} vs ${t.proofStrength}`);
    }
    if (!(Math.abs(a.tensileStrength - t.tensileStrength) / t.tensileStrength <= 0.004)) miss('Rm', `${c.what}: ${a.tensileStrength} vs ${t.tensileStrength}`);
    const agErr = Math.abs(a.uniformElongationPct - t.uniformElongationPct);
    const [agLo, agHi] = a.forceMaximum.uniformElongationInterval95;
    if (!(agErr <= 0.4)) agOff++;
    if (!(agErr <= 0.4)) {
      if (has('uncertainAg') && (agHi - agLo) / 2 > 0.4 && agLo <= t.uniformElongationPct && t.uniformElongationPct <= agHi) accept('Ag (warned, inside its 95 % interval)', seed);
      else miss('Ag', `${c.what}: ${a.uniformElongationPct} vs ${t.uniformElongationPct} (interval ${agLo.toFixed(2)}–${agHi.toFixed(2)})`);
    }
    if (!(Math.abs(a.totalElongationPct - t.totalElongationPct) <= 0.5)) miss('A', `${c.what}: ${a.totalElongationPct} vs ${t.totalElongationPct}`);
    if (t.yieldDropRecorded === false) {
      // Made with a drop, but no sample caught the peak: either answer is acceptable.
    } else if (t.upperYield === null) {
      continuous++;
      if (a.upperYield !== null) miss('falseYield', `${c.what}: continuous curve reported ReH ${a.upperYield}`);
      // Nor a yield plateau (yieldPlateau): the laws would be fitted from a false plateau's end.
      if (has('yieldPlateau')) miss('falsePlateau', `${c.what}: ${a.warnings.find((w) => w.code === 'yieldPlateau')!.message}`);
    } else {
      drops++;
      if (a.upperYield === null) {
        if (has('yieldPlateau')) accept('drop not reported, its plateau found', seed);
        if (t.yieldDropEvidence! < MIN_EVIDENCE) accept(`drop not reported (evidence < ${MIN_EVIDENCE})`, seed);
        else miss('missedYield', `${c.what}: drop ${t.upperYield}/${t.lowerYield} (evidence ${t.yieldDropEvidence!.toFixed(1)}) not found`);
      } else {
        const rr = a.upperYieldRange!;
        if (!(Math.abs(a.upperYield - t.upperYield) / t.upperYield <= 0.015)) {
          if (has('uncertainReH') && (rr[1] - rr[0]) / 2 > 0.015 * a.upperYield && rr[0] <= t.upperYield && t.upperYield <= rr[1]) accept('ReH (warned, inside its range)', seed);
          else miss('ReH', `${c.what}: ${a.upperYield} vs ${t.upperYield} (range ${rr[0].toFixed(1)}–${rr[1].toFixed(1)})`);
        }
        if (!(Math.abs(a.lowerYield! - t.lowerYield!) / t.lowerYield! <= 0.015)) miss('ReL', `${c.what}: ${a.lowerYield} vs ${t.lowerYield}`);
        if (!(Math.abs(a.yieldPointElongationPct! - t.yieldPointElongationPct!) <= 0.4)) miss('Ae', `${c.what}: ${a.yieldPointElongationPct} vs ${t.yieldPointElongationPct}`);
      }
    }
    if (a.elasticModulus < 40000 || a.elasticModulus > 450000) miss('silentE', `${c.what}: E ${a.elasticModulus} used silently`);
    // The extensometer stays on to fracture on every record here: its channel must never be read as ending early.
    if (a.strainChannelEnd !== null) miss('falseStrainEnd', `${c.what}: strain channel read as ending at sample ${a.strainChannelEnd.index} (${a.strainChannelEnd.kind})`);
    // Nor is any sample read as an acquisition glitch (yield drops, serrations, fracture and noise are the specimen's).
    if (a.warnings.some((w) => w.code === 'glitch')) miss('falseGlitch', `${c.what}: ${a.warnings.find((w) => w.code === 'glitch')!.message}`);
    // Nor as a file that starts over with a second test (testStarts): every record here is one specimen.
    if (a.warnings.some((w) => w.code === 'secondTest')) miss('falseSecondTest', `${c.what}: ${a.warnings.find((w) => w.code === 'secondTest')!.message}`);
    // Nor is fracture read as an unloading (findCycles): no record here is unloaded before it breaks.
    if (a.cycles.length) miss('falseCycle', `${c.what}: ${a.cycles.length} unload–reload cycle(s) read, the first at sample ${a.cycles[0]!.unloadIndex}`);
    // Nor as a test whose rate changes on the plastic part (findRateChange): every record here runs at one rate.
    if (a.rateChange !== null) miss('falseRateChange', `${c.what}: ${a.warnings.find((w) => w.code === 'rateChange')?.message}`);
    const [lo, hi] = a.measuredModulusInterval95;
    const warned = has('fewElasticPoints') || has('uncertainModulus') || has('elasticBandFallback');
    if (!(lo <= t.elasticModulus && t.elasticModulus <= hi) && !warned && Math.abs(a.elasticModulus / t.elasticModulus - 1) > 0.05) miss('quietE', `${c.what}: E ${a.elasticModulus} off by more than 5 % outside its interval, no warning`);
  }
  return { fails, count, accepted, drops, continuous, agOff };
}

describe('analyzeRecord on 240 seeded invented lab records (noise 0.1–1 % of Rm, 1,000–100,000 points uniform in time)', () => {
  it('Rp0.2 within 1 %, Rm within 0.4 %, Ag within 0.4 point, A within 0.5 point; ReH/ReL only with a real drop, within 1.5 %, Ae within 0.4 point', () => {
    const r = tally(SEEDS);
    const list = r.fails.join('\n');
    console.log(`${r.fails.length} misses ${JSON.stringify(r.count)}; ${r.drops} recorded drops, ${r.continuous} continuous; Ag off by more than 0.4 point (warned or not) ${r.agOff}; accepted (the record cannot support the tolerance, the analysis says so): ${JSON.stringify(r.accepted)}\n${list}`);
    // Met on every seed.
    for (const k of ['threw', 'Rp0.2', 'Rm', 'A', 'falseYield', 'falsePlateau', 'silentE', 'quietE', 'ReH', 'ReL', 'Ae', 'missedYield', 'falseStrainEnd', 'falseGlitch', 'falseSecondTest', 'falseRateChange', 'falseCycle']) expect(r.count[k] ?? 0, `${k}\n${list}`).toBe(0);
    // NOT met on every seed (measured, held as ceilings so a regression fails; see docs/records-and-fits.md):
    // Rp0.2 (met since the twenty-second session): seed 147, 1.55 % high (2019 points, noise 0.97 % of Rm, 7 elastic
    // samples), had its truth 0.06 MPa outside a warned 95 % interval; with the noise's correlation read over the whole
    // record (noiseLag1) the interval holds it, still warned.
    // Ag off by more than 0.4 point with no 95 % interval holding the truth: none. (Seventeenth session 4: seeds 57,
    // 122, 168 and 187, coarse noisy tops whose 95 % interval left the truth 0.02–0.3 point out, while the laws, refused
    // at 95 %, read it within 0.03–0.6 point. Eighteenth session: the laws gated at the top model's 99.9 % interval,
    // LAW_GATE_CHI2, and the interval given widened to hold their Ag; seed 187 is off by 0.2 point now, 57 and 122
    // by 0.43–0.58 inside the widened interval.)
    expect(r.count.Ag ?? 0, list).toBeLessThanOrEqual(0);
    // The raw accuracy, warned or not: Ag off by more than 0.4 point on 51 of 240 records (110 before the top model
    // was bounded to a top that falls away from its vertex on both sides — an unbounded side rose past the vertex and
    // read Ag up to 7 points early — and Ag became the Akaike-weighted mean of a kinked and a smooth top). Almost all
    // are coarse (1,000–10,000 points) with noise above 0.4 % of Rm.
    // Seventh session: Ag from the hardening laws fitted to the uniform part where their maximum lies inside the top
    // model's interval (lawTop.ts), and the truth at the curve's own maximum of force (the generator had read it at the
    // rigid-plastic Considère strain, 0.03–0.17 point late): 51 → 16 (44 for the top model alone against that truth).
    // Eighteenth session: the laws gated at 99.9 % (16 → 17: better on 5, worse on 4 where the laws disagree among
    // themselves), then the flow curve from the end of a yield plateau whose drop is not reported (yieldPlateau): 13.
    // Nineteenth session: the plateau–hardening hinge's branch kept from bending upward (yieldPoint.ts) moved seed 35's
    // plateau end from 2.29 to 2.42 % and its Ag from 0.39 to 0.41 point off (the laws fitted from there): 14.
    // Twenty-third session: the laws' Akaike weights for Ag from their residuals over the upper part of the flow curve
    // (0.3–0.9 of its largest plastic strain; lawTop.ts, UPPER_PART), where their maximum of force is decided, not over
    // the whole curve: 14 → 11 (35, 57, 122 and 143 within 0.4 point now, 80 past it; 27, 50, 56, 65, 113, 125, 136, 146,
    // 172 and 210 left).
    expect(r.agOff).toBeLessThanOrEqual(11);
    // Of those, warned with a 95 % interval wider than ±0.4 point that holds the truth: 11 (14 before the upper-part
    // weights, 13 before seed 35 moved, 12 before the gate, 46 before the laws, 107 before the bounded top model).
    expect(r.accepted['Ag (warned, inside its 95 % interval)']?.length ?? 0).toBeLessThanOrEqual(11);
    // Unreported drops whose plateau was found (yieldPlateau): 5 of the 7.
    expect(r.accepted['drop not reported, its plateau found']?.length ?? 0).toBeGreaterThanOrEqual(5);
    // The acceptances stay the exception, and each kind is exercised (so the conditions above can fail).
    expect(r.accepted['E refused']?.length ?? 0).toBeLessThanOrEqual(6);
    expect(r.accepted[`drop not reported (evidence < ${MIN_EVIDENCE})`]?.length ?? 0).toBeLessThanOrEqual(8);
    expect(r.drops).toBeGreaterThanOrEqual(60);
    expect(r.continuous).toBeGreaterThanOrEqual(150);
  }, 600_000); // a tally of hundreds of analyses: 50–130 s in CI on 2 cores, more under load
});

// The same generator on 240 further seeds, first run in the twenty-fourth session, after the analysis had been tuned
// on the seeds above for twenty sessions: a check on records the analysis was not tuned on. Found there, and mended:
// a yield drop of evidence 220 not reported (seed 70064: E 69 GPa, ReH 3 % above Rm, the walk down the drawn-out fall
// stopped at a noise blip that stood above every later sample; yieldPoint.ts), and two serrated plateaus whose Rp0.2
// was read 1.35–1.6 % above the troughs with no warning (70046, 70055: serrations at about the sample spacing, which the
// plateau's average follows in part; plateauProofStrength's range now reaches the band's edges). Left: Rp0.2 of 70095
// and 70225 (7 and 13 elastic samples under 0.8–0.86 % noise, warned, their 95 % ranges 0.4–0.6 MPa short of the truth).
const FRESH = Array.from({ length: 240 }, (_, i) => 70000 + i);

describe('analyzeRecord on 240 further seeds (70000–70239) of the same generator', () => {
  it("issue 12's tolerances, with the same acceptances", () => {
    const r = tally(FRESH);
    const list = r.fails.join('\n');
    console.log(`further seeds: ${r.fails.length} misses ${JSON.stringify(r.count)}; ${r.drops} recorded drops, ${r.continuous} continuous; Ag off by more than 0.4 point ${r.agOff}; accepted: ${JSON.stringify(r.accepted)}\n${list}`);
    for (const k of ['threw', 'Rm', 'A', 'Ag', 'falseYield', 'falsePlateau', 'silentE', 'quietE', 'ReH', 'ReL', 'Ae', 'missedYield', 'falseStrainEnd', 'falseGlitch', 'falseSecondTest', 'falseRateChange', 'falseCycle']) expect(r.count[k] ?? 0, `${k}\n${list}`).toBe(0);
    expect(r.count['Rp0.2'] ?? 0, list).toBeLessThanOrEqual(2);
    expect(r.agOff).toBeLessThanOrEqual(10);
    expect(r.drops).toBeGreaterThanOrEqual(60);
    expect(r.continuous).toBeGreaterThanOrEqual(150);
  }, 600_000);
});

describe('an impossible E is never used silently', () => {
  // Crosshead-style strain: the machine's compliance adds extension, so the elastic slope reads far below any
  // metal's modulus (40–450 GPa, common practice). Simulated by stretching the elastic rise 8× (INVENTED record).
  const c = labCase(4);
  const rec = synthesizeLabRecord({ ...c.spec, rng: xoshiro128ss(4) });
  const strain = Float64Array.from(rec.strain, (e, i) => e + 7 * Math.min(rec.stress[i]!, rec.truth.proofStrength) / rec.truth.elasticModulus);
  it('analyzeRecord refuses a record whose elastic band gives E outside 40–450 GPa, naming elasticModulus and the way out', () => {
    expect(() => analyzeRecord({ strain, stress: rec.stress }, { fit: false })).toThrow(/elasticModulus.*40–450 GPa.*--modulus/s);
  });
  it('with the modulus given, the analysis runs and says the measured one disagrees', () => {
    const a = analyzeRecord({ strain, stress: rec.stress }, { fit: false, elasticModulus: rec.truth.elasticModulus });
    expect(a.elasticModulusSource).toBe('given');
    expect(a.elasticModulus).toBe(rec.truth.elasticModulus);
    expect(a.measuredModulus).toBeLessThan(40000);
    expect(a.warnings.some((w) => w.code === 'modulusGiven')).toBe(true);
  });
  it('a record with few elastic points is analysed with a warning that names the points and the interval', () => {
    const few = labCase(9);
    const r = synthesizeLabRecord({ ...few.spec, points: 600, rng: xoshiro128ss(9) });
    const a = analyzeRecord(r, { fit: false });
    const w = a.warnings.find((x) => x.code === 'fewElasticPoints' || x.code === 'elasticBandFallback' || x.code === 'uncertainModulus');
    expect(w?.message).toMatch(/points|interval/);
  });
});

describe('the generator follows the issue and its own truth definitions', () => {
  it('covers the issue: 1,000–100,000 points, noise 0.1–1 % of Rm, drops 3–10 %, Lüders 0.5–3 %, serrations up to 3 % at periods both sides of the sample spacing', () => {
    let minN = Infinity, maxN = 0, bigSerr = 0, fast = 0, slow = 0, under = 0;
    for (const seed of SEEDS) {
      const { spec } = labCase(seed);
      minN = Math.min(minN, spec.points); maxN = Math.max(maxN, spec.points);
      const d = spec.yieldDrop;
      if (!d) continue;
      expect(d.drop).toBeGreaterThanOrEqual(0.03); expect(d.drop).toBeLessThanOrEqual(0.1);
      expect(d.luedersStrain).toBeGreaterThanOrEqual(0.005); expect(d.luedersStrain).toBeLessThanOrEqual(0.03);
      if ((d.serration ?? 0) >= 0.02) bigSerr++;
      const r = synthesizeLabRecord({ ...spec, noise: 0, rng: xoshiro128ss(seed) });
      const spacing = r.strain[1]! - r.strain[0]!;
      if (d.serrationPeriod! < spacing) fast++; else slow++;
      if ((d.undershoot ?? 0) > 0) under++;
    }
    expect(minN).toBeLessThan(1300); expect(maxN).toBeGreaterThan(70000);
    expect(bigSerr).toBeGreaterThan(5); expect(fast).toBeGreaterThan(5); expect(slow).toBeGreaterThan(5); expect(under).toBeGreaterThan(5);
  });
  it('ReL ignores the undershoot of the first trough (the initial transient) and Rp0.2 is the first crossing of the offset line', () => {
    // Flat plateau, undershoot 2 %: the lowest stress during yielding after the transient is ReL itself.
    const law = { law: 'voce' as const, sigma0: 250, Q: 200, b: 12 };
    const r = synthesizeLabRecord({ law, elasticModulus: 205000, points: 20000, rng: xoshiro128ss(1), yieldDrop: { drop: 0.06, luedersStrain: 0.015, undershoot: 0.02 } });
    const sigL = 250 + 200 * (1 - Math.exp(-12 * 0.015));
    const eL = Math.expm1(0.015 + sigL / 205000);
    // Voce σ(εL) at εL = 0.015, engineering ReL = σ/(1 + eL) (Dowling §4.5); 1e-9 relative: the generator's own arithmetic.
    expectRelClose(r.truth.lowerYield!, sigL / (1 + eL), 1e-9);
    // On a flat plateau the offset line first meets the curve at the plateau level.
    expect(Math.abs(r.truth.proofStrength - sigL / (1 + eL))).toBeLessThan(1e-6 * sigL);
  });
});
