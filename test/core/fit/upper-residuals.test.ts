// The misfit of a law over part of a flow curve (upperResidualSquares), which weights the hardening laws' Ag
// (lawUniformElongation), against sums made here point by point from the law files themselves (makeLaw). Records:
// INVENTED (synthesizeRecord, the benchmark's Swift steel) and the ten open 42CrMoS4 records (Fraunhofer IWM / IWT
// Bremen, MaterialDigital, CC BY 4.0, test/fixtures/42crmos4/ATTRIBUTION.md).
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import {
  analyzeRecord, blockMoments, LAW_PARAMETERS, lawData, makeLaw, momentResidualStats, REDUCTION_DEFAULTS, synthesizeRecord,
  upperResidualSquares, xoshiro128ss, type LawName, type LawSpec,
} from '../../../src/core/index.js';
import { parseRecordText } from '../../../src/records/index.js';
import { expectRelClose } from '../../helpers.js';

const paramsOf = (law: LawName, params: Record<string, number>) => Float64Array.from(LAW_PARAMETERS[law], (p) => params[p.name]!);

/** Σ(σ(xᵢ) − yᵢ)² over the points with from ≤ xᵢ ≤ to (`byPoint`), or over whole blocks of `size` whose strain midpoint is in the range. */
function reference(law: LawName, params: Record<string, number>, x: Float64Array, y: Float64Array, from: number, to: number, size?: number) {
  const f = makeLaw({ law, ...params } as LawSpec).stress;
  let ssr = 0, points = 0;
  if (size === undefined) {
    for (let i = 0; i < x.length; i++) if (x[i]! >= from && x[i]! <= to) { ssr += (f(x[i]!) - y[i]!) ** 2; points++; }
    return { ssr, points };
  }
  for (let a = 0; a < x.length; a += size) {
    const z = Math.min(x.length, a + size);
    let lo = Infinity, hi = -Infinity;
    for (let i = a; i < z; i++) { lo = Math.min(lo, x[i]!); hi = Math.max(hi, x[i]!); }
    const mid = (lo + hi) / 2;
    if (mid < from || mid > to) continue;
    for (let i = a; i < z; i++) ssr += (f(x[i]!) - y[i]!) ** 2;
    points += z - a;
  }
  return { ssr, points };
}

describe('upperResidualSquares: a law\'s residual sum over part of the curve', () => {
  it('INVENTED 100,000-row record (block moments): every law, over 0.3–0.9 of the largest strain, equal to the whole blocks\' point-by-point sum', () => {
    const rec = synthesizeRecord({ law: { law: 'swift', K: 600, eps0: 0.01, n: 0.22 }, elasticModulus: 200000, rng: xoshiro128ss(42), noise: 1, toe: 1e-4, step: 2.712e-6, necking: { extraStrain: 0.06, dropTo: 0.7 } });
    const a = analyzeRecord(rec);
    const x = Float64Array.from(a.flowCurve.strain), y = Float64Array.from(a.flowCurve.stress);
    expect(x.length).toBeGreaterThan(REDUCTION_DEFAULTS.momentStatsFrom);
    const d = lawData(x, y);
    const from = 0.3 * d.hi, to = 0.9 * d.hi;
    const ssrs: number[] = [];
    for (const fit of a.fits!.fits) {
      const u = upperResidualSquares(fit.law, d, paramsOf(fit.law, fit.params), from, to);
      const blocks = reference(fit.law, fit.params, x, y, from, to, REDUCTION_DEFAULTS.momentBlock);
      const points = reference(fit.law, fit.params, x, y, from, to);
      expect(u.points, `${fit.law} points`).toBe(blocks.points);
      // The moments' own bound (2·momentRelTol of the sum) and rounding.
      expectRelClose(u.ssr, blocks.ssr, 1e-7, `${fit.law} SSR over the blocks`);
      // Per point instead of per block: the range's two ends differ by at most a block each.
      expect(Math.abs(u.points - points.points)).toBeLessThanOrEqual(2 * REDUCTION_DEFAULTS.momentBlock);
      expectRelClose(u.ssr, points.ssr, (4 * REDUCTION_DEFAULTS.momentBlock) / points.points, `${fit.law} SSR over the points`);
      ssrs.push(u.ssr);
    }
    // Not the whole curve's: the part is 60 % of the strain range.
    const whole = momentResidualStats(a.fits!.fits[0]!.law, d, paramsOf(a.fits!.fits[0]!.law, a.fits!.fits[0]!.params), d.moments ?? blockMoments(x, y, REDUCTION_DEFAULTS.momentBlock));
    expect(ssrs[0]!).toBeLessThan(0.8 * whole.ssr);
  }, 60_000);

  const DIR = join(import.meta.dirname, '..', '..', 'fixtures', '42crmos4');
  const FILES = readdirSync(DIR).filter((f) => f.endsWith('.csv')).sort();
  it('the ten open 42CrMoS4 records (short curves, point by point): every law, equal to the points\' sum and count', () => {
    expect(FILES).toHaveLength(10);
    for (const f of FILES) {
      const a = analyzeRecord(parseRecordText(readFileSync(join(DIR, f), 'utf8'), { file: f }));
      const x = Float64Array.from(a.flowCurve.strain), y = Float64Array.from(a.flowCurve.stress);
      expect(x.length).toBeLessThan(REDUCTION_DEFAULTS.momentStatsFrom);
      const d = lawData(x, y);
      for (const fit of a.fits!.fits) {
        const u = upperResidualSquares(fit.law, d, paramsOf(fit.law, fit.params), 0.3 * d.hi, 0.9 * d.hi);
        const r = reference(fit.law, fit.params, x, y, 0.3 * d.hi, 0.9 * d.hi);
        expect(u.points, `${f} ${fit.law}`).toBe(r.points);
        expect(u.points).toBeGreaterThan(0);
        expectRelClose(u.ssr, r.ssr, 1e-12, `${f} ${fit.law} SSR`);
      }
    }
  });

  it('no point in the range: 0 points and 0', () => {
    const x = Float64Array.of(0.01, 0.02, 0.03), y = Float64Array.of(300, 320, 335);
    expect(upperResidualSquares('hollomon', lawData(x, y), Float64Array.of(500, 0.2), 0.5, 0.9)).toEqual({ ssr: 0, points: 0 });
  });
});
