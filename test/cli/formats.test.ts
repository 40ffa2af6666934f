import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse as parseCsv } from 'csv-parse/sync';
import { DOMParser } from 'linkedom';
import { afterAll, describe, expect, it } from 'vitest';
import { expectRelClose } from '../helpers.js';
import { targetLabel } from '../../src/core/index.js';

// JUnit test cases are named in words, as the reports show the targets.
const caseName = (t: { name: string; temper?: { wanted: string; wantedName: string } }) => targetLabel(t.name, t.temper?.wanted, t.temper?.wantedName);

// Golden tests of every report format on the invented demo plans in examples/, run through the
// shipped runner. Goldens live in test/cli/golden/ (review a change there like code). Beside the
// goldens, each format is read back with a general-purpose parser (csv-parse, linkedom's XML
// parser) and checked against the JSON report and a handbook formula, so a golden cannot simply
// freeze a wrong number.
const ROOT = join(import.meta.dirname, '..', '..');
const BIN = join(ROOT, 'bin', 'strainledger.js');
const run = (...args: string[]) => spawnSync(process.execPath, [BIN, ...args], { cwd: ROOT, encoding: 'utf8', env: { ...process.env, CI: 'true', NO_COLOR: '1' } });
const DEMOS = { 'contact-spring-strip': 'examples/contact-spring-strip.json', 'fencing-wire-us': 'examples/fencing-wire-us.json', 'bracket-stretch-specimen': 'examples/bracket-stretch-specimen.yaml' } as const;
const EXT = { table: 'txt', json: 'json', csv: 'csv', md: 'md', html: 'html', junit: 'junit.xml' } as const;
const TMP = mkdtempSync(join(tmpdir(), 'sl-formats-'));
afterAll(() => rmSync(TMP, { recursive: true, force: true }));

/**
 * JSON and CSV carry full double precision; their goldens hold numbers rounded to 10 significant
 * digits so that a last-digit change of floating-point order does not churn them (a change of
 * substance still does). Full-precision agreement is checked separately below.
 */
function roundFull(text: string, format: 'json' | 'csv'): string {
  const r10 = (x: number) => (Number.isFinite(x) ? +x.toPrecision(10) : x);
  if (format === 'json') return JSON.stringify(JSON.parse(text, (_k, v) => (typeof v === 'number' ? r10(v) : v)), null, 2) + '\n';
  return text.replace(/(^|,)(-?\d+\.\d+(?:e[-+]?\d+)?)(?=,|\r?$)/gm, (_m, pre: string, num: string) => pre + String(r10(Number(num))));
}

const json = (file: string) => JSON.parse(run('run', file, '--format', 'json').stdout);

// Goldens also for the demos with a scatter section and with reversal and bend steps (their own
// report sections: scatter tables, springback columns).
const GOLDEN_DEMOS = { ...DEMOS, 'clip-strip-scatter': 'examples/clip-strip-scatter.json', 'hinge-tab-bend': 'examples/hinge-tab-bend.json', 'terminal-strip-temper': 'examples/terminal-strip-temper.json' } as const;

describe('strainledger run PLAN --format F matches its golden file', () => {
  for (const [name, file] of Object.entries(GOLDEN_DEMOS)) {
    for (const [format, ext] of Object.entries(EXT)) {
      it(`${name} as ${format}`, async () => {
        const r = run('run', file, '--format', format);
        expect(r.stderr).toBe('');
        expect(r.status).toBe(name === 'bracket-stretch-specimen' ? 1 : 0);
        await expect(format === 'json' || format === 'csv' ? roundFull(r.stdout, format) : r.stdout).toMatchFileSnapshot(`golden/${name}.${ext}`);
      });
    }
  }
  it('a sweep of the last reduction as a table', async () => {
    const r = run('run', DEMOS['contact-spring-strip'], '--sweep', 'steps[-1].reductionPct=10:40:5');
    expect(r.status).toBe(1); // 10, 15, 35 and 40 % miss a target
    await expect(r.stdout).toMatchFileSnapshot('golden/contact-spring-strip.sweep.txt');
  });
  it('a batch of all demos prints one summary table and exits with the worst code', async () => {
    const r = run('run', 'examples/contact-spring-strip.json', 'examples/fencing-wire-us.json', 'examples/bracket-stretch-specimen.yaml');
    expect(r.status).toBe(1);
    await expect(r.stdout).toMatchFileSnapshot('golden/batch-summary.txt');
  });
});

