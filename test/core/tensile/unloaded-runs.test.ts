// A machine logs before the load is taken up and on after the specimen broke: runs of samples of an unloaded
// specimen at the start and at the end. They say nothing of the noise of the loaded specimen, and a long quiet tail
// had pulled the record's noise estimate down (the median over blocks), and every threshold tied to it.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyzeRecord, synthesizeLabRecord, xoshiro128ss } from '../../../src/core/index.js';
import { parseRecordText } from '../../../src/records/index.js';
import { expectRelClose } from '../../helpers.js';
import { labCase } from './lab-records.helpers.js';

/** The record with `before` samples at rest (stress ±0.05 MPa about 0, strain 0) and `after` samples of the broken specimen (stress ±0.3 MPa about 0, strain held). */
function withRuns(strain: ArrayLike<number>, stress: ArrayLike<number>, before: number, after: number) {
  const e: number[] = [], s: number[] = [];
  for (let k = 0; k < before; k++) { e.push(0); s.push(0.05 * ((k % 3) - 1)); }
  for (let i = 0; i < strain.length; i++) { e.push(strain[i]!); s.push(stress[i]!); }
  const last = strain[strain.length - 1]!;
  for (let k = 0; k < after; k++) { e.push(last); s.push(0.3 * ((k % 5) - 2)); }
  return { strain: e, stress: s };
}

describe('the noise of the loaded specimen: runs at rest before the test and after fracture left out', () => {
  it('the open 46NT71 record (MaterialDigital, CC BY 4.0) with 100 samples at rest before it and 300 after fracture: the same noise, Rp0.2, Rm, Ag and A', () => {
    const f = '46NT71.csv';
    const rec = parseRecordText(readFileSync(join(import.meta.dirname, '..', '..', 'fixtures', '42crmos4', f), 'utf8'), { file: f });
    const plain = analyzeRecord(rec, { fit: false });
    const r = withRuns(rec.strain, rec.stress, 100, 300);
    const a = analyzeRecord(r, { fit: false });
    // Before: 0.48 MPa against 1.7 (measured).
    expectRelClose(a.noise, plain.noise, 0.01, 'noise');
    expectRelClose(a.proofStrength!, plain.proofStrength!, 1e-3, 'Rp0.2');
    expectRelClose(a.tensileStrength, plain.tensileStrength, 1e-4, 'Rm');
    expect(Math.abs(a.uniformElongationPct - plain.uniformElongationPct)).toBeLessThan(0.02);
    expect(Math.abs(a.totalElongationPct - plain.totalElongationPct)).toBeLessThan(0.02);
    expect(a.upperYield).toBeNull();
  });
  it('twelve invented lab records with tails of broken specimen as long as the record: the noise within 5 % of the record\'s own, no yield drop that the record without the tail does not have', () => {
    for (let seed = 1; seed <= 12; seed++) {
      const lab = synthesizeLabRecord({ ...labCase(seed).spec, rng: xoshiro128ss(seed) });
      const plain = analyzeRecord({ strain: lab.strain, stress: lab.stress }, { fit: false });
      const a = analyzeRecord(withRuns(lab.strain, lab.stress, 20, lab.strain.length), { fit: false });
      expectRelClose(a.noise, plain.noise, 0.05, `seed ${seed} noise`);
      expect(a.upperYield === null, `seed ${seed} yield drop`).toBe(plain.upperYield === null);
      expectRelClose(a.tensileStrength, plain.tensileStrength, 1e-3, `seed ${seed} Rm`);
    }
  });
});
