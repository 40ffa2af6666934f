import { linearRegression } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import {
  coldWorkWindow, evaluateRoute, fitTaborFactor, HARDNESS_DEFAULTS, hollomon, InputError, normalSampler, stateProperties, strainForHardness,
  STANDARD_GRAVITY, taborHardness, VICKERS_CONTACT_RATIO, voce, xoshiro128ss, type Material,
} from '../../../src/core/index.js';
import { expectAbsClose, expectRelClose } from '../../helpers.js';

// Callister, Fundamentals of Materials Science and Engineering, 2nd ed., p. 199: annealed copper
// K = 530 MPa, n = 0.44; annealed low-carbon steel K = 600 MPa, n = 0.21 (true stress, true strain).
const copperLaw = hollomon({ K: 530, n: 0.44 });
const steelLaw = hollomon({ K: 600, n: 0.21 });
const copper = (hardness?: Material['hardness']): Material => ({ name: 'copper', elasticModulus: 115000, poissonRatio: 0.3, law: copperLaw, ...(hardness ? { hardness } : {}) });

describe('Vickers geometry and the default Tabor factor', () => {
  it('sin(68°) is the ISO 6507-1 constant 1.8544 over 2 (HV = 1.8544·F/d², F in kgf; the constant from memory)', () => {
    // 1.8544 is printed to 4 decimals, so agreement to 3e-5 relative is all it can show.
    expectRelClose(2 * VICKERS_CONTACT_RATIO, 1.8544, 3e-5);
    // The same constant in newtons, 0.1891 = 1.8544/9.80665 (ISO 6507-1, from memory; 4 digits).
    expectRelClose((2 * VICKERS_CONTACT_RATIO) / STANDARD_GRAVITY, 0.1891, 3e-4);
  });
  it('the default c is Tabor\'s 3 times the contact ratio, εr 0.08 (Tabor 1951, from memory)', () => {
    expectRelClose(HARDNESS_DEFAULTS.taborFactor, 3 * Math.sin((68 * Math.PI) / 180), 1e-15);
    expect(HARDNESS_DEFAULTS.representativeStrain).toBe(0.08);
  });
});

describe("taborHardness: Tabor's relation in closed form with the plan's own c and εr", () => {
  const model = { taborFactor: 2.9, representativeStrain: 0.1 };
  it('Hollomon: HV = c·K·(ε̄ + εr)ⁿ/g₀ (derived from σ = K·εⁿ)', () => {
    for (const e of [0, 0.05, 0.3, 1.2]) expectRelClose(taborHardness(copperLaw, e, model), (2.9 * 530 * (e + 0.1) ** 0.44) / 9.80665, 1e-14, `ε̄ ${e}`);
  });
  it('Voce: HV = c·(σ0 + Q(1 − e^(−b(ε̄+εr))))/g₀ (derived from Voce 1948)', () => {
    const law = voce({ sigma0: 200, Q: 150, b: 10 });
    for (const e of [0, 0.1, 0.5]) expectRelClose(taborHardness(law, e, model), (2.9 * (200 + 150 * (1 - Math.exp(-10 * (e + 0.1))))) / 9.80665, 1e-14, `ε̄ ${e}`);
  });
  it('the ledger gives the same HV on every row, with the material\'s own model, and the default without one', () => {
    const steps = [{ kind: 'roll' as const, thickness: 1.6 }, { kind: 'anneal' as const }, { kind: 'roll' as const, thickness: 1.2 }];
    const given = evaluateRoute({ material: copper({ ...model, basis: 'given' }), start: { thickness: 2 }, steps });
    const dflt = evaluateRoute({ material: copper(), start: { thickness: 2 }, steps });
    for (let i = 0; i < 3; i++) {
      const e = given.rows[i]!.accumulatedStrain;
      expectRelClose(given.rows[i]!.hardnessHV, (2.9 * 530 * (e + 0.1) ** 0.44) / 9.80665, 1e-14, `row ${i + 1}`);
      expectRelClose(dflt.rows[i]!.hardnessHV, (3 * 0.92718385 * 530 * (e + 0.08) ** 0.44) / 9.80665, 1e-8, `row ${i + 1} default`);
    }
    // Annealing brings the hardness back to the annealed value.
    expect(given.rows[1]!.hardnessHV).toBe(given.initial.hardnessHV);
  });
  it('strainForHardness inverts taborHardness; below the annealed hardness it is at most 0', () => {
    for (const e of [0.01, 0.2, 0.9]) expectRelClose(strainForHardness(copperLaw, taborHardness(copperLaw, e, model), model)!, e, 1e-10, `ε̄ ${e}`);
    expect(strainForHardness(copperLaw, 10, model)!).toBeLessThanOrEqual(0);
    const sat = voce({ sigma0: 200, Q: 150, b: 10 });
    expect(strainForHardness(sat, (2.9 * 350) / 9.80665 + 1, model)).toBeNull();
  });
});

