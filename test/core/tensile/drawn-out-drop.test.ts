import { describe, expect, it } from 'vitest';
import { analyzeRecord, xoshiro128ss } from '../../../src/core/index.js';
import { holdoutDRecord } from './lab-records-holdout-d.helpers.js';

// A yield drop that a soft machine draws out over tenths of a percent of strain (the load falls only as fast as the
// machine springs back; common practice), against continuous curves that must not read as one. INVENTED records.

describe('a yield drop drawn out by a soft machine', () => {
  it('is found, with ReH, ReL and Ae within issue 12 tolerances (hold-out D 12113: 8.8 % over 0.27 % strain)', () => {
    // Before: the step-or-bend test read the fall as a bend and the record as a yield plateau with no drop.
    const r = holdoutDRecord(12113, 1);
    const t = r.truth;
    const a = analyzeRecord(r, { fit: false });
    expect(a.upperYield).not.toBeNull();
    expect(Math.abs(a.upperYield! / t.reH! - 1)).toBeLessThan(0.015);
    expect(Math.abs(a.lowerYield! / t.reL! - 1)).toBeLessThan(0.015);
    expect(Math.abs(a.yieldPointElongationPct! - t.aePct!)).toBeLessThan(0.4);
  });
  it('a flat top that necks within 1 % strain of the knee is no drop (it never rises again)', () => {
    // Elastic to 600 MPa, a knee, then necking at once (down to 67 % by 2 % strain): a cold-drawn wire's shape. Its
    // fall from the knee is clear of the noise and bends, not steps (a control: the fall is read as the record's
    // maximum force and its necking, and clearFall also asks for the rise after a drop that never comes here).
    const rng = xoshiro128ss(7);
    const E = 205000, n = 3000, strain = new Float64Array(n), stress = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const e = (i / (n - 1)) * 0.02;
      const s = e < 600 / E ? E * e : e < 0.0032 ? 600 : Math.max(400, 600 - 12000 * (e - 0.0032));
      strain[i] = e;
      stress[i] = s + 0.6 * (rng.nextFloat() + rng.nextFloat() + rng.nextFloat() - 1.5);
    }
    const a = analyzeRecord({ strain, stress }, { fit: false });
    expect(a.upperYield).toBeNull();
  });
  it('a rounded knee under correlated noise is no drop (hold-out D continuous records with AR(1) noise)', () => {
    let seen = 0;
    for (let seed = 12000; seed < 12200 && seen < 12; seed++) {
      const r = holdoutDRecord(seed, 1);
      if (r.truth.reH !== null || !r.what.includes('ar-noise')) continue;
      seen++;
      expect(analyzeRecord(r, { fit: false }).upperYield, r.what).toBeNull();
    }
    expect(seen).toBe(12);
  });
});
