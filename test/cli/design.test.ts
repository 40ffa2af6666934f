import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { expectRelClose } from '../helpers.js';

// Runs the shipped runner (bin/ → dist/) as a user would; test/globalSetup.ts builds dist/ first.
const ROOT = join(import.meta.dirname, '..', '..');
const BIN = join(ROOT, 'bin', 'strainledger.js');
const cli = (...args: string[]) => spawnSync(process.execPath, [BIN, ...args], { cwd: ROOT, encoding: 'utf8' });
const EXAMPLE = 'examples/design-fencing-wire.yaml';

describe('strainledger design SPEC', () => {
  it('prints ranked routes with anneal explanations and the cautions, exit 0', () => {
    const r = cli('design', EXAMPLE);
    expect(r.status).toBe(0);
    expect(r.stderr).toBe('');
    expect(r.stdout).toMatch(/route 1: 1 anneal\(s\), 5 passes/);
    expect(r.stdout).toMatch(/last anneal at [\d.]+ mm: the remaining reduction to 2\.5 mm/);
    expect(r.stdout).toMatch(/licensed engineering judgment/);
  });
  it('--format json gives routes whose plans the runner runs with every target met (exit 0)', () => {
    const r = cli('design', EXAMPLE, '--format', 'json');
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.feasible).toBe(true);
    expect(out.routes.length).toBeGreaterThan(1);
    // Total strain 2·ln(5.5/2.5) (drawing, DESIGN.md §4).
    expectRelClose(out.totalStrain, 2 * Math.log(5.5 / 2.5), 1e-12, 'total strain');
    // Ductility 1.6 with a 20 % margin (the example spec).
    expectRelClose(out.maxStrainBeforeAnneal, 1.28, 1e-12, 'strain between anneals');
    const dir = mkdtempSync(join(tmpdir(), 'sl-design-'));
    for (const route of out.routes) {
      const f = join(dir, `r${route.rank}.json`);
      writeFileSync(f, JSON.stringify(route.plan));
      const run = cli('run', f, '--format', 'json');
      expect(run.status, run.stderr).toBe(0);
      const rep = JSON.parse(run.stdout);
      expect(rep.allTargetsMet).toBe(true);
      const last = rep.steps[rep.steps.length - 1];
      expect(last.size.diameter).toBe(2.5);
      expectRelClose(last.reloadYield, route.final.reloadYield, 1e-9, 'same yield as the design said');
      for (const s of rep.steps.filter((x: { kind: string }) => x.kind === 'draw')) {
        expect(s.drawabilityRatio).toBeLessThanOrEqual(0.8);
        expect(s.drawingForce).toBeLessThanOrEqual(12000);
        expect(s.temperatureRise).toBeLessThanOrEqual(120);
        expect(s.maxAreaReductionPct).toBeGreaterThan(30);
      }
    }
  });
  it('--out DIR writes each route as a plan file', () => {
    const dir = mkdtempSync(join(tmpdir(), 'sl-design-out-'));
    const r = cli('design', EXAMPLE, '--out', dir);
    expect(r.status).toBe(0);
    const files = readdirSync(dir).sort();
    expect(files).toContain('design-fencing-wire-route-1.json');
    const plan = JSON.parse(readFileSync(join(dir, 'design-fencing-wire-route-1.json'), 'utf8'));
    expect(plan.steps.filter((s: { kind: string }) => s.kind === 'anneal')).toHaveLength(1);
    expect(cli('run', join(dir, 'design-fencing-wire-route-1.json')).status).toBe(0);
  });
  it('a rolling specification (examples/design-copper-strip.yaml) gives routes that run with every target met, roll loads reported', () => {
    const out = JSON.parse(cli('design', 'examples/design-copper-strip.yaml', '--format', 'json').stdout);
    expect(out.feasible).toBe(true);
    // Plane-strain total strain (2/√3)·ln(3.0/0.5) (DESIGN.md §4).
    expectRelClose(out.totalStrain, 2 / Math.sqrt(3) * Math.log(6), 1e-12, 'total strain');
    const dir = mkdtempSync(join(tmpdir(), 'sl-design-roll-'));
    const f = join(dir, 'r1.json');
    writeFileSync(f, JSON.stringify(out.routes[0].plan));
    const run = cli('run', f, '--format', 'json');
    expect(run.status, run.stderr).toBe(0);
    let prev = 3;
    for (const s of JSON.parse(run.stdout).steps.filter((x: { kind: string }) => x.kind === 'roll')) {
      expect(s.rollForce).toBeLessThanOrEqual(600000);
      expect(s.rollTorque).toBeGreaterThan(0);
      // Bite: draft ≤ μ²·R = 0.1²·100 = 1 mm (Dieter §17-5, from memory).
      expect(prev - s.size.thickness).toBeLessThanOrEqual(1 + 1e-9);
      expect(s.warnings.map((w: { code: string }) => w.code)).not.toContain('bite');
      prev = s.size.thickness;
    }
  });
  it('an infeasible specification exits 1 and names the binding limit', () => {
    const dir = mkdtempSync(join(tmpdir(), 'sl-design-inf-'));
    const f = join(dir, 'tight.yaml');
    writeFileSync(f, readFileSync(join(ROOT, EXAMPLE), 'utf8').replace('final: { diameter: 2.5 }', 'final: { diameter: 5.2 }'));
    const r = cli('design', f);
    expect(r.status).toBe(1);
    expect(r.stdout).toMatch(/NO ROUTE: the binding limit is total reduction \(against minTensile\)/);
    expect(r.stdout).toMatch(/gives only/);
  });
  it('invalid specifications exit 2 naming file, line, column, field, value and range', () => {
    const dir = mkdtempSync(join(tmpdir(), 'sl-design-bad-'));
    const f = join(dir, 'bad.yaml');
    writeFileSync(f, readFileSync(join(ROOT, EXAMPLE), 'utf8').replace('maxPassReductionPct: 30', 'maxPassReductionPct: 130'));
    const r = cli('design', f);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/bad\.yaml:\d+:\d+: limits\.maxPassReductionPct: got 130, allowed a number < 100/);
    const g = join(dir, 'grow.yaml');
    writeFileSync(g, readFileSync(join(ROOT, EXAMPLE), 'utf8').replace('final: { diameter: 2.5 }', 'final: { diameter: 6 }'));
    const r2 = cli('design', g);
    expect(r2.status).toBe(2);
    expect(r2.stderr).toMatch(/grow\.yaml:\d+:\d+: final\.diameter: got 6, allowed a size below the starting diameter 5\.5/);
  });
});

