import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyzeRecord, analyzeSpecimens } from '../../../src/core/index.js';
import { parseRecordText } from '../../../src/records/index.js';
import { expectAbsClose, expectRelClose } from '../../helpers.js';

// Open data: Fraunhofer IWM / IWT Bremen, Platform MaterialDigital, materialdigital/demodata_tensiletest_42CrMoS4
// (CC BY 4.0; test/fixtures/42crmos4/ATTRIBUTION.md). The reference values are the producers' own, from the
// header lines of each file (keys "Yield stress at 0.2% plastic strain", "Ultimate tensile strength",
// "Uniform elongation", "Elongation after fracture", "Slope of linear-elastic region").
const DIR = join(import.meta.dirname, '..', '..', 'fixtures', '42crmos4');
const FILES = readdirSync(DIR).filter((f) => f.endsWith('.csv')).sort();

function load(f: string) {
  const rec = parseRecordText(readFileSync(join(DIR, f), 'utf8'), { file: f });
  const ref = (key: string) => {
    const v = rec.metadata.get(key);
    if (!v) throw new Error(`${f}: no metadata ${key}`);
    return Number(v.value);
  };
  return { rec, ref };
}

describe('analyzeRecord on the ten 42CrMoS4 records (MaterialDigital open data, CC BY 4.0)', () => {
  it('finds all ten files', () => expect(FILES).toHaveLength(10));
  for (const f of FILES) {
    it(`${f}: Rp0.2, Rp1, Rm, Ag, A and E match the producers' reported values`, () => {
      const { rec, ref } = load(f);
      expect(rec.basis).toBe('stress-strain');
      expect(rec.columns.stress?.name).toBe('Engineering Stress');
      const a = analyzeRecord(rec, { fit: false });
      // Rp0.2 (ISO 6892-1 offset method): samples are ~5 MPa apart near yield here, so linear interpolation
      // between two samples and the E window move Rp by < 0.3 %; measured worst case 0.07 %.
      expectRelClose(a.proofStrength!, ref('yield stress at 0.2% plastic strain'), 3e-3, `${f} Rp0.2`);
      expectRelClose(a.proofStrengths[2]!.stress!, ref('yield stress at 1% plastic strain'), 3e-3, `${f} Rp1`);
      // Rm: the producers report the highest raw sample, which sits 2–3 noise sd above the curve (the expected
      // maximum of ~50 normal samples near a flat top is about +2.2 sd, a statistics fact). Ours is the top of a
      // local parabola, so theirs should be above ours by 0–4 σ̂ (σ̂ = the record's own noise estimate, 0.16–0.47 MPa
      // here), and within 0.1 % either way.
      const rmRef = ref('ultimate tensile strength');
      expect(rmRef - a.tensileStrength, `${f} Rm: producer ${rmRef} vs ${a.tensileStrength}, noise ${a.noise}`).toBeGreaterThan(-0.5 * a.noise);
      expect(rmRef - a.tensileStrength, `${f} Rm: producer ${rmRef} vs ${a.tensileStrength}, noise ${a.noise}`).toBeLessThan(4 * a.noise);
      expectRelClose(a.tensileStrength, rmRef, 1e-3, `${f} Rm`);
      // Ag: the producers read it at the highest raw sample; on these flat tops (ISO/ASTM: Ag at maximum force)
      // that point wanders within the top. Theirs must lie inside the strain span our parabola was fitted on,
      // and ours within half that span of theirs (the span is at most ~1.5 % strain here).
      const agRef = ref('uniform elongation');
      const [x0, x1] = a.forceMaximum.span.map((x) => (x - a.toeStrain - a.tensileStrength / a.elasticModulus) * 100);
      if (f === '46NT73.csv') {
        // Looked at by eye: the producers' Rm 1198.90 MPa and Ag 6.02 % are one sample (file line 467, strain
        // 6.61 %) 2 MPa above both neighbours (1196.3, 1197.4) — a spike, not the top of the curve (1198.4–1198.5
        // over 5.6–6.0 % strain). Our Ag must stay at the smooth top, away from the spike.
        expect(a.uniformElongationPct).toBeGreaterThan(x0!);
        expect(a.uniformElongationPct).toBeLessThan(agRef - 0.5);
      } else {
        expect(agRef, `${f} Ag ${agRef} inside [${x0}, ${x1}]`).toBeGreaterThanOrEqual(x0! - 0.05);
        expect(agRef, `${f} Ag ${agRef} inside [${x0}, ${x1}]`).toBeLessThanOrEqual(x1! + 0.05);
        expectAbsClose(a.uniformElongationPct, agRef, Math.max(0.05, (x1! - x0!) / 2), `${f} Ag`);
      }
      // The top is fitted with its own noise (forceMaximum): these tops scatter 0.1–0.5 MPa about a local smooth while
      // 46NT71 and 46NT73 scatter 1–3 MPa on their elastic rise and while they neck (a control oscillation), and the
      // record-wide figure (1.7 and 1.1 MPa) had warned their Ag as uncertain by ±0.98 and ±0.43 point. Measured now:
      // every interval within ±0.34 point, no warning.
      const [agLo, agHi] = a.forceMaximum.uniformElongationInterval95;
      expect((agHi - agLo) / 2, `${f} Ag interval ${agLo}–${agHi}`).toBeLessThan(0.4);
      expect(a.warnings.map((w) => w.code)).not.toContain('uncertainAg');
      // Rp0.2 likewise, with the noise of the 128 samples about the offset crossing (proofStrength): 46NT71's was warned
      // 1113–1151 MPa with the record-wide 2.0 MPa; about its crossing the record scatters 1.0 MPa.
      expect(a.warnings.map((w) => w.code)).not.toContain('uncertainRp');
      // A in %: one sample step is ~0.02 % strain; 0.05 % (absolute) covers one step plus the E difference in s_f/E.
      expectAbsClose(a.totalElongationPct, ref('elongation after fracture'), 0.05, `${f} A`);
      expect(a.fracture.detected).toBe(true);
      // E depends on the fit window (CHECKS.md: "a few per cent"). These records have a long toe (the first
      // ~200 MPa bend upward); our band is 10–40 % of Rp0.2 raised above the toe, the producers' window is not
      // stated. Measured: within 5.1 % (46NT9B 221 vs 211 GPa); 6 % allowed.
      expectRelClose(a.elasticModulus, ref('slope of linear-elastic region'), 0.06, `${f} E`);
      // Steel is 207 GPa (Callister, Table B.2): the measured E is a plausible metal modulus with ≥ 8 points.
      expect(a.warnings.some((w) => w.code === 'implausibleModulus' || w.code === 'fewElasticPoints')).toBe(false);
      // A continuous Q&T curve: no upper/lower yield reported.
      expect(a.upperYield).toBeNull();
      expect(a.elasticWindow.r2).toBeGreaterThan(0.999);
      // Q&T 42CrMoS4 hardens little: ISO 10275 n over the uniform range is small (Rp0.2/Rm ≈ 0.93).
      expect(a.nValue!).toBeGreaterThan(0.02);
      expect(a.nValue!).toBeLessThan(0.1);
    });
  }
  it("Ag is not biased against the producers' values over the nine records whose top is not a one-sample spike", () => {
    // The producers read Ag at the highest raw sample: on these low-noise records (0.2–1.7 MPa) that sample scatters
    // about the true maximum but is not biased in strain, so the mean of our Ag minus theirs over nine records must be
    // near zero. Measured: +0.006 point (largest single difference 0.19). A top model reaching ten times further down
    // the necking side — far better on all three invented generators — read +0.20 on average here (up to 0.42): real
    // necking branches turn from falling ever faster to falling steadily, which the generators did not do. This check
    // keeps invented data from steering Ag away from real records. 46NT73 is left out (its producers' Ag is a spike,
    // see above). Bounds: the nine differences scatter with sd ≈ 0.1 point (the producers' single sample wanders
    // over the flat top), so their mean has a standard error of ≈ 0.035; 0.08 is about 2.3 of those, and 0.3 for
    // one record is the half-span of these tops (≈ 1.5 % strain, see above) divided by 2.5.
    const d = FILES.filter((f) => f !== '46NT73.csv').map((f) => {
      const { rec, ref } = load(f);
      return analyzeRecord(rec, { fit: false }).uniformElongationPct - ref('uniform elongation');
    });
    const mean = d.reduce((s, v) => s + v, 0) / d.length;
    expect(Math.abs(mean), d.map((v) => v.toFixed(3)).join(' ')).toBeLessThan(0.08);
    expect(Math.max(...d.map(Math.abs))).toBeLessThan(0.3);
  });
  it('analyzeSpecimens gives mean and sd of Rp0.2 equal to those of the producers\' values (ten 42CrMoS4 records)', () => {
    const loaded = FILES.map(load);
    const set = analyzeSpecimens(loaded.map(({ rec }) => ({ name: rec.name, strain: rec.strain, stress: rec.stress })), { law: 'voce', laws: ['voce'] });
    const refs = loaded.map(({ ref }) => ref('yield stress at 0.2% plastic strain'));
    const mean = refs.reduce((s, v) => s + v, 0) / refs.length;
    const sd = Math.sqrt(refs.reduce((s, v) => s + (v - mean) ** 2, 0) / (refs.length - 1));
    expectRelClose(set.summary.proofStrength!.mean, mean, 1e-3, 'mean Rp0.2');
    // sd of ~20 MPa; each Rp within 0.3 % (≈ 3 MPa) → sd within 3 MPa.
    expectAbsClose(set.summary.proofStrength!.sd!, sd, 3, 'sd Rp0.2');
    expect(set.summary.proofStrength!.n).toBe(10);
    expect(set.lawParameters!.names).toEqual(['sigma0', 'Q', 'b']);
    expect(set.lawParameters!.correlation[0]![0]).toBe(1);
    expect(set.jointFit!.fits[0]!.converged).toBe(true);
    expect(set.jointFit!.fits[0]!.points).toBe(set.specimens.reduce((s, x) => s + x.analysis.flowCurve.strain.length, 0));
  });
});

