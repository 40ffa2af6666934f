import type { TensileAnalysis } from '../core/tensile/types.js';
import type { TensileRecord } from '../records/builder.js';

/**
 * The tests of a record that holds more than one (specimens exported one after another in one file): one record per
 * test, split where the record starts over (`first.furtherTests`, found by analyzeRecord's testStarts), each named
 * `NAME (test k of m)` with its sample range in `test` and a line in its warnings. `first` is the analysis
 * analyzeRecord already made (of the first test, with its `secondTest` warning); it is kept for test 1 without that
 * warning, and the others are analysed by `analyze`. A record of one test comes back as it is, analysis unchanged.
 * @example splitTests(rec, analyzeRecord(rec), (r) => analyzeRecord(r)).length // 2 for two specimens in one file
 */
export function splitTests(rec: TensileRecord, first: TensileAnalysis, analyze: (r: TensileRecord) => TensileAnalysis): { record: TensileRecord; analysis: TensileAnalysis }[] {
  if (!first.furtherTests.length) return [{ record: rec, analysis: first }];
  const bounds = [0, ...first.furtherTests, rec.strain.length];
  const m = bounds.length - 1;
  const out: { record: TensileRecord; analysis: TensileAnalysis }[] = [];
  for (let k = 0; k < m; k++) {
    const from = bounds[k]!, to = bounds[k + 1]!;
    const record: TensileRecord = {
      ...rec,
      name: `${rec.name} (test ${k + 1} of ${m})`,
      strain: rec.strain.subarray(from, to),
      stress: rec.stress.subarray(from, to),
      rows: to - from,
      test: { index: k + 1, of: m, fromSample: from, toSample: to - 1 },
      warnings: [...rec.warnings, `test ${k + 1} of ${m} in this file: samples ${from}–${to - 1} of its data (the record starts over where strain and stress fall back near zero and the stress rises again; each test is analysed as a specimen of its own)`],
    };
    out.push({ record, analysis: k === 0 ? { ...first, warnings: first.warnings.filter((w) => w.code !== 'secondTest'), furtherTests: [] } : analyze(record) });
  }
  return out;
}
