import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyzeRecord } from '../../../src/core/index.js';
import { parseRecordText } from '../../../src/records/index.js';

// Optional check on the TS275 records (troegerj/calibration-paper, GPL-3.0): they stay OUT of this
// repository and are read from ../shared/datasets/ when present; the suite skips cleanly otherwise.
// No reference properties are published with them (SOURCE.md there), so this checks the import of a
// second real layout (two strain columns, axial and lateral) and the plausibility of what is found.
const DIR = join(import.meta.dirname, '..', '..', '..', '..', 'shared', 'datasets', 'ts275-steel-tension');
const present = existsSync(join(DIR, 'TS275_0001.csv'));

describe.skipIf(!present)('TS275 records from ../shared/datasets (GPL-3.0, not in the repository)', () => {
  // Row counts from SOURCE.md of that folder.
  const rows: Record<string, number> = { TS275_0001: 129, TS275_0002: 127, TS275_0003: 129, TS275_0004: 133, TS275_0005: 131 };
  for (const [name, n] of Object.entries(rows)) {
    it(`${name}: axial (not lateral) strain is used, and the record is flagged as ending before maximum force`, () => {
      const rec = parseRecordText(readFileSync(join(DIR, `${name}.csv`), 'utf8'), { file: `${name}.csv` });
      expect(rec.rows).toBe(n);
      expect(rec.columns.strain!.name).toBe('axial strain [-]');
      const a = analyzeRecord(rec, { laws: ['voce', 'swift'] });
      expect(a.warnings.some((w) => w.code === 'maxAtEnd')).toBe(true);
      // Plain and low-alloy steels: E ≈ 207 GPa (Callister, Table B.2); ~10 elastic points here, so ±25 %.
      expect(a.elasticModulus).toBeGreaterThan(155000);
      expect(a.elasticModulus).toBeLessThan(260000);
      // SOURCE.md (the dataset's notes, not a published value): hardening starts at ≈270–285 MPa near 0.2 %.
      expect(a.proofStrength!).toBeGreaterThan(240);
      expect(a.proofStrength!).toBeLessThan(320);
      for (const f of a.fits!.fits) expect(f.converged, f.law).toBe(true);
    });
  }

  // Issue 12's aim for the law fits on a second set of real records: each law's RMSE within 1 % of SciPy's.
  // Reference: scipy.optimize.curve_fit ('trf', bounds of LAW_PARAMETERS, ftol = xtol = gtol = 1e-14) from our start
  // values, the blend with α free: `npm run build && node bench/fitter-scipy-open.mjs ../shared/datasets/ts275-steel-tension`.
  // Before the blend's projected restart (fitAllLaws, blendProjectedStart) TS275_0003's blend stopped after 500 steps, 2.5 % above.
  const ref: Record<string, { points: number } & Record<string, number>> = {
    // SciPy 1.17.1, numpy 2.4.6
    'TS275_0001': { points: 113, hollomon: 5.19541600781894, ludwik: 0.8551787911666314, swift: 0.3743490097510053, voce: 0.23469011378650007, hockettSherby: 0.09738311489656526, swiftVoce: 0.05656684943378479 },
    'TS275_0002': { points: 110, hollomon: 5.1790860076401986, ludwik: 0.555422776648408, swift: 0.22900907405109958, voce: 0.3334901491490054, hockettSherby: 0.14813545975200096, swiftVoce: 0.0959818444774862 },
    'TS275_0003': { points: 113, hollomon: 5.402564280800217, ludwik: 0.8384613959302184, swift: 0.3411372987013673, voce: 0.2850103678446112, hockettSherby: 0.10786018801147108, swiftVoce: 0.0840589357458301 },
    'TS275_0004': { points: 116, hollomon: 5.392771988739416, ludwik: 0.9817692494503326, swift: 0.4801781648131185, voce: 0.20029863185497987, hockettSherby: 0.15356255121841958, swiftVoce: 0.11232004341663215 },
    'TS275_0005': { points: 114, hollomon: 5.296133845617029, ludwik: 0.9513673342529192, swift: 0.4585020956747914, voce: 0.21212109882598665, hockettSherby: 0.15699615885510504, swiftVoce: 0.11494932718611778 },
  };
  for (const [name, r] of Object.entries(ref)) {
    it(`${name}: all six laws converged, each RMSE ≤ 1.01 × SciPy's`, () => {
      const a = analyzeRecord(parseRecordText(readFileSync(join(DIR, `${name}.csv`), 'utf8'), { file: `${name}.csv` }));
      for (const f of a.fits!.fits) {
        expect(f.points, name).toBe(r.points);
        expect(f.converged, `${name} ${f.law}`).toBe(true);
        expect(f.rmse, `${name} ${f.law} against SciPy's ${r[f.law]}`).toBeLessThanOrEqual(1.01 * r[f.law]!);
      }
    });
  }
});