describe('fitting every law to a 42CrMoS4 flow curve (46NT99)', () => {
  const { rec } = load('46NT99.csv');
  const a = analyzeRecord(rec);
  it('every fit reports finite statistics, and converges or says it did not', () => {
    expect(a.fits!.fits.map((f) => f.law)).toEqual(['hollomon', 'ludwik', 'swift', 'voce', 'hockettSherby', 'swiftVoce']);
    for (const f of a.fits!.fits) {
      // The 7-parameter blend is not identifiable on 5 % of uniform strain; it may crawl along a valley —
      // then it must say so (no fit stops quietly). The others converge.
      if (f.law === 'swiftVoce') expect(f.converged || f.warnings.some((w) => w.code === 'notConverged')).toBe(true);
      else expect(f.converged, f.law).toBe(true);
      for (const v of [f.rmse, f.r2, f.aic, f.bic]) expect(Number.isFinite(v), f.law).toBe(true);
      // A standard error is a square root, so ≥ 0 alone could only catch NaN: require it finite as the title says.
      for (const se of Object.values(f.standardErrors)) if (se !== null) expect(Number.isFinite(se) && se >= 0, `${f.law} SE ${se}`).toBe(true);
    }
  });
  it('a saturating law fits this low-hardening steel better than Hollomon (lower AIC)', () => {
    const aic = (l: string) => a.fits!.fits.find((f) => f.law === l)!.aic;
    expect(aic('voce')).toBeLessThan(aic('hollomon'));
    expect(a.fits!.best).not.toBe('hollomon');
  });
});

