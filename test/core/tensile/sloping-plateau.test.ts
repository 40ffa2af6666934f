import { describe, expect, it } from 'vitest';
import { analyzeRecord, xoshiro128ss } from '../../../src/core/index.js';

// A Lüders plateau that rises or falls a little (ISO 6892-1 §3.10.2: yielding at "about" constant force; the
// plateau of a real mild steel tilts by a few tenths of a percent — common practice). INVENTED records built here by
// hand, apart from the project's generators: an elastic line (E 205 GPa) to ReH = 1.06·ReL, a fall over 2e-4
// strain to the plateau, the plateau going linearly from ReL·(1 − tilt) to ReL over the Lüders strain, then a
// hardening branch s = ReL·(1 + z/a)^n·e^(−z), z = e − eL (slope ReL·n/a = 2,800 MPa at the knee, maximum force at
// z = n − a), necking to 80 % of Rm and fracture.
// Truth by the ISO 6892-1 definitions on the noise-free curve: Ae from ReH to where work hardening starts (eL),
// ReL the lowest stress during yielding (the plateau's lower end).
// Tolerances: noise-free, Ae within 0.05 point (an eighth of issue 12's 0.4 point; the samples lie 0.005 point
// apart) and ReL within 0.1 % (the plateau line is fitted to exact samples); ReH within issue 12's 1.5 %, as the
// highest sample before the drop stands up to 10 MPa below the true peak at this sample spacing.
// Before the sloping plateau was fitted, a plateau rising by 0.45 % over 2 % strain read Ae 1.2 points short (the
// level plateau's band ended part-way up the slope and the hinge fit took the rise for the start of hardening).
const E = 205_000, RE_L = 280, N = 0.2, A0 = 0.02;

function record(tilt: number, lueders: number, points: number, noise: number, seed: number) {
  const reH = 1.06 * RE_L, eH = reH / E, eD = eH + 2e-4, eL = eD + lueders;
  const zMax = N - A0, eU = eL + zMax, eF = eU + 0.1;
  const branch = (z: number) => RE_L * (1 + z / A0) ** N * Math.exp(-z);
  const rm = branch(zMax);
  const plateau = (e: number) => RE_L * (1 + tilt * ((e - eD) / (eL - eD) - 1));
  const curve = (e: number) => {
    if (e <= eH) return E * e;
    if (e <= eD) return reH + ((plateau(eD) - reH) * (e - eH)) / (eD - eH);
    if (e <= eL) return plateau(e);
    if (e <= eU) return branch(e - eL);
    return rm - (0.2 * rm * ((e - eU) / (eF - eU)) ** 2); // necking to 80 % of Rm at fracture
  };
  const rng = xoshiro128ss(seed);
  const gauss = () => Math.sqrt(-2 * Math.log(1 - rng.nextFloat())) * Math.cos(2 * Math.PI * rng.nextFloat());
  const strain = new Float64Array(points + 20), stress = new Float64Array(points + 20);
  for (let i = 0; i < points; i++) {
    const e = (eF * i) / (points - 1);
    strain[i] = e; stress[i] = curve(e) + noise * rm * gauss();
  }
  // After fracture: the load gone, the extensometer still reading.
  for (let i = points; i < points + 20; i++) { strain[i] = eF; stress[i] = noise * rm * gauss(); }
  return { strain, stress, truth: { aePct: (eL - eH) * 100, reL: Math.min(plateau(eD), plateau(eL)), reH } };
}

describe('a sloping Lüders plateau (INVENTED records)', () => {
  for (const tilt of [0.005, 0.003, -0.005, 0]) {
    for (const lueders of [0.012, 0.025]) {
      it(`plateau ${tilt > 0 ? 'rising' : tilt < 0 ? 'falling' : 'level'} by ${Math.abs(tilt * 100)} % over ${lueders * 100} % strain, noise-free: Ae within 0.05 point, ReL within 0.1 %, ReH within 1.5 %`, () => {
        const r = record(tilt, lueders, 6000, 0, 1);
        const a = analyzeRecord(r, { fit: false });
        expect(a.upperYield).not.toBeNull();
        expect(Math.abs(a.yieldPointElongationPct! - r.truth.aePct), `Ae ${a.yieldPointElongationPct} vs ${r.truth.aePct}`).toBeLessThanOrEqual(0.05);
        expect(Math.abs(a.lowerYield! / r.truth.reL - 1), `ReL ${a.lowerYield} vs ${r.truth.reL}`).toBeLessThanOrEqual(0.001);
        // ReH: the highest sample before the drop (samples 5e-5 strain apart, 10 MPa apart on the elastic line).
        expect(Math.abs(a.upperYield! / r.truth.reH - 1)).toBeLessThanOrEqual(0.015);
      });
    }
  }
  // With noise the level band is wider than these tilts and the level model read these records within 0.07 point
  // already; measured with the sloping plateau: within 0.01 point.
  it("with noise of 0.1 % of Rm (10,000 points, 12 seeds): Ae within issue 12's 0.4 point, ReL within 1.5 %", () => {
    const off: string[] = [];
    for (let seed = 1; seed <= 12; seed++) {
      const tilt = [0.005, -0.005, 0.004][seed % 3]!;
      const r = record(tilt, 0.025, 10_000, 0.001, seed);
      const a = analyzeRecord(r, { fit: false });
      if (a.upperYield === null || !(Math.abs(a.yieldPointElongationPct! - r.truth.aePct) <= 0.4) || !(Math.abs(a.lowerYield! / r.truth.reL - 1) <= 0.015)) off.push(`seed ${seed} tilt ${tilt}: Ae ${a.yieldPointElongationPct} vs ${r.truth.aePct}, ReL ${a.lowerYield} vs ${r.truth.reL}`);
    }
    expect(off).toEqual([]);
  });
});