describe('docs/process-planning.md: the design specification shown in "Route design" is a valid, feasible spec', () => {
  it('loads with loadDesignSpecText and designs the same best route as the example file', async () => {
    const { loadDesignSpecText, runDesign } = await import('../../src/plan/designSpec.js');
    const page = readFileSync(join(ROOT, 'docs', 'process-planning.md'), 'utf8');
    const section = page.slice(page.indexOf('## Route design'));
    const block = /```yaml\n([\s\S]*?)```/.exec(section)![1]!;
    const fromReadme = runDesign(loadDesignSpecText(block, 'process-planning.yaml'));
    const fromFile = runDesign(loadDesignSpecText(readFileSync(join(ROOT, EXAMPLE), 'utf8'), EXAMPLE));
    expect(fromReadme.feasible).toBe(true);
    expect(fromReadme.routes[0]!.steps).toEqual(fromFile.routes[0]!.steps);
  });
});

describe('strainledger run: the pass-load fields of the report contract, in the plan\'s units', () => {
  const dir = mkdtempSync(join(tmpdir(), 'sl-loads-'));
  // Callister low-carbon steel K 600 MPa (87.02 ksi), n 0.21; die 6°, μ 0.05 (invented demo values).
  const plan = (units: 'SI' | 'US') => {
    const L = units === 'US' ? 1 / 25.4 : 1;
    const S = units === 'US' ? 1 / 6.894757293168361 : 1;
    const f = join(dir, `${units}.json`);
    writeFileSync(f, JSON.stringify({
      name: 'loads', units,
      material: { name: 'steel', elasticModulus: 207000 * S, flowCurve: { law: 'hollomon', K: 600 * S, n: 0.21 }, density: 7850, specificHeat: 486 },
      start: units === 'US' ? { diameter: 5.5 * L } : { diameter: 5.5 },
      steps: [{ kind: 'draw', diameter: 4.6 * L, dieHalfAngleDeg: 6, friction: 0.05 }],
    }));
    return JSON.parse(cli('run', f, '--format', 'json').stdout).steps[0];
  };
  it('drawingStress in MPa or ksi, drawingForce in N or lbf (NIST SP 811 B.8: 1 lbf = 4.4482216152605 N); ratio, ΔT unit-free', () => {
    const si = plan('SI');
    const us = plan('US');
    for (const k of ['drawingStress', 'drawingForce', 'drawabilityRatio', 'maxAreaReductionPct', 'temperatureRise']) expect(si, k).toHaveProperty(k);
    expect(si).not.toHaveProperty('rollForce');
    expectRelClose(us.drawingStress, si.drawingStress / 6.894757293168361, 1e-9, 'ksi');
    expectRelClose(us.drawingForce, si.drawingForce / 4.4482216152605, 1e-9, 'lbf');
    expectRelClose(us.drawabilityRatio, si.drawabilityRatio, 1e-9, 'ratio');
    expectRelClose(us.temperatureRise, si.temperatureRise, 1e-9, 'K');
  });
});