describe('extrapolation spread on the 42CrMoS4 records (MaterialDigital 42CrMoS4 tensile data, CC BY 4.0)', () => {
  // Laws that fit the short uniform range (Ag ≈ 5 %) about equally well must be seen to part ways
  // beyond it: a saturating law (Voce, Hockett–Sherby) and a power law cannot both hold at 5× the
  // fitted range. "Fit well" includes every converged law within 1 % RMSE of the mean flow stress
  // (ISO 7500-1 class 1 force accuracy), so a near-perfect best fit does not hide the others.
  for (const f of ['46NT71.csv', '46NT99.csv']) {
    it(`${f}: at least three laws fit well, and at 5× the fitted range they differ by more than 10 % with a lawsDisagree warning`, () => {
      const a = analyzeRecord(load(f).rec);
      const cmp = a.fits!;
      expect(cmp.goodLaws.length).toBeGreaterThanOrEqual(3);
      const at5 = cmp.extrapolation.find((x) => x.note.startsWith('5×'))!;
      expect(at5.spreadPct).toBeGreaterThan(10);
      expect(cmp.warnings.some((w) => w.code === 'lawsDisagree')).toBe(true);
      // Within the fitted range the same laws agree closely (their RMSE is below 1 % of the stress).
      for (const l of cmp.goodLaws) expect(cmp.fits.find((x) => x.law === l)!.rmse).toBeLessThan(0.01 * 1200);
    });
  }
});

