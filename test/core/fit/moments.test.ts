// Full-curve fit statistics from block moments (curveResidualStats, momentResidualStats) against the
// point-by-point sums they replace. The reference SSR is also summed here from the law files themselves
// (makeLaw), and SST from simple-statistics (npm simple-statistics 7.12.1), so the check does not lean on
// the fitter's own value code. Records: INVENTED (synthesizeRecord, the benchmark's Swift steel) and the
// ten open 42CrMoS4 records (Fraunhofer IWM / IWT Bremen, MaterialDigital, CC BY 4.0,
// test/fixtures/42crmos4/ATTRIBUTION.md).
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { sampleVariance } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import {
  analyzeRecord, blockMoments, fitLaw, LAW_NAMES, LAW_PARAMETERS, lawData, lawResidualStats, makeLaw, momentResidualStats,
  REDUCTION_DEFAULTS, synthesizeRecord, xoshiro128ss, type LawName, type LawSpec,
} from '../../../src/core/index.js';
import { parseRecordText } from '../../../src/records/index.js';
import { expectAbsClose, expectRelClose } from '../../helpers.js';

/** The benchmark's INVENTED record (bench/records-gen.mjs): Swift K 600, ε0 0.01, n 0.22, 1 MPa noise, about `rows` rows. */
function invented(rows: number) {
  return synthesizeRecord({ law: { law: 'swift', K: 600, eps0: 0.01, n: 0.22 }, elasticModulus: 200000, rng: xoshiro128ss(42), noise: 1, toe: 1e-4, step: (2.712e-6 * 100_000) / rows, necking: { extraStrain: 0.06, dropTo: 0.7 } });
}

const paramsOf = (law: LawName, params: Record<string, number>) => Float64Array.from(LAW_PARAMETERS[law], (p) => params[p.name]!);

/** Σ(σ(xᵢ) − yᵢ)² and Σ rᵢrᵢ₋₁ with σ from the law file (makeLaw), point by point. */
function referenceSums(law: LawName, params: Record<string, number>, x: ArrayLike<number>, y: ArrayLike<number>) {
  const f = makeLaw({ law, ...params } as LawSpec).stress;
  let ssr = 0, lag = 0, prev = 0;
  for (let i = 0; i < x.length; i++) {
    const r = f(x[i]!) - y[i]!;
    ssr += r * r;
    if (i > 0) lag += r * prev;
    prev = r;
  }
  return { ssr, lag };
}

describe('fitLaw statistics on large curves come from block moments and agree with the full pass', () => {
  // Tolerances from the bound of momentResidualStats: |ΔSSR| ≤ 2·momentRelTol·SSR (2e-8), so RMSE within 1e-8,
  // 1 − R² within 2e-8, and ρ = lag/SSR within 4e-8 absolute; the standard errors scale with
  // sqrt(SSR·(1 + ρ)/(1 − ρ)), whose relative change is ≤ 1e-8 + 2·4e-8/(1 − ρ²) — 2e-6 for ρ ≤ 0.98.
  for (const rows of [100_000, 1_000_000]) {
    it(`INVENTED ${rows.toLocaleString('en')}-row record: each law's RMSE, R², AIC, lag-1 autocorrelation and standard errors`, () => {
      const rec = invented(rows);
      const fc = analyzeRecord(rec, { fit: false }).flowCurve;
      const x = Float64Array.from(fc.strain), y = Float64Array.from(fc.stress);
      const n = x.length;
      expect(n).toBeGreaterThan(REDUCTION_DEFAULTS.momentStatsFrom);
      const packed = lawData(x, y);
      const sst = sampleVariance(Array.from(y)) * (n - 1);
      for (const law of LAW_NAMES) {
        const m = fitLaw(law, x, y, { packed });
        const e = fitLaw(law, x, y, { packed, fullPassStats: true });
        expect(m.params, `${law}: the statistics do not change the fit`).toEqual(e.params);
        // The full pass is the point-by-point definition: check it against the law file's own values.
        const ref = referenceSums(law, m.params, x, y);
        expectRelClose(e.rmse, Math.sqrt(ref.ssr / n), 1e-12, `${law} full-pass RMSE vs makeLaw`);
        expectRelClose(1 - e.r2, ref.ssr / sst, 1e-9, `${law} full-pass 1 − R² vs simple-statistics SST`);
        expectRelClose(m.rmse, e.rmse, 1e-8, `${law} RMSE`);
        expectRelClose(m.rmse, Math.sqrt(ref.ssr / n), 1e-8, `${law} RMSE vs makeLaw`);
        expectRelClose(1 - m.r2, 1 - e.r2, 2e-8, `${law} 1 − R²`);
        expectAbsClose(m.aic, e.aic, 2e-8 * n, `${law} AIC`);
        expectAbsClose(m.basis.lag1Autocorrelation, ref.lag / ref.ssr, 4e-8, `${law} lag-1 autocorrelation vs makeLaw`);
        const rho = Math.max(0, m.basis.lag1Autocorrelation);
        const seTol = 1e-8 + 8e-8 / (1 - rho * rho);
        for (const p of LAW_PARAMETERS[law]) {
          const a = m.standardErrors[p.name], b = e.standardErrors[p.name];
          expect(a === null, `${law} ${p.name} standard error given in both or neither`).toBe(b === null);
          if (a !== null && b !== null) expectRelClose(a, b, seTol, `${law} SE(${p.name})`);
        }
      }
    }, 60_000);
  }
});

