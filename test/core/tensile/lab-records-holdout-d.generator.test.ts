import { describe, expect, it } from 'vitest';
import { holdoutDRecord } from './lab-records-holdout-d.helpers.js';
import type { HoldoutRecordLike } from './holdout-tally.js';

// Tests of hold-out generator D itself (not of the analysis): its INVENTED records are well formed, mixed as the
// header says, deterministic, and their noise-free versions carry the truth they claim, recomputed here from the
// samples alone.

const SEEDS = Array.from({ length: 200 }, (_, i) => 12000 + i);
const noisy = new Map<number, HoldoutRecordLike>();
const clean = new Map<number, HoldoutRecordLike>();
const get = (m: Map<number, HoldoutRecordLike>, seed: number, ns: number) => {
  let r = m.get(seed);
  if (!r) { r = holdoutDRecord(seed, ns); m.set(seed, r); }
  return r;
};

/** E (MPa) and yield-stress ranges of the header's table, by the family key that starts `what`'s features. */
const FAMILY: Record<string, { E: [number, number]; y: [number, number]; ag: [number, number] }> = {
  'mild-steel': { E: [200e3, 210e3], y: [220, 380], ag: [15, 30] },
  'annealed-copper': { E: [115e3, 125e3], y: [55, 95], ag: [30, 50] },
  'annealed-brass': { E: [110e3, 115e3], y: [95, 150], ag: [35, 50] },
  'al-mg': { E: [68e3, 71e3], y: [85, 150], ag: [14, 25] },
  'al-6xxx-t6': { E: [68.5e3, 71e3], y: [240, 300], ag: [5, 10] },
  'al-3xxx-o': { E: [68e3, 70.5e3], y: [35, 70], ag: [15, 28] },
  austenitic: { E: [190e3, 200e3], y: [250, 350], ag: [40, 60] },
  'hs-steel': { E: [200e3, 210e3], y: [700, 1400], ag: [1.5, 5] },
  'dp-steel': { E: [200e3, 210e3], y: [300, 600], ag: [8, 18] },
};
const familyOf = (r: HoldoutRecordLike) => r.what.split(' ')[2]!;

/** Index of the last loaded sample: the sample before the first fall of more than 10 % after the maximum. */
function lastLoaded(s: Float64Array): number {
  let iMax = 0;
  for (let i = 1; i < s.length; i++) if (s[i]! > s[iMax]!) iMax = i;
  for (let i = iMax + 1; i < s.length; i++) if (s[i]! < 0.9 * s[i - 1]!) return i - 1;
  return s.length - 1;
}

