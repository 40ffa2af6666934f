import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse as parseCsv } from 'csv-parse/sync';
import { DOMParser } from 'linkedom';
import { describe, expect, it } from 'vitest';
import { ReportSchema } from '../../src/report/schema.js';
import { expectRelClose } from '../helpers.js';

// Tempers and the coarse-grain warning through the built runner, on the INVENTED demo plans.
const ROOT = join(import.meta.dirname, '..', '..');
const BIN = join(ROOT, 'bin', 'strainledger.js');
const run = (...args: string[]) => spawnSync(process.execPath, [BIN, ...args], { cwd: ROOT, encoding: 'utf8', env: { ...process.env, CI: 'true', NO_COLOR: '1' } });
const PLAN = 'examples/terminal-strip-temper.json';
/** ASTM B601 H02 / H04 boundaries: 2 and 4 B&S numbers of thickness reduction, 100·(1 − 92^(−N/39)) % (gauge ratio from ASTM B258). */
const bs = (N: number) => (1 - 92 ** (-N / 39)) * 100;

describe('strainledger run with a temper system', () => {
  const r = run('run', PLAN, '--format', 'json');
  const rep = JSON.parse(r.stdout);
  it('exits 0, the report validates against report v1 and names each step\'s temper', () => {
    expect(r.status).toBe(0);
    expect(ReportSchema.safeParse(rep).success).toBe(true);
    expect(rep.material.temperSystem).toBe('copperRolled');
    expect(rep.steps.map((s: { temper: { designation: string } | null }) => s.temper?.designation ?? null)).toEqual([null, null, 'H01', 'H02']);
  });
  it('the temper agrees with the row\'s own %CW: 1 − 0.9/1.152 = 21.9 % lies past the H02 boundary 20.70 %', () => {
    const last = rep.steps[3];
    expectRelClose(last.coldWorkPct, (1 - 0.9 / (1.2 * 0.96)) * 100, 1e-12);
    expect(last.coldWorkPct).toBeGreaterThan(bs(2));
    expectRelClose(last.temper.towardNext, (last.coldWorkPct - bs(2)) / (bs(3) - bs(2)), 1e-9);
  });
  it('warns of grain growth on the anneal after the 4 % pass, and on no other step', () => {
    const codes = rep.steps.map((s: { warnings: { code: string }[] }) => s.warnings.map((w) => w.code));
    expect(codes[1]).toContain('grainGrowth');
    expect(codes.filter((c: string[]) => c.includes('grainGrowth'))).toHaveLength(1);
  });
  it('adds the temper caution to the report cautions', () => {
    expect(rep.cautions.some((c: string) => /Tempers are named from the predicted state/.test(c))).toBe(true);
  });
});

describe('a missed temper target', () => {
  it('exits 1 and makes a failing JUnit testcase that names the tempers wanted and reached', () => {
    const r = run('run', PLAN, '--set', 'targets.temper=H04', '--format', 'junit');
    expect(r.status).toBe(1);
    const doc = new DOMParser().parseFromString(r.stdout, 'text/xml');
    const cases = [...doc.querySelectorAll('testcase')];
    const temper = cases.find((c) => c.getAttribute('name') === 'temper H04 (hard)')!;
    const failure = temper.querySelector('failure')!;
    expect(failure).not.toBeNull();
    expect(failure.getAttribute('message')).toMatch(/H04 wanted, H02 reached/);
    // limit is the H04 boundary, 4 B&S numbers = 37.11 %, printed to 0.1 % as elongations and %CW are.
    expect(failure.getAttribute('message')).toContain(`limit ${bs(4).toFixed(1)} % thickness reduction`);
  });
  it('a temper not of the system is invalid input (exit 2) naming the field', () => {
    const r = run('run', PLAN, '--set', 'targets.temper=H05');
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/targets\.temper/);
    expect(r.stderr).toMatch(/H01, H02, H03, H04, H06, H08, H10/);
  });
});

describe('a temper target with a scatter section', () => {
  it('is refused (exit 2) naming targets.temper: the scatter sampler checks property targets only', () => {
    const r = run('run', 'examples/clip-strip-scatter.json', '--set', 'material.temperSystem=copperRolled', '--set', 'targets.temper=H02');
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/targets\.temper: scatter does not sample tempers/);
  });
});

describe('CSV and Markdown carry the temper', () => {
  it('CSV (read back with csv-parse) has the temper columns equal to the JSON report', () => {
    const csv = parseCsv(run('run', PLAN, '--format', 'csv').stdout, { columns: true }) as Record<string, string>[];
    const rep = JSON.parse(run('run', PLAN, '--format', 'json').stdout);
    csv.forEach((row, i) => {
      const t = rep.steps[i].temper;
      expect(row.temper).toBe(t?.designation ?? '');
      expect(row.temperName).toBe(t?.name ?? '');
      expect(row.temperNext).toBe(t?.next ?? '');
      if (t) expect(Number(row.temperTowardNext)).toBe(t.towardNext);
    });
  });
  it('Markdown shows a temper column and the temper target line', () => {
    const md = run('run', PLAN, '--format', 'md').stdout;
    expect(md).toMatch(/\| temper \|/);
    expect(md).toMatch(/H02 \(13 % of the way to H03\)/);
    expect(md).toMatch(/temper H02 \(half hard\) — H02 wanted, H02 reached; H02 runs from 20\.7 to 29\.4 % thickness reduction; margin to its lower boundary/);
  });
});

describe('strainledger design with a temper window', () => {
  it('every proposed route, written with --out and run by the runner, ends in H04 with no grain-growth warning', () => {
    const dir = mkdtempSync(join(tmpdir(), 'sl-temper-design-'));
    try {
      const r = run('design', 'examples/design-terminal-strip-h04.yaml', '--out', dir);
      expect(r.status).toBe(0);
      const files = readdirSync(dir).filter((f) => f.endsWith('.json'));
      expect(files.length).toBeGreaterThan(0);
      for (const f of files) {
        const out = run('run', join(dir, f), '--format', 'json');
        expect(out.status).toBe(0);
        const rep = JSON.parse(out.stdout);
        expect(rep.steps.at(-1).temper.designation).toBe('H04');
        expect(rep.steps.at(-1).coldWorkPct).toBeGreaterThanOrEqual(bs(4) - 1e-9);
        expect(rep.steps.at(-1).coldWorkPct).toBeLessThan(bs(6));
        expect(rep.steps.flatMap((s: { warnings: { code: string }[] }) => s.warnings.map((w) => w.code))).not.toContain('grainGrowth');
      }
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe('a sweep of a plan with a temper target', () => {
  it('labels the temper margin in its basis: MPa for aluminium H1x (tempers by Rm, EN 515), not % reduction', () => {
    const r = run('run', 'examples/fin-stock-h14.json', '--sweep', 'start.thickness=1.0:1.2:0.1', '--format', 'table');
    expect(r.status === 0 || r.status === 1, r.stderr).toBe(true);
    expect(r.stdout).toMatch(/margin temper MPa/);
    expect(r.stdout).not.toMatch(/margin temper % thickness reduction/);
  });
});