describe('published hardness against the ledger with a handbook law (default c and εr)', () => {
  // The typical values are those listed in ../shared/CHECKS.md, themselves FROM MEMORY (no printed page):
  // annealed pure copper 40–55 HV; half-hard copper strip 80–100 HV; hard 90–115 HV; annealed
  // low-carbon steel strip 100–130 HV. Tolerance: the range widened by 10 % on each side, the usual
  // accuracy of Tabor's estimate for work-hardened metals (common practice).
  const within = (hv: number, lo: number, hi: number, what: string) => {
    expect(hv, `${what}: ${hv.toFixed(1)} HV vs ${lo}–${hi}`).toBeGreaterThanOrEqual(lo * 0.9);
    expect(hv, `${what}: ${hv.toFixed(1)} HV vs ${lo}–${hi}`).toBeLessThanOrEqual(hi * 1.1);
  };
  // ASTM B601 rolled tempers (per CHECKS.md): H02 half hard = 2 B&S numbers of reduction, H04 hard = 4;
  // one B&S number is a thickness ratio of 92^(1/39) (ASTM B258).
  const bs = (numbers: number) => 2 / 92 ** (numbers / 39);
  const rolled = (numbers: number) => evaluateRoute({ material: copper(), start: { thickness: 2 }, steps: [{ kind: 'roll', thickness: bs(numbers) }] }).rows[0]!;
  it('annealed copper: 40–55 HV', () => {
    const hv = evaluateRoute({ material: copper(), start: { thickness: 2 }, steps: [] }).initial.hardnessHV;
    within(hv, 40, 55, 'annealed copper');
    expectRelClose(hv, 49.48, 1e-3); // pinned: 2.7815·530·0.08^0.44/9.80665
  });
  it('half-hard copper strip (H02): 80–100 HV', () => within(rolled(2).hardnessHV, 80, 100, 'H02 copper'));
  it('hard copper strip (H04): 90–115 HV; the Hollomon extrapolation past εu reads high (non-conservative)', () => {
    const r = rolled(4);
    within(r.hardnessHV, 90, 115, 'H04 copper');
    // ε̄ + εr is past Callister's uniform strain n = 0.44: the law is extrapolated, and the estimate lies
    // above the typical range's top. Documented in docs/hardness.md; kept here so a change shows.
    expect(r.accumulatedStrain + 0.08).toBeGreaterThan(0.44);
    expect(r.hardnessHV).toBeGreaterThan(115);
  });
  it('why H04 reads high: the law\'s strength there is too high, not Tabor\'s factor nor the temper boundary', () => {
    // Published tensile strength of C11000 strip, ASTM B152 (values FROM MEMORY, not looked up):
    // H02 half hard 255–315 MPa (37–46 ksi), H04 hard 295–360 MPa (43–52 ksi).
    const h02 = rolled(2);
    const h04 = rolled(4);
    // At H02 the state is inside the law's uniform strain and its Rm lies in the published range ...
    expect(h02.accumulatedStrain).toBeLessThan(copperLaw.uniformStrain());
    expect(h02.tensileStrength).toBeGreaterThanOrEqual(255);
    expect(h02.tensileStrength).toBeLessThanOrEqual(315);
    // ... at H04 it is past it (the ledger warns 'necking'), and the extrapolated Hollomon Rm overshoots
    // the published top by more than 10 %: the law keeps rising where copper's hardening levels off.
    expect(h04.warnings.map((w) => w.code)).toContain('necking');
    expect(h04.tensileStrength / 360).toBeGreaterThan(1.1);
    // Scale the flow stress down by that overshoot and the same Tabor relation (default c, εr) gives a
    // hardness inside the typical hard-copper range (90–115 HV): the factor is not the cause.
    // (Strictly inside, without the 10 % widening of `within`: 121.4 × 360/402.7 ≈ 108.5 HV, while the
    // unscaled 121.4 HV is above 115.)
    const scaled = h04.hardnessHV * (360 / h04.tensileStrength);
    expect(scaled).toBeGreaterThanOrEqual(90);
    expect(scaled).toBeLessThanOrEqual(115);
    expect(h04.hardnessHV).toBeGreaterThan(115);
  });
  it('annealed low-carbon steel strip: 100–130 HV', () => {
    const m: Material = { name: 'steel', elasticModulus: 207000, poissonRatio: 0.3, law: steelLaw };
    within(stateProperties(m, 0).hardnessHV, 100, 130, 'annealed low-carbon steel');
  });
  it('agrees with Callister\'s TS(MPa) ≈ 3.45·HB and HB ≈ 0.95·HV for steels (Callister eq. 6.20a, from memory; ISO 18265 steel table ratio, from memory) within 15 %', () => {
    // 15 %: Tabor's estimate (±10 %) and the empirical TS–HB line (scatter of several per cent) together.
    const m: Material = { name: 'steel', elasticModulus: 207000, poissonRatio: 0.3, law: steelLaw };
    for (const e of [0, 0.1, 0.2]) {
      const p = stateProperties(m, e);
      expectRelClose(p.hardnessHV, p.tensileStrength / 3.45 / 0.95, 0.15, `ε̄ ${e}`);
    }
  });
});

