import { describe, expect, it } from 'vitest';
import { evaluateRoute, hollomon, PROCESS_DEFAULTS, temperatureRise, type Material } from '../../../src/core/index.js';
import { expectRelClose } from '../../helpers.js';

describe('temperatureRise(W, ρ, c, β): adiabatic heating ΔT = β·W/(ρ·c)', () => {
  it('uses β = 0.9 by default (Taylor–Quinney; CHECKS.md cites J. Appl. Phys. 136, 065102, 2024)', () => {
    expect(PROCESS_DEFAULTS.heatToWorkFraction).toBe(0.9);
    // 100 MJ/m³ into steel, ρ 7850 kg/m³, c 460 J/(kg·K) (usual handbook values, from memory): 24.92 K.
    expectRelClose(temperatureRise(100, 7850, 460), 0.9 * 100e6 / (7850 * 460), 1e-15, 'ΔT');
    expectRelClose(temperatureRise(100, 7850, 460), 24.925, 1e-4, 'ΔT hand value');
  });
  it('for a Hollomon pass from annealed equals β·K·ε^(n+1)/((n+1)·ρ·c) (work of the law, Dieter §8-3)', () => {
    const m: Material = { name: 'low-carbon steel (Callister)', elasticModulus: 207000, poissonRatio: 0.3, law: hollomon({ K: 600, n: 0.21 }), density: 7850, specificHeat: 486 };
    const row = evaluateRoute({ material: m, start: { diameter: 5 }, steps: [{ kind: 'draw', areaReductionPct: 30 }] }).rows[0]!;
    const e = -Math.log(0.7);
    expectRelClose(row.temperatureRise!, 0.9 * 600 * e ** 1.21 / 1.21 * 1e6 / (7850 * 486), 1e-12, 'ΔT');
  });
  it('warns above the stated limit of 150 K', () => {
    const m: Material = { name: 'hard', elasticModulus: 207000, poissonRatio: 0.3, law: hollomon({ K: 2650, n: 0.12 }), density: 7850, specificHeat: 460 };
    const row = evaluateRoute({ material: m, start: { diameter: 5 }, steps: [{ kind: 'draw', areaReductionPct: 45 }] }).rows[0]!;
    expect(row.temperatureRise!).toBeGreaterThan(150);
    expect(row.warnings.map((w) => w.code)).toContain('heating');
  });
  it('rejects a non-positive density, naming the field', () => {
    expect(() => temperatureRise(10, 0, 460)).toThrow(/material\.density/);
  });
});
