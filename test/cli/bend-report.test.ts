import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import Ajv2020 from 'ajv/dist/2020.js';
import { describe, expect, it } from 'vitest';
import { evaluateRoute, hollomon, springback } from '../../src/core/index.js';
import { expectRelClose } from '../helpers.js';

const ROOT = join(import.meta.dirname, '..', '..');
const BIN = join(ROOT, 'bin', 'strainledger.js');
const run = (...args: string[]) => spawnSync(process.execPath, [BIN, ...args], { cwd: ROOT, encoding: 'utf8' });

describe('strainledger run examples/hinge-tab-bend.json --format json (bend step, kinematic material)', () => {
  const r = run('run', 'examples/hinge-tab-bend.json', '--format', 'json');
  const rep = JSON.parse(r.stdout);
  it('exits 0 and validates against the published report schema (ajv, draft 2020-12)', () => {
    expect(r.status).toBe(0);
    const validate = new Ajv2020.default({ allErrors: true, strict: true }).compile(JSON.parse(readFileSync(join(ROOT, 'schema', 'report-v1.json'), 'utf8')));
    expect(validate(rep), JSON.stringify(validate.errors)).toBe(true);
  });
  it('the human-readable reports give the springback target in degrees, the others in their own units', () => {
    const md = run('run', 'examples/hinge-tab-bend.json', '--format', 'md').stdout;
    const t = rep.targets.find((x: { name: string }) => x.name === 'maxSpringbackDeg');
    // Angles to 0.01°, stresses to 0.1 MPa (src/report/numbers.ts DISPLAY_DIGITS).
    expect(md).toContain(`| maximum springback | met | ${t.limit.toFixed(2)} | ${t.predicted.toFixed(2)} | ${t.margin.toFixed(2)} | ° |`);
    expect(md).toMatch(/\| minimum reload yield \(Rp0\.2\) \| met \| 300\.0 \| [\d.]+ \| [\d.]+ \| MPa \|/);
    const junit = run('run', 'examples/hinge-tab-bend.json', '--format', 'junit').stdout;
    expect(junit).toContain(`maximum springback: predicted ${t.predicted.toFixed(2)}°, limit 6.00°, margin ${t.margin.toFixed(2)}°`);
    const table = run('run', 'examples/hinge-tab-bend.json', '--format', 'table').stdout;
    expect(table).toContain(`maximum springback: predicted ${t.predicted.toFixed(2)}°, limit 6.00°, margin ${t.margin.toFixed(2)}°`);
    expect(table).toMatch(/minimum reload yield \(Rp0\.2\): predicted [\d.]+ MPa, limit 300\.0 MPa, margin [\d.]+ MPa/);
  });
  it('has the bend fields on the bend step only, and reverseReloadYield on every step', () => {
    const [roll, bend] = rep.steps;
    for (const k of ['outerFibreStrain', 'springbackDeg', 'finalAngleDeg', 'finalRadius']) {
      expect(bend, k).toHaveProperty(k);
      expect(roll, k).not.toHaveProperty(k);
    }
    expect(roll.reverseReloadYield).toBeLessThan(roll.reloadYield);
    expect(bend.reverseReloadYield).toBeLessThan(bend.reloadYield);
    expectRelClose(bend.finalAngleDeg + bend.springbackDeg, 90, 1e-12, 'angles add up');
    // Outer-fibre strain (t/2 − y0)/ρ, ρ = 4 + 0.9 mm (thin-bending theory, Marciniak, Duncan & Hu §6.2);
    // the backstress weakens the compressed side, so the neutral surface moves outward (y0 > 0) a little.
    expect(bend.outerFibreStrain).toBeLessThan(0.9 / 4.9);
    expectRelClose(bend.outerFibreStrain, 0.9 / 4.9, 0.02, 'outer-fibre strain');
    const t = rep.targets.find((x: { name: string }) => x.name === 'maxSpringbackDeg');
    expectRelClose(t.predicted, bend.springbackDeg, 1e-15, 'target predicted');
  });
  it('reports the same springback as the core called directly on the plan data', () => {
    // Plan data: Callister low-carbon steel (K 600, n 0.21, E 207 GPa), invented backstress and chord modulus.
    const material = { name: 'm', elasticModulus: 207000, poissonRatio: 0.3, law: hollomon({ K: 600, n: 0.21 }),
      kinematic: { backstresses: [{ C: 15000, gamma: 150 }] }, modulusDecay: { Ea: 180000, xi: 25 } };
    const led = evaluateRoute({ material, start: { thickness: 2 }, steps: [{ kind: 'roll', thickness: 1.8 }] });
    const X = 100 * (1 - Math.exp(-150 * led.rows[0]!.accumulatedStrain));
    const direct = springback({ ...material, thickness: 1.8, prestrain: led.rows[0]!.accumulatedStrain, backstresses: [X] }, { radius: 4, angleDeg: 90 });
    expectRelClose(rep.steps[1].springbackDeg, direct.springbackDeg, 1e-9, 'springback');
  });
});