describe('momentResidualStats(law, d, p, moments) on the ten 42CrMoS4 records (open data)', () => {
  const DIR = join(import.meta.dirname, '..', '..', 'fixtures', '42crmos4');
  const FILES = readdirSync(DIR).filter((f) => f.endsWith('.csv')).sort();
  it('finds the ten files', () => expect(FILES).toHaveLength(10));
  for (const f of FILES) {
    it(`${f}: SSR and lag-1 sum of every fitted law within the returned bound (≤ 2e-8 of SSR) of the point-by-point sums, blocks of 8`, () => {
      const a = analyzeRecord(parseRecordText(readFileSync(join(DIR, f), 'utf8'), { file: f }));
      const x = Float64Array.from(a.flowCurve.strain), y = Float64Array.from(a.flowCurve.stress);
      const d = lawData(x, y);
      const mom = blockMoments(x, y, 8);
      for (const fit of a.fits!.fits) {
        const p = paramsOf(fit.law, fit.params);
        const m = momentResidualStats(fit.law, d, p, mom);
        const e = lawResidualStats(fit.law, d, p);
        const ref = referenceSums(fit.law, fit.params, x, y);
        expectRelClose(e.ssr, ref.ssr, 1e-12, `${f} ${fit.law} full pass vs makeLaw`);
        expect(m.bound, `${f} ${fit.law} bound`).toBeLessThanOrEqual(2 * REDUCTION_DEFAULTS.momentRelTol * 1.1);
        expectAbsClose(m.ssr, e.ssr, Math.max(m.bound, 1e-12) * e.ssr, `${f} ${fit.law} SSR`);
        expectAbsClose(m.lag1, e.lag1, Math.max(m.bound, 1e-12) * e.ssr, `${f} ${fit.law} lag-1 sum`);
        // The same with every block from its moments (relTol ∞, no exact fall-back): the estimated bound must
        // still hold on these coarse real records, whose blocks of 8 span up to a few % strain.
        const all = momentResidualStats(fit.law, d, p, mom, Infinity);
        expect(all.exactBlocks).toBe(0);
        expectAbsClose(all.ssr, e.ssr, (all.bound + 1e-12) * e.ssr, `${f} ${fit.law} SSR, every block from moments`);
        expectAbsClose(all.lag1, e.lag1, (all.bound + 1e-12) * e.ssr, `${f} ${fit.law} lag-1 sum, every block from moments`);
      }
    });
  }
});

describe('momentResidualStats falls back to the point-by-point sums where a block is not smooth', () => {
  it('strains in random order (every block spans the whole curve): every block summed exactly, same sums to rounding', () => {
    // INVENTED Voce curve, σ0 300, Q 200, b 12 MPa, with deterministic scatter; strains shuffled by a seeded generator.
    const n = 4096, rng = xoshiro128ss(7);
    const x = new Float64Array(n), y = new Float64Array(n);
    for (let i = 0; i < n; i++) x[i] = 0.002 + (0.3 * i) / n;
    for (let i = n - 1; i > 0; i--) { const j = Math.floor(rng.nextFloat() * (i + 1)); const t = x[i]!; x[i] = x[j]!; x[j] = t; }
    for (let i = 0; i < n; i++) y[i] = 300 + 200 * (1 - Math.exp(-12 * x[i]!)) + Math.sin(i * 1.7);
    const d = lawData(x, y);
    const p = Float64Array.of(301, 198, 12.5);
    const m = momentResidualStats('voce', d, p, blockMoments(x, y, 64));
    const e = lawResidualStats('voce', d, p);
    expect(m.exactBlocks).toBe(64);
    expect(m.exactPoints).toBe(n);
    expectRelClose(m.ssr, e.ssr, 1e-13, 'SSR');
    expectAbsClose(m.lag1, e.lag1, 1e-13 * e.ssr, 'lag-1 sum');
  });

  it('a smooth curve sampled as densely as a 1,000,000-row record needs no exact block and is within its bound', () => {
    // 200,000 points over 0.05 strain: 2.5e-7 apart, the spacing of the benchmark's 1,000,000-row record.
    const n = 200_000;
    const x = new Float64Array(n), y = new Float64Array(n);
    for (let i = 0; i < n; i++) { x[i] = 0.02 + (0.05 * i) / n; y[i] = 300 + 200 * (1 - Math.exp(-12 * x[i]!)) + Math.sin(i * 1.7); }
    const d = lawData(x, y);
    const p = Float64Array.of(301, 198, 12.5);
    const m = momentResidualStats('voce', d, p, blockMoments(x, y, 128));
    const e = lawResidualStats('voce', d, p);
    expect(m.exactBlocks).toBe(0);
    expect(m.bound).toBeLessThanOrEqual(2.2e-8);
    expectAbsClose(m.ssr, e.ssr, m.bound * e.ssr, 'SSR');
    expectAbsClose(m.lag1, e.lag1, m.bound * e.ssr, 'lag-1 sum');
  });
});

describe('blockMoments(x, y, size).meanY: the mean stress the law comparison uses (speed follow-up K)', () => {
  it('equals Σ yᵢ/n added in index order (the former pass of compareLawFits) bit for bit, and the mean within rounding', () => {
    const r = xoshiro128ss(77);
    for (let t = 0; t < 50; t++) {
      const n = 1 + (r.nextU32() % 5000), size = 1 + (r.nextU32() % 300);
      const x = Float64Array.from({ length: n }, (_, i) => 1e-3 + i * 1e-4);
      const y = Float64Array.from(x, () => 100 + 900 * r.nextFloat());
      let former = 0;
      for (let i = 0; i < n; i++) former += y[i]! / n;
      const got = blockMoments(x, y, size).meanY;
      expect(Object.is(got, former), `case ${t}: ${got} vs ${former}`).toBe(true);
      expectRelClose(got, y.reduce((a, b) => a + b, 0) / n, 1e-12); // a mean: rounding-level agreement with Σy/n
    }
  });
});