describe('fitTaborFactor: c from readings, least squares through the origin', () => {
  // Invented readings (not measured): five states of Callister copper.
  const readings = [{ strain: 0, hv: 52 }, { strain: 0.1, hv: 80 }, { strain: 0.27, hv: 97 }, { strain: 0.54, hv: 121 }, { strain: 0.8, hv: 140 }];
  it('matches numpy.linalg.lstsq and scipy.stats.t.ppf (NumPy 2.4.6, SciPy 1.17.1; script in the comment)', () => {
    // python3: x = 530*(eps+0.08)**0.44; y = hv*9.80665; c = lstsq(x[:,None], y)[0][0];
    // se = sqrt(r@r/(n-1)/(x@x)); t = scipy.stats.t.ppf(0.975, n-1); interval c ± t·se.
    const f = fitTaborFactor(copperLaw, readings, 0.08);
    expectRelClose(f.taborFactor, 2.8140234022145063, 1e-12);
    expectRelClose(f.standardError, 0.06017799429373627, 1e-10);
    // The t quantile is ours (studentTQuantile), checked against SciPy's to 1e-8 through the interval.
    expectRelClose(f.interval[0], 2.6469425045170416, 1e-8);
    expectRelClose(f.interval[1], 2.981104299911971, 1e-8);
  });
  it('the slope equals simple-statistics\' linearRegression on the readings mirrored through the origin', () => {
    // Mirroring (x, y) to (−x, −y) makes both means zero, so the ordinary regression slope is Σxy/Σx².
    const pts: [number, number][] = [];
    for (const r of readings) {
      const x = copperLaw.stress(r.strain + 0.08);
      pts.push([x, r.hv * 9.80665], [-x, -r.hv * 9.80665]);
    }
    const ref = linearRegression(pts);
    expectRelClose(fitTaborFactor(copperLaw, readings).taborFactor, ref.m, 1e-12);
    expectAbsClose(ref.b, 0, 1e-9);
  });
  it('recovers a known c from seeded noisy readings, inside its 95 % interval', () => {
    // One seeded draw; about one seed in 20 would miss a 95 % interval (seed 150201 does: its eight
    // deviates average +0.36), which is why the coverage test below checks the interval's calibration.
    const z = normalSampler(xoshiro128ss(1));
    const c = 2.95;
    const strains = [0, 0.05, 0.1, 0.2, 0.3, 0.45, 0.6, 0.8];
    const noisy = strains.map((s) => ({ strain: s, hv: (c * copperLaw.stress(s + 0.08)) / 9.80665 * (1 + 0.03 * z()) }));
    const f = fitTaborFactor(copperLaw, noisy);
    expect(f.interval[0]).toBeLessThan(c);
    expect(f.interval[1]).toBeGreaterThan(c);
    expectRelClose(f.taborFactor, c, 0.05);
  });
  it('the 95 % interval covers the true c in about 95 % of seeded replicates (constant-variance noise)', () => {
    // 2000 replicates: the binomial sd of the coverage is 0.5 %, so [0.93, 0.97] is a 4-sd band.
    const z = normalSampler(xoshiro128ss(7));
    const c = 2.8;
    const strains = [0, 0.1, 0.25, 0.5];
    let hits = 0;
    const N = 2000;
    for (let k = 0; k < N; k++) {
      const rs = strains.map((s) => ({ strain: s, hv: (c * copperLaw.stress(s + 0.08)) / 9.80665 + 4 * z() }));
      const f = fitTaborFactor(copperLaw, rs);
      if (f.interval[0] <= c && c <= f.interval[1]) hits++;
    }
    expect(hits / N).toBeGreaterThan(0.93);
    expect(hits / N).toBeLessThan(0.97);
  });
  it('refuses too few readings, a reading out of range, and readings that imply an impossible c, naming the field', () => {
    expect(() => fitTaborFactor(copperLaw, [{ strain: 0, hv: 50 }])).toThrow(/material\.hardness\.readings.*at least 2/);
    expect(() => fitTaborFactor(copperLaw, [{ strain: 0, hv: 50 }, { strain: -1, hv: 60 }])).toThrow(/readings\[1\]\.strain/);
    // HV given in MPa by mistake: c would be ~27.
    const e = (() => { try { fitTaborFactor(copperLaw, [{ strain: 0, hv: 485 }, { strain: 0.3, hv: 925 }]); } catch (x) { return x; } })();
    expect(e).toBeInstanceOf(InputError);
    expect(String((e as Error).message)).toMatch(/Tabor factor in \[1, 5\]/);
  });
});