describe('hold-out generator D', () => {
  it('gives well-formed records with finite truth in range over seeds 12000–12199', () => {
    for (const seed of SEEDS) {
      const r = get(noisy, seed, 1);
      const t = r.truth;
      const tag = r.what;
      expect(r.what.startsWith(`holdout-d ${seed} `), tag).toBe(true);
      expect(r.strain).toBeInstanceOf(Float64Array);
      expect(r.stress).toBeInstanceOf(Float64Array);
      expect(r.strain.length, tag).toBe(r.stress.length);
      expect(r.strain.length, tag).toBeGreaterThanOrEqual(1000);
      expect(r.strain.length, tag).toBeLessThanOrEqual(150000);
      for (let i = 0; i < r.strain.length; i++) {
        if (!Number.isFinite(r.strain[i]!) || !Number.isFinite(r.stress[i]!)) throw new Error(`${tag}: sample ${i} not finite`);
      }
      const fam = FAMILY[familyOf(r)];
      expect(fam, tag).toBeDefined();
      for (const v of [t.E, t.rp02, t.rm, t.agPct, t.aPct, t.serration, t.elasticPoints, t.rateRatio!]) expect(Number.isFinite(v), tag).toBe(true);
      expect(t.E, tag).toBeGreaterThanOrEqual(fam!.E[0]);
      expect(t.E, tag).toBeLessThanOrEqual(fam!.E[1]);
      expect(t.rp02, tag).toBeLessThan(t.rm);
      expect(t.agPct, tag).toBeGreaterThanOrEqual(fam!.ag[0] - 1e-9);
      expect(t.agPct, tag).toBeLessThanOrEqual(fam!.ag[1] + 1e-9);
      expect(t.agPct, tag).toBeLessThan(t.aPct);
      expect(t.aPct, tag).toBeLessThan(80);
      expect(t.serration, tag).toBeGreaterThanOrEqual(0);
      expect(t.serration, tag).toBeLessThan(0.04);
      expect(Number.isInteger(t.elasticPoints), tag).toBe(true);
      expect(t.rateRatio === 1 || (t.rateRatio! >= 2 && t.rateRatio! <= 10), tag).toBe(true);
      expect(r.what.includes(`rate x${t.rateRatio}`), tag).toBe(t.rateRatio !== 1);
      if (r.what.includes(' drop')) {
        expect(t.reH, tag).not.toBeNull();
        for (const v of [t.reH!, t.reL!, t.aePct!, t.dropEvidence!]) expect(Number.isFinite(v), tag).toBe(true);
        expect(t.reH!, tag).toBeGreaterThanOrEqual(fam!.y[0] * 0.9);
        expect(t.reH!, tag).toBeLessThanOrEqual(fam!.y[1]);
        expect(t.reL!, tag).toBeLessThan(t.reH!);
        expect((t.reH! - t.reL!) / t.reH!, tag).toBeLessThan(0.12);
        expect(t.aePct!, tag).toBeGreaterThan(0.45);
        expect(t.aePct!, tag).toBeLessThanOrEqual(4 + 1e-9);
        expect(t.serration, tag).toBeGreaterThan(0.003);
        expect(t.dropEvidence!, tag).toBeGreaterThanOrEqual(0);
        expect(t.rm, tag).toBeGreaterThan(t.reH!);
      } else {
        expect(t.reH, tag).toBeNull();
        expect(t.reL, tag).toBeNull();
        expect(t.aePct, tag).toBeNull();
        expect(t.dropEvidence ?? null, tag).toBeNull();
        expect(t.rp02, tag).toBeGreaterThanOrEqual(fam!.y[0] - 1e-9);
        expect(t.rp02, tag).toBeLessThanOrEqual(fam!.y[1] + 1e-9);
        if (r.what.includes(' plc-')) { expect(t.serration, tag).toBeGreaterThanOrEqual(0.0005); expect(t.serration, tag).toBeLessThanOrEqual(0.005); }
        else expect(t.serration, tag).toBe(0);
      }
    }
  });

  it('mixes families and features as the header says', () => {
    const n = (k: string) => SEEDS.filter((s) => get(noisy, s, 1).what.includes(k)).length;
    const drops = SEEDS.filter((s) => get(noisy, s, 1).truth.reH !== null).length;
    expect(drops).toBeGreaterThanOrEqual(60);
    expect(drops).toBeLessThanOrEqual(80);
    for (const f of Object.keys(FAMILY)) expect(n(` ${f} `), f).toBeGreaterThanOrEqual(5);
    for (const law of [' swift ', ' voce ', ' ludwik ', ' hockett-sherby ', ' voce+linear ', ' swift+voce ']) expect(n(law), law).toBeGreaterThanOrEqual(5);
    for (const k of [' plc-A', ' plc-B', ' toe', ' preload', ' ar-noise', ' drift', ' quantised', ' strain-q', ' strain-steps']) expect(n(k), k).toBeGreaterThanOrEqual(5);
    const rate = n(' rate x');
    expect(rate).toBeGreaterThanOrEqual(30);
    expect(rate).toBeLessThanOrEqual(70);
  });

  it('reproduces its own truth from the noise-free samples', () => {
    let fitted = 0;
    for (const seed of SEEDS) {
      const r = get(clean, seed, 0);
      const t = r.truth, e = r.strain, s = r.stress, tag = r.what;
      expect(tag.includes('noise-free'), tag).toBe(true);
      const Y = t.reH ?? t.rp02;
      // E from a least-squares line on the straight elastic part (past any toe, below any departure from it).
      let n = 0, sx = 0, sy = 0, sxx = 0, sxy = 0;
      for (let i = 0; i < e.length && s[i]! < 0.5 * Y; i++) {
        if (s[i]! < 0.22 * Y || s[i]! > 0.33 * Y) continue;
        n++; sx += e[i]!; sy += s[i]!; sxx += e[i]! * e[i]!; sxy += e[i]! * s[i]!;
      }
      let e0: number;
      if (n >= 3) {
        const slope = (n * sxy - sx * sy) / (n * sxx - sx * sx);
        const icpt = (sy - slope * sx) / n;
        expect(Math.abs(slope / t.E - 1), tag).toBeLessThan(1e-6);
        e0 = -icpt / slope;
        fitted++;
      } else {
        // Too few samples on the straight part: take the origin from one sample on it.
        const i = s.findIndex((v) => v >= 0.22 * Y);
        e0 = e[i]! - s[i]! / t.E;
      }
      if (tag.includes(' preload')) { expect(e0, tag).toBeLessThan(0); expect(s[0]!, tag).toBeGreaterThan(0); }
      else if (tag.includes(' toe')) expect(e0, tag).toBeGreaterThan(0);
      else expect(Math.abs(e0), tag).toBeLessThan(1e-9);

      // Rm is the highest noise-free stress; A from the last loaded sample.
      const iLast = lastLoaded(s);
      let iMax = 0;
      for (let i = 0; i < s.length; i++) if (s[i]! > s[iMax]!) iMax = i;
      expect(Math.abs(s[iMax]! - t.rm), tag).toBeLessThan(1e-9 * t.rm);
      expect(Math.abs(100 * (e[iLast]! - e0 - s[iLast]! / t.E) - t.aPct), tag).toBeLessThan(1e-4);
      for (let i = 1; i <= iLast; i++) if (e[i]! < e[i - 1]! - 1e-12) throw new Error(`${tag}: noise-free strain falls at ${i}`);
      // The samples after the fracture fall: 1–3 samples down, then 0–30 at zero load.
      const after = s.length - 1 - iLast;
      expect(after, tag).toBeGreaterThanOrEqual(1);
      expect(after, tag).toBeLessThanOrEqual(33);

      // Rp0.2: where the 0.2 % offset line crosses the sampled curve.
      let rp = NaN, step = 0;
      for (let i = 1; i <= iLast; i++) {
        const g1 = s[i]! - t.E * (e[i]! - e0 - 0.002);
        if (g1 <= 0) {
          const g0 = s[i - 1]! - t.E * (e[i - 1]! - e0 - 0.002);
          rp = s[i - 1]! + (s[i]! - s[i - 1]!) * (g0 / (g0 - g1));
          step = Math.abs(s[i]! - s[i - 1]!);
          break;
        }
      }
      expect(Math.abs(rp - t.rp02), tag).toBeLessThanOrEqual(Math.max(1e-3 * t.rp02, step));

      // Ag: inside the top of the curve (samples within 0.6 % of Rm), and at the top sample itself when the top is smooth.
      let lo = Infinity, hi = -Infinity;
      for (let i = 0; i <= iLast; i++) if (s[i]! >= t.rm * 0.994) { const a = 100 * (e[i]! - e0 - s[i]! / t.E); lo = Math.min(lo, a); hi = Math.max(hi, a); }
      expect(t.agPct, tag).toBeGreaterThanOrEqual(lo - 0.05);
      expect(t.agPct, tag).toBeLessThanOrEqual(hi + 0.05);
      if (t.serration === 0 || t.reH !== null) {
        const spacing = 100 * Math.max(e[iMax + 1]! - e[iMax]!, e[iMax]! - e[iMax - 1]!);
        expect(Math.abs(100 * (e[iMax]! - e0 - t.rm / t.E) - t.agPct), tag).toBeLessThanOrEqual(spacing + 0.02);
      }

      // elasticPoints: between the samples below 0.9·yield on the rise and those of them above 0.2·yield.
      let below = 0, above02 = 0;
      for (let i = 0; i < e.length && s[i]! < 0.9 * Y; i++) { below++; if (s[i]! >= 0.2 * Y) above02++; }
      expect(t.elasticPoints, tag).toBeLessThanOrEqual(below);
      expect(t.elasticPoints, tag).toBeGreaterThanOrEqual(above02);

      if (t.reH === null) continue;
      // ReH: the highest sample before the first fall of 2 % (or, flagged, the curve's own peak when sampling stepped over it).
      let run = 0, iH = 0;
      for (let i = 0; i < s.length; i++) { if (s[i]! > run) { run = s[i]!; iH = i; } else if (s[i]! < 0.98 * run) break; }
      if (tag.includes('peak not caught')) expect(t.reH, tag).toBeGreaterThanOrEqual(run);
      else expect(Math.abs(run - t.reH), tag).toBeLessThan(1e-9 * t.reH);
      // Ae: from the upper yield point to the last local minimum before the hardening rise to Rm.
      let j = iMax;
      while (j > iH + 1 && s[j - 1]! < s[j]!) j--;
      const ae = 100 * (e[j]! - e[iH]!);
      const gap = 100 * Math.max(e[j + 1]! - e[j]!, e[j]! - e[j - 1]!, e[iH + 1]! - e[iH]!);
      expect(Math.abs(ae - t.aePct!), tag).toBeLessThanOrEqual(2 * gap + 0.02);
      // ReL: a sample of the plateau, no higher than any plateau sample past the first plateau peak... and below ReH.
      let minPl = Infinity, hit = false, maxSer = 0;
      for (let i = iH + 1; i <= j; i++) {
        minPl = Math.min(minPl, s[i]!);
        if (Math.abs(s[i]! - t.reL!) < 1e-9 * t.reL!) hit = true;
        if (i > iH + 1) maxSer = Math.max(maxSer, Math.abs(s[i]! - s[i - 1]!));
      }
      expect(hit || tag.includes('peak not caught'), tag).toBe(true);
      expect(t.reL!, tag).toBeGreaterThanOrEqual(minPl - 1e-9);
      expect(t.reL!, tag).toBeLessThan(t.reH);
      expect(t.dropEvidence, tag).toBe(Number.POSITIVE_INFINITY);
    }
    // Most records hold enough samples on the straight elastic part for the line above.
    expect(fitted).toBeGreaterThan(150);
  });

  it('keeps the curve and sampling when the noise is switched off, and is deterministic', () => {
    for (const seed of SEEDS) {
      const a = get(noisy, seed, 1), c = get(clean, seed, 0);
      expect(a.strain.length, a.what).toBe(c.strain.length);
      expect(a.truth.E).toBe(c.truth.E);
      expect(a.truth.rp02).toBe(c.truth.rp02);
      expect(a.truth.rm).toBe(c.truth.rm);
      expect(a.truth.aPct).toBe(c.truth.aPct);
      let ds = 0, de = 0, differs = false;
      for (let i = 0; i < a.strain.length; i++) {
        ds = Math.max(ds, Math.abs(a.stress[i]! - c.stress[i]!));
        de = Math.max(de, Math.abs(a.strain[i]! - c.strain[i]!));
        if (a.stress[i] !== c.stress[i]) differs = true;
      }
      expect(differs, a.what).toBe(true);
      expect(ds, a.what).toBeLessThan(0.06 * a.truth.rm + 2);
      expect(de, a.what).toBeLessThan(2e-5);
      const b = holdoutDRecord(seed, 1);
      expect(b.what).toBe(a.what);
      expect(b.truth).toEqual(a.truth);
      expect(Buffer.from(b.strain.buffer).equals(Buffer.from(a.strain.buffer)), a.what).toBe(true);
      expect(Buffer.from(b.stress.buffer).equals(Buffer.from(a.stress.buffer)), a.what).toBe(true);
    }
  });
});
