import { sampleCorrelation, sampleStandardDeviation, mean } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { analyzeRecord, analyzeSpecimens, scatterFromSpecimens, summarizeSpecimens } from '../../../src/core/index.js';
import { expectAbsClose, expectRelClose } from '../../helpers.js';

// INVENTED specimens: six coupons of one annealed copper heat, each a noise-free record generated
// from a Hollomon law whose K and n are known (around Callister's copper, K 530 MPa, n 0.44, with
// K and n negatively correlated). Reference statistics from simple-statistics (a general-purpose
// registry library): mean, sampleStandardDeviation, sampleCorrelation of the TRUE K and n.
import { TRUE, specimens } from './specimenFixtures.js';

describe('scatterFromSpecimens(analyzeSpecimens(records).lawParameters)', () => {
  const set = analyzeSpecimens(specimens, { law: 'hollomon', laws: ['hollomon'] });
  const sc = scatterFromSpecimens(set.lawParameters!);
  const K = TRUE.map((t) => t.K), n = TRUE.map((t) => t.n);
  it('recovers the mean, sd and K–n correlation of the laws the records were made from', () => {
    expect(sc.specimens).toBe(6);
    // Per-specimen fits of noise-free records recover K and n to ~0.1 % (issue-3 round-trip tests);
    // the tolerances below allow that on each of six fits.
    expectRelClose(sc.mean.K!, mean(K), 3e-3, 'mean K');
    expectRelClose(sc.mean.n!, mean(n), 3e-3, 'mean n');
    expectRelClose(sc.sd.K!, sampleStandardDeviation(K), 0.05, 'sd K');
    expectRelClose(sc.sd.n!, sampleStandardDeviation(n), 0.1, 'sd n');
    const r = sampleCorrelation(K, n);
    expect(r).toBeLessThan(-0.5);
    expectAbsClose(sc.correlation['K,n']!, r, 0.05, 'corr K,n');
    expect(sc.notes.join(' ')).toMatch(/only 6 specimens/);
  });
  it('refuses a single specimen naming scatter.records', () => {
    const one = analyzeSpecimens(specimens.slice(0, 1), { law: 'hollomon', laws: ['hollomon'] });
    expect(() => scatterFromSpecimens(one.lawParameters!)).toThrow(/scatter\.records: too few fitted specimens for a spread; got 1, allowed at least 2/);
  });
});

describe('summarizeSpecimens (specimens analysed once, as the command line does)', () => {
  it('gives the set analyzeSpecimens gives, from the analyses alone, and K–n against the true laws', () => {
    const opts = { law: 'hollomon' as const, laws: ['hollomon' as const] };
    const analysed = specimens.map((r) => ({ name: r.name, analysis: analyzeRecord(r, { laws: opts.laws }) }));
    const set = summarizeSpecimens(analysed, opts);
    expect(set).toEqual(analyzeSpecimens(specimens, opts));
    // The same reference as above (simple-statistics of the TRUE K): the summary is of the analyses given.
    expectRelClose(set.lawParameters!.mean[0]!, mean(TRUE.map((t) => t.K)), 3e-3, 'mean K');
    expect(set.specimens[2]!.analysis).toBe(analysed[2]!.analysis);
    expect(() => summarizeSpecimens([])).toThrow(/specimens: .*at least one analysed specimen/);
  });
});
