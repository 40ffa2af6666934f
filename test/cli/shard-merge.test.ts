import { execFileSync, spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseShard, shardOf } from '../../src/cli/shard.js';

// `run --shard K/N` and `merge` (issue 13), through the built runner as a CI job calls it. The
// reference is the runner's own one-process run of the whole list: N shards merged must give that
// run's JSON and JUnit byte for byte, and each plan's report must be the one the whole run gives.
const ROOT = join(import.meta.dirname, '..', '..');
const BIN = join(ROOT, 'bin', 'strainledger.js');
const TMP = mkdtempSync(join(tmpdir(), 'sl-shard-'));
const PLANS = join(TMP, 'plans');
afterAll(() => rmSync(TMP, { recursive: true, force: true }));

const cli = (...args: string[]) => {
  const r = spawnSync(process.execPath, [BIN, ...args], { cwd: ROOT, encoding: 'utf8', env: { ...process.env, CI: '1', NO_COLOR: '1' } });
  return { code: r.status, out: r.stdout, err: r.stderr };
};

// Seven plans (INVENTED variations of the demo strip): met, missed (maxYield too low), and one invalid,
// in a folder with a sub-folder, so the glob and the sort have something to do.
beforeAll(() => {
  mkdirSync(join(PLANS, 'b'), { recursive: true });
  const base = JSON.parse(readFileSync(join(ROOT, 'examples', 'contact-spring-strip.json'), 'utf8'));
  const names = ['a1', 'a2', 'b/c3', 'b/c4', 'd5', 'e6', 'z7'];
  names.forEach((n, i) => {
    const p = structuredClone(base);
    p.name = `variation ${n} (INVENTED)`;
    p.steps[p.steps.length - 1].reductionPct = 10 + 5 * i;
    if (n === 'd5') p.targets.minTensile = 2000; // missed
    if (n === 'e6') p.steps[0].thickness = -1; // invalid
    writeFileSync(join(PLANS, `${n}.json`), JSON.stringify(p, null, 2));
  });
});

describe('shardOf(files, { index, count })', () => {
  it('splits the sorted, de-duplicated list into disjoint contiguous shares covering it once, sizes within one', () => {
    fc.assert(fc.property(fc.array(fc.string({ maxLength: 6 }), { maxLength: 40 }), fc.integer({ min: 1, max: 12 }), (files, n) => {
      const sorted = [...new Set(files)].sort();
      const shares = Array.from({ length: n }, (_, k) => shardOf(files, { index: k + 1, count: n }));
      expect(shares.flat()).toEqual(sorted); // disjoint, complete, in order
      const sizes = shares.map((s) => s.length);
      expect(Math.max(...sizes) - Math.min(...sizes)).toBeLessThanOrEqual(1);
    }));
  });
  it('gives shard K the indices ⌊(K−1)·M/N⌋ … ⌊K·M/N⌋ − 1 (worked by hand: M = 5, N = 3 → 0 | 1, 2 | 3, 4)', () => {
    const f = ['e', 'd', 'c', 'b', 'a'];
    expect([1, 2, 3].map((k) => shardOf(f, { index: k, count: 3 }))).toEqual([['a'], ['b', 'c'], ['d', 'e']]);
  });
  it('parseShard accepts K/N with 1 ≤ K ≤ N and refuses the rest, naming --shard', () => {
    expect(parseShard('2/4')).toEqual({ index: 2, count: 4 });
    for (const bad of ['0/3', '4/3', '1/0', '2', 'a/b', '-1/3', '1.5/3']) expect(() => parseShard(bad)).toThrow(/--shard/);
  });
});

