// What a forming engineer reads first in a report: targets in words (never the plan keys), the
// hardness caution when a margin is inside the estimate's own error, and both boundaries of a temper.
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { DOMParser } from 'linkedom';
import { describe, expect, it } from 'vitest';
import { hardnessCaution, HARDNESS_MODEL_REL_ERROR, TARGET_LABELS, WARNING_LABELS } from '../../src/core/index.js';
import { expectRelClose } from '../helpers.js';

// Runs the shipped runner (bin/ → dist/) as a user would; test/globalSetup.ts builds dist/ first.
const ROOT = join(import.meta.dirname, '..', '..');
const BIN = join(ROOT, 'bin', 'strainledger.js');
const run = (...args: string[]) => spawnSync(process.execPath, [BIN, ...args], { cwd: ROOT, encoding: 'utf8' });
const HARD = 'examples/hardness-steel-strip.json';
const TEMPER = 'examples/terminal-strip-temper.json';
// B&S numbers: thickness ratio 92^(1/39) per number (ASTM B248 gauge rule; H0N = N numbers hard, common practice).
const bs = (N: number) => (1 - 92 ** (-N / 39)) * 100;
// Plan keys of the targets and the camelCase warning codes (JSON and CSV keep both; people read words).
const KEYS = new RegExp(`\\b(${[...Object.keys(TARGET_LABELS).filter((k) => k !== 'temper'), ...Object.keys(WARNING_LABELS).filter((k) => /[A-Z]/.test(k))].join('|')})\\b`);
const HUMAN = ['table', 'md', 'html', 'junit'] as const;

describe('targets in words in every human format', () => {
  // Plans with every target kind between them (yield window, tensile, elongation, hardness, springback, temper).
  const plans = ['examples/contact-spring-strip.json', 'examples/hinge-tab-bend.json', HARD, TEMPER, 'examples/fin-stock-h14.json', 'examples/bracket-stretch-specimen.yaml', 'examples/clip-strip-scatter.json'];
  for (const plan of plans) {
    it(`${plan}: no plan key of a target reaches the text`, () => {
      const json = JSON.parse(run('run', plan, '--format', 'json').stdout);
      expect(json.targets.length).toBeGreaterThan(0);
      for (const f of HUMAN) {
        const r = run('run', plan, '--format', f);
        expect([0, 1]).toContain(r.status);
        // JUnit and HTML: read the text a person sees (element text and attribute values), not the markup.
        const text = f === 'html' ? new DOMParser().parseFromString(r.stdout, 'text/html').querySelector('body')!.textContent! : r.stdout;
        expect(text, `${plan} ${f}`).not.toMatch(KEYS);
        for (const t of json.targets) if (t.name !== 'temper') expect(text, `${plan} ${f}`).toContain(TARGET_LABELS[t.name as keyof typeof TARGET_LABELS]);
      }
    });
  }
  it('the warnings column names each warning in words once (grain growth, not grainGrowth)', () => {
    const t = run('run', TEMPER).stdout;
    const row = t.split('\n').find((l) => /bell anneal/.test(l))!;
    expect(row).toMatch(/ grain growth$/);
    expect(run('run', TEMPER, '--format', 'md').stdout).toMatch(/\| grain growth \|\n/);
  });
  it('the cold-work window names the targets that set its ends in words, in JSON too', () => {
    const w = JSON.parse(run('run', HARD, '--format', 'json').stdout).coldWorkWindow;
    expect(w.limitedBy).toEqual({ from: 'minHardnessHV', to: 'maxHardnessHV' });
    expect(w.note).toMatch(/\(set by the minimum hardness \(HV\) target\) to [\d.]+ \(set by the maximum hardness \(HV\) target\)$/);
    expect(run('run', HARD).stdout).toMatch(/cold-work window: strain since the last anneal from [\d.]+ \(set by the minimum hardness \(HV\) target\)/);
  });
});