describe('hardness targets and the cold-work window', () => {
  it('minHardnessHV and maxHardnessHV give the bounds where the Tabor estimate meets them, checked on the ledger', () => {
    const win = coldWorkWindow(copperLaw, 0, { minHardnessHV: 90, maxHardnessHV: 110 }, 'thickness');
    expect(win.empty).toBe(false);
    expect(win.limitedBy).toEqual({ from: 'minHardnessHV', to: 'maxHardnessHV' });
    expectRelClose(taborHardness(copperLaw, win.strainFrom!), 90, 1e-10);
    expectRelClose(taborHardness(copperLaw, win.strainTo!), 110, 1e-10);
    // A strip rolled to just inside each end meets both targets; just outside misses one.
    const t = (s: number) => 2 * Math.exp((-s * Math.sqrt(3)) / 2);
    const at = (s: number) => evaluateRoute({ material: copper(), start: { thickness: 2 }, steps: [{ kind: 'roll', thickness: t(s) }], targets: { minHardnessHV: 90, maxHardnessHV: 110 } });
    expect(at(win.strainFrom! + 1e-4).allTargetsMet).toBe(true);
    expect(at(win.strainTo! - 1e-4).allTargetsMet).toBe(true);
    expect(at(win.strainFrom! - 1e-3).targets.find((x) => x.name === 'minHardnessHV')!.met).toBe(false);
    expect(at(win.strainTo! + 1e-3).targets.find((x) => x.name === 'maxHardnessHV')!.met).toBe(false);
  });
  it('uses the material\'s own c: a larger c needs less strain for the same minimum', () => {
    const a = coldWorkWindow(copperLaw, 0, { minHardnessHV: 100 }, null);
    const b = coldWorkWindow(copperLaw, 0, { minHardnessHV: 100 }, null, { taborFactor: 3.2, representativeStrain: 0.08 });
    expect(b.strainFrom!).toBeLessThan(a.strainFrom!);
    expectRelClose(taborHardness(copperLaw, b.strainFrom!, { taborFactor: 3.2, representativeStrain: 0.08 }), 100, 1e-10);
  });
  it('a hardness above the saturation of a Voce law is unreachable; contradictory limits are refused', () => {
    const w = coldWorkWindow(voce({ sigma0: 100, Q: 100, b: 10 }), 0, { minHardnessHV: 80 }, null);
    expect(w.empty).toBe(true);
    expect(w.note).toMatch(/minHardnessHV 80/);
    expect(() => evaluateRoute({ material: copper(), start: {}, steps: [], targets: { minHardnessHV: 120, maxHardnessHV: 100 } })).toThrow(/targets\.maxHardnessHV/);
  });
  it('margins are in HV: predicted − limit for the minimum, limit − predicted for the maximum', () => {
    const l = evaluateRoute({ material: copper(), start: { thickness: 2 }, steps: [{ kind: 'roll', thickness: 1.6 }], targets: { minHardnessHV: 80, maxHardnessHV: 90 } });
    const hv = l.rows[0]!.hardnessHV;
    const [mn, mx] = l.targets;
    expect(mn).toMatchObject({ name: 'minHardnessHV', met: true });
    expectRelClose(mn!.margin, hv - 80, 1e-14);
    expect(mx).toMatchObject({ name: 'maxHardnessHV', met: false });
    expectRelClose(mx!.margin, 90 - hv, 1e-14);
  });
});