describe('run PLANS --shard K/N, then merge', () => {
  const glob = () => `${PLANS.replace(/\\/g, '/')}/**/*.json`;
  let wholeJson = '';
  let wholeJunit = '';
  beforeAll(() => {
    const j = cli('run', glob(), '--format', 'json');
    expect(j.code).toBe(2); // one invalid plan: the worst exit
    wholeJson = j.out;
    wholeJunit = cli('run', glob(), '--format', 'junit').out;
  });

  for (const n of [1, 2, 3, 4]) {
    it(`N = ${n}: shards disjoint, union the whole list, reports identical, merge equals the whole run (JSON and JUnit)`, () => {
      const whole = JSON.parse(wholeJson) as { plan?: { file: string }; file?: string }[];
      const key = (e: { plan?: { file: string }; file?: string }) => e.plan?.file ?? e.file!;
      const byFile = new Map(whole.map((e) => [key(e), JSON.stringify(e)]));
      const jsonFiles: string[] = [];
      const xmlFiles: string[] = [];
      const seen: string[] = [];
      for (let k = 1; k <= n; k++) {
        const j = cli('run', glob(), '--shard', `${k}/${n}`, '--format', 'json');
        expect([0, 1, 2]).toContain(j.code);
        const part = JSON.parse(j.out) as typeof whole;
        expect(Array.isArray(part)).toBe(true); // batch form even for one plan
        for (const e of part) {
          seen.push(key(e));
          expect(JSON.stringify(e)).toBe(byFile.get(key(e))); // the same report as in the whole run
        }
        // The shard's own exit follows the worst-exit rule over its plans.
        const worst = part.reduce((w, e) => Math.max(w, e.plan ? ((e as { allTargetsMet: boolean }).allTargetsMet ? 0 : 1) : 2), 0);
        expect(j.code).toBe(worst);
        const jf = join(TMP, `n${n}-s${k}.json`);
        writeFileSync(jf, j.out);
        jsonFiles.push(jf);
        const x = cli('run', glob(), '--shard', `${k}/${n}`, '--format', 'junit');
        const xf = join(TMP, `n${n}-s${k}.junit.xml`);
        writeFileSync(xf, x.out);
        xmlFiles.push(xf);
      }
      expect(seen.length).toBe(new Set(seen).size); // disjoint
      expect([...seen].sort()).toEqual([...byFile.keys()].sort()); // union = whole list
      // Merge in reverse order: the result does not depend on the order the CI hands the files over.
      const mj = cli('merge', ...jsonFiles.reverse());
      expect(mj.code).toBe(2);
      expect(mj.out).toBe(wholeJson);
      const met = whole.filter((e) => (e as { allTargetsMet?: boolean }).allTargetsMet === true).length;
      expect(mj.err).toBe(`merged 7 plans from ${n} file${n === 1 ? '' : 's'}: ${met} met, ${6 - met} not met, 1 invalid; exit 2\n`);
      const mx = cli('merge', ...xmlFiles.reverse());
      expect(mx.code).toBe(2);
      expect(mx.out).toBe(wholeJunit);
    });
  }

  it('a shard with no plans (N > plans) writes an empty batch that merges', () => {
    const j = cli('run', glob(), '--shard', '1/9', '--format', 'json'); // ⌊0·7/9⌋ = ⌊1·7/9⌋ = 0: no plan
    expect(j.code).toBe(0);
    expect(JSON.parse(j.out)).toEqual([]);
    const f = join(TMP, 'empty.json');
    writeFileSync(f, j.out);
    const m = cli('merge', f);
    expect(m.code).toBe(0);
    expect(m.out).toBe('[]\n');
  });

  it('per-plan JUnit files written with --out by two shards merge into the whole run\'s JUnit (valid plans)', () => {
    const dir = join(TMP, 'per-plan');
    const valid = `${PLANS.replace(/\\/g, '/')}/{a*,b/*,d5,z7}.json`;
    for (const k of [1, 2]) expect([0, 1]).toContain(cli('run', valid, '--shard', `${k}/2`, '--format', 'junit', '--out', dir).code);
    const m = cli('merge', `${dir.replace(/\\/g, '/')}/*.junit.xml`);
    expect(m.code).toBe(1); // d5 misses its target
    expect(m.out).toBe(cli('run', valid, '--format', 'junit').out);
    expect(m.err).toMatch(/^merged 6 plans from 6 files/);
  });

  it('per-plan files of an invalid plan (JSON and JUnit) are written with --out, so merge keeps the plan and exit 2', () => {
    for (const [format, ext] of [['json', 'json'], ['junit', 'junit.xml']] as const) {
      const dir = join(TMP, `per-plan-all-${format}`);
      const codes = [1, 2].map((k) => cli('run', glob(), '--shard', `${k}/2`, '--format', format, '--out', dir));
      // Shard 2 of 2 holds b/c4, d5, e6 and z7 (sorted, ⌊7/2⌋ = 3 plans in shard 1): e6 is the invalid one.
      expect([0, 1]).toContain(codes[0]!.code);
      expect(codes[1]!.code).toBe(2);
      expect(codes[1]!.out).toMatch(/wrote 4 \S+ reports/);
      expect(readFileSync(join(dir, `e6.${ext}`), 'utf8')).toMatch(format === 'json' ? /"invalid": \[/ : /<error message="invalid input" type="invalid">/);
      const m = cli('merge', `${dir.replace(/\\/g, '/')}/*.${ext}`);
      expect(m.code, format).toBe(2);
      expect(m.out, format).toBe(format === 'json' ? wholeJson : wholeJunit);
      expect(m.err).toMatch(/^merged 7 plans from 7 files: \d met, \d not met, 1 invalid; exit 2$/m);
    }
  });

  it('an internal error in a JUnit file keeps exit 3 through merge (as it does in a JSON file)', async () => {
    const { junitReport } = await import('../../src/report/junit.js');
    const f = join(TMP, 'internal.junit.xml');
    writeFileSync(f, junitReport([{ name: 'plans/broken.json', internal: 'RangeError: something the runner did not expect' }]));
    const m = cli('merge', f);
    expect(m.code).toBe(3);
    expect(m.err).toBe('merged 1 plan from 1 file: 0 met, 0 not met, 0 invalid, 1 internal errors; exit 3\n');
    expect(m.out).toContain('<error message="internal error" type="internal">RangeError: something the runner did not expect</error>');
    const j = join(TMP, 'internal.json');
    writeFileSync(j, JSON.stringify([{ file: 'plans/broken.json', invalid: 'RangeError: something the runner did not expect' }]));
    expect(cli('merge', j).code).toBe(3);
  });

  it('merge --out writes the merged file atomically and never over an input', () => {
    const s1 = join(TMP, 'o1.json');
    const s2 = join(TMP, 'o2.json');
    writeFileSync(s1, cli('run', glob(), '--shard', '1/2', '--format', 'json').out);
    writeFileSync(s2, cli('run', glob(), '--shard', '2/2', '--format', 'json').out);
    const out = join(TMP, 'merged', 'all.json');
    const m = cli('merge', s1, s2, '--out', out);
    expect(m.code).toBe(2);
    expect(readFileSync(out, 'utf8')).toBe(wholeJson);
    const over = cli('merge', s1, s2, '--out', s1);
    expect(over.code).toBe(2);
    expect(over.err).toMatch(/--out.*one of the reports to merge/);
  });
});

describe('merge refuses what it cannot combine (exit 2, naming the file)', () => {
  let json = '';
  let xml = '';
  beforeAll(() => {
    json = join(TMP, 'r.json');
    xml = join(TMP, 'r.junit.xml');
    writeFileSync(json, cli('run', 'examples/contact-spring-strip.json', '--format', 'json').out);
    writeFileSync(xml, cli('run', 'examples/contact-spring-strip.json', '--format', 'junit').out);
  });
  it('a JSON report and a JUnit file together', () => {
    const r = cli('merge', json, xml);
    expect(r.code).toBe(2);
    expect(r.err).toContain(`${xml}: is a JUnit file but ${json} is a JSON report`);
    expect(r.out).toBe('');
  });
  it('another report version', () => {
    const v2 = join(TMP, 'v2.json');
    writeFileSync(v2, JSON.stringify({ ...JSON.parse(readFileSync(json, 'utf8')), reportVersion: 2 }));
    const r = cli('merge', json, v2);
    expect(r.code).toBe(2);
    expect(r.err).toContain(`${v2}: reportVersion: got 2; allowed reportVersion 1`);
  });
  it('a report that is not report v1 (a field missing), naming the field', () => {
    const bad = join(TMP, 'bad.json');
    const o = JSON.parse(readFileSync(json, 'utf8'));
    delete o.allTargetsMet;
    writeFileSync(bad, JSON.stringify([o]));
    const r = cli('merge', bad);
    expect(r.code).toBe(2);
    expect(r.err).toContain(`${bad}: [0].allTargetsMet: not a report v1`);
  });
  it('the same plan in two files (overlapping shards)', () => {
    const r = cli('merge', json, json);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/plan examples\/contact-spring-strip\.json is also in/);
  });
  it('an empty file, and a file that is neither kind', () => {
    const empty = join(TMP, 'empty.txt');
    writeFileSync(empty, '\n');
    expect(cli('merge', empty).err).toContain(`${empty}: is empty`);
    const csv = join(TMP, 'table.csv');
    writeFileSync(csv, 'plan,index\n');
    const r = cli('merge', csv);
    expect(r.code).toBe(2);
    expect(r.err).toContain(`${csv}: starts with "plan,index`);
  });
  it('a truncated or edited JUnit file', () => {
    const cut = join(TMP, 'cut.junit.xml');
    const text = readFileSync(xml, 'utf8');
    writeFileSync(cut, text.slice(0, text.lastIndexOf('  </testsuite>')));
    expect(cli('merge', cut).err).toMatch(/never closed/);
    const edited = join(TMP, 'edited.junit.xml');
    writeFileSync(edited, text.replace(/(<testsuites [^>]*tests=")\d+/, '$199'));
    const r = cli('merge', edited);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/do not add up/);
  });
  it('run --shard with bad values or with --sweep', () => {
    expect(cli('run', 'examples/contact-spring-strip.json', '--shard', '3/2').err).toMatch(/--shard: got "3\/2": K = 3 is not between 1 and N = 2/);
    const r = cli('run', 'examples/contact-spring-strip.json', '--shard', '1/2', '--sweep', 'targets.minYield=300:310:10');
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/--shard/);
  });
});

describe('help', () => {
  it('help lists merge; merge --help and run --help show the declared options', () => {
    expect(execFileSync(process.execPath, [BIN, 'help'], { cwd: ROOT, encoding: 'utf8' })).toMatch(/strainledger merge REPORT\.\.\. \[options\]/);
    const m = execFileSync(process.execPath, [BIN, 'merge', '--help'], { cwd: ROOT, encoding: 'utf8' });
    expect(m).toContain('usage: strainledger merge REPORT... [options]');
    expect(m).toMatch(/-o, --out FILE/);
    expect(execFileSync(process.execPath, [BIN, 'run', '--help'], { cwd: ROOT, encoding: 'utf8' })).toMatch(/--shard K\/N +run only the K-th of N shares/);
  });
});
