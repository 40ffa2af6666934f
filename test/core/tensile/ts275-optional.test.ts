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
});