describe('a hardness margin inside the Tabor estimate\'s own error is flagged, not a clean pass', () => {
  // Tabor's HV estimate is good to ±10–15 % (common practice, from memory); the upper end, 15 %, is used.
  it('hardnessCaution: margin against 15 % of the predicted HV (hand values)', () => {
    expect(HARDNESS_MODEL_REL_ERROR).toBe(0.15);
    expect(hardnessCaution(200, 29.9)?.code).toBe('withinModelError'); // 0.15 × 200 = 30 HV
    expect(hardnessCaution(200, 30)).toBeUndefined();
    expect(hardnessCaution(200, -5)).toBeUndefined(); // missed: reported as NOT MET already
  });
  it('flags both limits of a 140–170 HV band at 159.5 HV in JSON, table, Markdown, HTML and JUnit; a wide margin is clean', () => {
    const rep = JSON.parse(run('run', HARD, '--format', 'json').stdout);
    const hv = rep.steps.at(-1).hardnessHV;
    for (const t of rep.targets) {
      expectRelClose(t.predicted, hv, 1e-12);
      expect(t.met).toBe(true);
      expect(t.margin).toBeLessThan(0.15 * hv);
      expect(t.caution.code).toBe('withinModelError');
    }
    expect(rep.allTargetsMet).toBe(true); // a caution does not change the verdict or the exit code
    expect(run('run', HARD).stdout).toMatch(/^MET\? {4}minimum hardness \(HV\): predicted 159\.5 HV, limit 140\.0 HV, margin 19\.5 HV; caution: margin 19\.5 HV is smaller than the hardness estimate's own error \(±15 % ≈ 23\.9 HV/m);
    const md = run('run', HARD, '--format', 'md').stdout;
    expect(md).toMatch(/\*\*Verdict:\*\* all targets met — 2 of them only within the model's error: see the targets/);
    expect(md).toMatch(/\| maximum hardness \(HV\); caution: [^|]+\| met, within the model's error \| 170\.0 \| 159\.5 \| 10\.5 \| HV \|/);
    const html = new DOMParser().parseFromString(run('run', HARD, '--format', 'html').stdout, 'text/html');
    expect(html.querySelector('p.met')!.textContent).toMatch(/All targets met — 2 of them only within the model's error/);
    expect(html.querySelector('body')!.textContent).toMatch(/met, within the model's error/);
    const junit = run('run', HARD, '--format', 'junit');
    expect(junit.status).toBe(0);
    expect(junit.stdout).toMatch(/<system-out>minimum hardness \(HV\): predicted 159\.5 HV, limit 140\.0 HV, margin 19\.5 HV; caution: margin 19\.5 HV is smaller/);
    // 100 HV leaves 59.5 HV, more than 23.9 HV: no caution; the other limit keeps its own.
    const wide = JSON.parse(run('run', HARD, '--format', 'json', '--set', 'targets.minHardnessHV=100').stdout);
    expect(wide.targets.find((t: { name: string }) => t.name === 'minHardnessHV').caution).toBeUndefined();
    expect(wide.targets.find((t: { name: string }) => t.name === 'maxHardnessHV').caution.code).toBe('withinModelError');
  });
});

describe('a temper target shows both boundaries and the one its margin is measured to', () => {
  it('H02 of copperRolled runs from 2 to 3 B&S numbers; 21.9 % is nearer the lower boundary', () => {
    const t = JSON.parse(run('run', TEMPER, '--format', 'json').stdout).targets.find((x: { name: string }) => x.name === 'temper');
    expectRelClose(t.temper.from, bs(2), 1e-9);
    expectRelClose(t.temper.to, bs(3), 1e-9);
    expect(t.limit).toBe(t.temper.from);
    expect(t.temper.marginTo).toBe('lower');
    expect(t.temper.wantedName).toBe('half hard'); // ASTM B601 temper name of H02 (from memory, as the temper table)
    expectRelClose(t.margin, t.predicted - bs(2), 1e-9);
    expect(run('run', TEMPER).stdout).toMatch(/temper H02 \(half hard\): predicted 21\.9 % thickness reduction, limit 20\.7 % thickness reduction, margin 1\.2 % thickness reduction — H02 wanted, H02 reached; H02 runs from 20\.7 to 29\.4 % thickness reduction; margin to its lower boundary/);
  });
  it('rolled on to 0.83 mm (27.9 % since the anneal) the margin is to the upper boundary, and says so', () => {
    const r = JSON.parse(run('run', TEMPER, '--format', 'json', '--set', 'steps[3].thickness=0.83').stdout);
    const t = r.targets.find((x: { name: string }) => x.name === 'temper');
    expect(t.temper.marginTo).toBe('upper');
    expectRelClose(t.margin, bs(3) - t.predicted, 1e-9);
    expect(run('run', TEMPER, '--format', 'md', '--set', 'steps[3].thickness=0.83').stdout).toMatch(/H02 runs from 20\.7 to 29\.4 % thickness reduction; margin to its upper boundary/);
  });
});
