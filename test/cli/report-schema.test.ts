import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import Ajv2020 from 'ajv/dist/2020.js';
import { describe, expect, it } from 'vitest';

// The JSON report validates against the published JSON Schema (schema/report-v1.json), checked with
// ajv 8 (a general-purpose JSON Schema validator from the registry, draft 2020-12), not with our zod.
const ROOT = join(import.meta.dirname, '..', '..');
const BIN = join(ROOT, 'bin', 'strainledger.js');
const run = (...args: string[]) => spawnSync(process.execPath, [BIN, ...args], { cwd: ROOT, encoding: 'utf8' });
const published = JSON.parse(readFileSync(join(ROOT, 'schema', 'report-v1.json'), 'utf8'));
const ajv = new Ajv2020.default({ allErrors: true, strict: true });
const validate = ajv.compile(published);
const DEMOS = ['examples/contact-spring-strip.json', 'examples/fencing-wire-us.json', 'examples/bracket-stretch-specimen.yaml', 'examples/clip-strip-scatter.json', 'examples/hinge-tab-bend.json'];

describe('schema/report-v1.json, the published JSON Schema of report v1', () => {
  it('strainledger schema --report prints exactly the checked-in file (regenerate with it when the report changes)', () => {
    const r = run('schema', '--report');
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout)).toEqual(published);
  });
  for (const demo of DEMOS) {
    it(`the JSON report of ${demo} validates (ajv, draft 2020-12)`, () => {
      const r = run('run', demo, '--format', 'json');
      expect([0, 1]).toContain(r.status);
      const rep = JSON.parse(r.stdout);
      const ok = validate(rep);
      expect(validate.errors ?? [], JSON.stringify(validate.errors)).toEqual([]);
      expect(ok).toBe(true);
    });
  }
  it('a report with --set overrides validates and lists them', () => {
    const rep = JSON.parse(run('run', DEMOS[0]!, '--format', 'json', '--set', 'steps[-1].reductionPct=30').stdout);
    expect(validate(rep)).toBe(true);
    expect(rep.plan.overrides).toEqual(['steps[4].reductionPct=30']);
  });
  it('rejects reports that break the contract (so the check can fail)', () => {
    const good = JSON.parse(run('run', DEMOS[0]!, '--format', 'json').stdout);
    const broken: Array<[string, (r: Record<string, any>) => void]> = [
      ['a missing step field', (r) => { delete r.steps[0].reloadYield; }],
      ['a string where a number belongs', (r) => { r.steps[1].tensileStrength = '420'; }],
      ['a non-finite number written as null', (r) => { r.steps[0].flowStress = null; }],
      ['another report version', (r) => { r.reportVersion = 2; }],
      ['a short hash', (r) => { r.plan.hash = 'abc'; }],
      ['an unknown target name', (r) => { r.targets[0].name = 'minHardness'; }],
      ['no cautions', (r) => { r.cautions = []; }],
      ['an unknown stress unit', (r) => { r.units.stress = 'psi'; }],
    ];
    expect(validate(good)).toBe(true);
    for (const [what, breakIt] of broken) {
      const r = structuredClone(good);
      breakIt(r);
      expect(validate(r), what).toBe(false);
    }
  });
  it('extra optional fields from later issues keep a report valid (the contract is additive)', () => {
    const r = JSON.parse(run('run', DEMOS[0]!, '--format', 'json').stdout);
    r.steps[0].springbackDeg = 3.2;
    r.hardnessSurvey = { samples: 3 }; // a section a later version might add
    expect(validate(r)).toBe(true);
  });
  it('the scatter section is part of the contract: a broken one is refused', () => {
    const good = JSON.parse(run('run', 'examples/clip-strip-scatter.json', '--format', 'json').stdout);
    expect(good.scatter.probabilityAllTargetsMet).toBeGreaterThan(0);
    expect(validate(good)).toBe(true);
    const broken: Array<[string, (s: Record<string, any>) => void]> = [
      ['a probability above 1', (s) => { s.probabilityAllTargetsMet = 1.5; }],
      ['no tolerance bound', (s) => { delete s.toleranceBound; }],
      ['a negative spread', (s) => { s.finalReloadYield.sd = -1; }],
      ['a correlation beyond ±1', (s) => { s.correlation['K,n'] = -1.2; }],
      ['no cautions', (s) => { s.cautions = []; }],
      ['an unknown target', (s) => { s.targets[0].name = 'minHardness'; }],
    ];
    for (const [what, breakIt] of broken) {
      const r = structuredClone(good);
      breakIt(r.scatter);
      expect(validate(r), what).toBe(false);
    }
  });
});