describe('every format carries the same numbers as the JSON report', () => {
  const rep = json(DEMOS['contact-spring-strip']);
  it('csv: one row per step, numbers equal the JSON report and the handbook law (csv-parse reads it)', () => {
    const rows = parseCsv(run('run', DEMOS['contact-spring-strip'], '--format', 'csv').stdout, { columns: true }) as Record<string, string>[];
    expect(rows).toHaveLength(rep.steps.length);
    rows.forEach((row, i) => {
      for (const k of ['reloadYield', 'tensileStrength', 'accumulatedStrain', 'coldWorkPct']) expect(Number(row[k])).toBe(rep.steps[i][k]);
    });
    // Step 5: strip rolled 1.2 → 0.9 → 0.675 mm after the anneal. Plane-strain equivalent strain
    // (2/√3)·ln(t0/t) (Marciniak, Duncan & Hu, Mechanics of Sheet Metal Forming, §3.4); Hollomon
    // K 530 MPa, n 0.44 for annealed copper (Callister, 2nd ed., p. 199); reload yield at ε + 0.002 as
    // force over the formed section (ISO 6892-1 Rp0.2, constant volume): × e^(−0.002).
    // Tolerance 1e-12: the same closed form, only rounding differs.
    const eps = (2 / Math.sqrt(3)) * Math.log(1.2 / 0.675);
    expectRelClose(Number(rows[4]!.reloadYield), 530 * (eps + 0.002) ** 0.44 * Math.exp(-0.002), 1e-12, 'step 5 reload yield');
    expectRelClose(Number(rows[4]!.coldWorkPct), 100 * (1 - 0.675 / 1.2), 1e-12, 'step 5 %CW (thickness reduction since anneal, Callister)');
  });
  it('junit: one test case per target, a failure exactly for each missed target (XML parsed by linkedom)', () => {
    for (const file of Object.values(DEMOS)) {
      const rj = json(file);
      const doc = new DOMParser().parseFromString(run('run', file, '--format', 'junit').stdout, 'text/xml');
      const cases = [...doc.querySelectorAll('testcase')];
      expect(cases.map((c) => c.getAttribute('name'))).toEqual(rj.targets.map(caseName));
      const failed = cases.filter((c) => c.querySelector('failure')).map((c) => c.getAttribute('name'));
      expect(failed).toEqual(rj.targets.filter((t: { met: boolean }) => !t.met).map(caseName));
      expect(doc.querySelector('testsuites')!.getAttribute('failures')).toBe(String(failed.length));
    }
  });
  it('md, html and table carry provenance (name, SHA-256, tool, law and source) and every caution', () => {
    for (const format of ['md', 'html', 'table']) {
      const text = run('run', DEMOS['fencing-wire-us'], '--format', format).stdout;
      const r = json(DEMOS['fencing-wire-us']);
      const plain = text.replace(/&quot;/g, '"').replace(/&#39;|&apos;/g, "'");
      for (const s of [r.plan.name, r.plan.tool, r.material.source, ...r.cautions]) expect(plain, `${format}: ${s}`).toContain(s);
      expect(plain).toContain(format === 'table' ? r.plan.hash.slice(0, 12) : r.plan.hash);
      expect(plain).toMatch(/Hollomon: K/);
    }
  });
  it('html is one self-contained file: three Plot charts (strength, ductility, hardness) as inline SVG, no script, no external request', () => {
    const html = run('run', DEMOS['contact-spring-strip'], '--format', 'html').stdout;
    const doc = new DOMParser().parseFromString(html, 'text/html');
    expect(doc.querySelectorAll('figure svg[class^="plot"]').length).toBe(3);
    expect(html).toMatch(/Vickers hardness estimated by Tabor's relation/);
    expect(doc.querySelectorAll('script, link, img, iframe').length).toBe(0);
    expect(html).not.toMatch(/(src|href)="(https?:)?\/\//);
    // The ledger table shows the same rounded reload yields as the JSON report.
    const cells = [...doc.querySelectorAll('table')[0]!.querySelectorAll('tbody tr')].map((tr) => tr.querySelectorAll('td')[6]!.textContent);
    expect(cells).toEqual(rep.steps.map((s: { reloadYield: number }) => s.reloadYield.toFixed(1)));
  });
  it('--out DIR writes one file per plan atomically and nothing else', () => {
    const out = join(TMP, 'reports');
    const r = run('run', ...Object.values(DEMOS), '--format', 'md', '--out', out);
    expect(r.status).toBe(1);
    expect(readdirSync(out).sort()).toEqual(['bracket-stretch-specimen.md', 'contact-spring-strip.md', 'fencing-wire-us.md']);
    expect(readFileSync(join(out, 'contact-spring-strip.md'), 'utf8')).toBe(run('run', DEMOS['contact-spring-strip'], '--format', 'md').stdout);
  });
  it('--jobs 2 gives the same reports as --jobs 1', () => {
    const a = run('run', ...Object.values(DEMOS), '--format', 'json', '--jobs', '1');
    const b = run('run', ...Object.values(DEMOS), '--format', 'json', '--jobs', '2');
    expect(b.status).toBe(1);
    expect(b.stdout).toBe(a.stdout);
    expect(JSON.parse(a.stdout)).toHaveLength(3);
  });
  it('--jobs 2 on 150 plans with HTML reports writes the same files as --jobs 1, an invalid plan included (the worker path itself: test/cli/batch.test.ts)', () => {
    const dir = join(TMP, 'many');
    mkdirSync(dir);
    const base = JSON.parse(readFileSync(join(ROOT, DEMOS['contact-spring-strip']), 'utf8'));
    for (let i = 0; i < 150; i++) {
      const p = structuredClone(base);
      p.name = `plan ${i} (INVENTED variation)`;
      p.steps[p.steps.length - 1].reductionPct = i === 77 ? 100 : 5 + (i % 40);
      writeFileSync(join(dir, `p${String(i).padStart(3, '0')}.json`), JSON.stringify(p));
    }
    const a = run('run', join(dir, '*.json'), '--format', 'html', '--out', join(TMP, 'many-1'), '--jobs', '1');
    const b = run('run', join(dir, '*.json'), '--format', 'html', '--out', join(TMP, 'many-2'), '--jobs', '2');
    expect(a.status).toBe(2); // the worst exit: plan 77 reduces 100 %
    expect(b.status).toBe(2);
    expect(b.stdout.replace(/many-2/g, 'many-1')).toBe(a.stdout);
    const files = readdirSync(join(TMP, 'many-1')).sort();
    expect(files).toHaveLength(149);
    expect(readdirSync(join(TMP, 'many-2')).sort()).toEqual(files);
    for (const f of files) {
      const html = readFileSync(join(TMP, 'many-2', f), 'utf8');
      expect(html, f).toBe(readFileSync(join(TMP, 'many-1', f), 'utf8'));
      expect(html).toContain(`<h1>plan ${Number(f.slice(1, 4))} (INVENTED variation)</h1>`);
    }
  });
  it('--set changes one field for one run: the last reduction 25 → 30 % raises the reload yield as the law says', () => {
    const r = JSON.parse(run('run', DEMOS['contact-spring-strip'], '--format', 'json', '--set', 'steps[4].reductionPct=30').stdout);
    // 0.9 mm rolled 30 %: t = 0.63 mm; ε since anneal = (2/√3)·ln(1.2/0.63) (Marciniak et al. §3.4), Callister copper law.
    const eps = (2 / Math.sqrt(3)) * Math.log(1.2 / 0.63);
    expectRelClose(r.steps[4].reloadYield, 530 * (eps + 0.002) ** 0.44 * Math.exp(-0.002), 1e-12, 'reload yield after the override');
    expect(r.plan.hash).not.toBe(rep.plan.hash);
  });
  it('--sweep gives one row per value whose margins equal single runs with --set', () => {
    const sw = JSON.parse(run('run', DEMOS['contact-spring-strip'], '--format', 'json', '--sweep', 'steps[-1].reductionPct=20:30:5').stdout);
    expect(sw.rows.map((r: { value: number }) => r.value)).toEqual([20, 25, 30]);
    for (const row of sw.rows) {
      const single = JSON.parse(run('run', DEMOS['contact-spring-strip'], '--format', 'json', '--set', `steps[-1].reductionPct=${row.value}`).stdout);
      expect(row.targets).toEqual(single.targets.map((t: { name: string; margin: number; met: boolean }) => ({ name: t.name, margin: t.margin, met: t.met })));
    }
  });
  it('a sweep value that makes the plan invalid is a row marked invalid, and the sweep exits 2', () => {
    const r = run('run', DEMOS['contact-spring-strip'], '--format', 'csv', '--sweep', 'steps[-1].reductionPct=90:100:10');
    expect(r.status).toBe(2);
    const rows = parseCsv(r.stdout, { columns: true }) as Record<string, string>[];
    expect(rows.map((x) => x.exit)).toEqual(['1', '2']);
    expect(rows[1]!.problem).toMatch(/reductionPct: got 100, allowed a number < 100/);
  });
});
