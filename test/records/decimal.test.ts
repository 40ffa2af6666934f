// The byte-level number reader of the record scanner (src/records/scan.ts `readDecimal`, and the
// same reading inlined in `ByteRowScanner`) against the reference: the engine's own ECMAScript
// StringToNumber (`Number()`, ECMA-262 §7.1.4.1.1, correctly rounded), on millions of random
// decimal strings. Expected value of a string s: Number(s) when s matches the located reader's
// pattern ^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$ (src/records/builder.ts), else NaN.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { xoshiro128ss } from '../../src/core/index.js';
import { readDecimal } from '../../src/records/scan.js';
import { readRecordFile } from '../../src/records/node.js';

const PATTERN = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const JUNK = ' x.,+-eE_\t0#';

/**
 * A random decimal string: sign ('', '+', '-'), 0–20 integer digits (often leading zeros), maybe a
 * point, 0–20 fraction digits, maybe an exponent of 1–4 digits with a sign, and one time in 16 a
 * junk character put somewhere (so the NaN answers are exercised too). Written into `out` as ASCII.
 */
function randomDecimal(r: ReturnType<typeof xoshiro128ss>, out: Uint8Array, comma: boolean): string {
  const u = () => r.nextU32();
  let s = '';
  const sign = u() % 3;
  if (sign === 1) s += '+'; else if (sign === 2) s += '-';
  const lead = u() % 4 === 0 ? u() % 4 : 0;
  for (let k = 0; k < lead; k++) s += '0';
  const ni = u() % 4 === 0 ? u() % 21 : u() % 6;
  for (let k = 0; k < ni; k++) s += String.fromCharCode(48 + (u() % 10));
  if (u() % 4 !== 0) s += comma && u() % 2 === 0 ? ',' : '.';
  const nf = u() % 4 === 0 ? u() % 21 : u() % 9;
  for (let k = 0; k < nf; k++) s += String.fromCharCode(48 + (u() % 10));
  if (u() % 5 === 0) {
    s += u() % 2 ? 'e' : 'E';
    const es = u() % 3;
    if (es === 1) s += '+'; else if (es === 2) s += '-';
    const ne = 1 + (u() % 4 === 0 ? u() % 4 : u() % 2);
    for (let k = 0; k < ne; k++) s += String.fromCharCode(48 + (u() % 10));
  }
  if (u() % 16 === 0) {
    const at = u() % (s.length + 1);
    s = s.slice(0, at) + JUNK[u() % JUNK.length] + s.slice(at);
  }
  for (let k = 0; k < s.length; k++) out[k] = s.charCodeAt(k);
  return s;
}

function expected(s: string, comma: boolean): number {
  const t = comma ? s.replace(',', '.') : s;
  return PATTERN.test(t) ? Number(t) : NaN;
}

describe('readDecimal(bytes) reads what Number() reads (ECMAScript StringToNumber, the reference)', () => {
  it('2,000,000 random decimal strings (signs, leading +, .5, 5., leading zeros, up to 41 digits, exponents, junk): the same double, bit for bit, or NaN exactly when the pattern does not match', () => {
    const r = xoshiro128ss(20261202);
    const buf = new Uint8Array(128);
    let matched = 0, exact = 0, misses = 0;
    const firstMisses: string[] = [];
    for (let k = 0; k < 2_000_000; k++) {
      const comma = (k & 7) === 7;
      const s = randomDecimal(r, buf, comma);
      const want = expected(s, comma);
      const got = readDecimal(buf, 0, s.length, comma);
      if (!Object.is(got, want)) { misses++; if (firstMisses.length < 5) firstMisses.push(`${JSON.stringify(s)} → ${got}, Number() ${want}`); }
      if (want === want) { matched++; if (Number.isFinite(want) && String(want).length > 0) exact++; }
    }
    expect(firstMisses, `${misses} strings read differently`).toEqual([]);
    // The generator must reach both answers often (a generator of junk only would prove nothing).
    expect(matched).toBeGreaterThan(1_500_000);
    expect(2_000_000 - matched).toBeGreaterThan(50_000);
    expect(exact).toBeGreaterThan(1_000_000);
  });

  it('hand-picked forms: "+5", ".5", "5.", "-0", "-.0e5", "1e400" (Infinity), "1e-400" (0), 17 and 30 digits, and no locale (no thousands separators, no spaces inside)', () => {
    const enc = new TextEncoder();
    const cases: [string, boolean, number][] = [
      ['+5', false, 5], ['.5', false, 0.5], ['5.', false, 5], ['-0', false, -0], ['-.0e5', false, -0], ['0.1', false, 0.1],
      ['1e400', false, Infinity], ['-1e400', false, -Infinity], ['1e-400', false, 0], ['9007199254740993', false, 9007199254740992],
      ['0.30000000000000004', false, 0.30000000000000004], ['123456789012345678901234567890', false, 1.2345678901234568e29],
      ['1,5', true, 1.5], ['1.5', true, 1.5], ['1,5', false, NaN], ['1 000', false, NaN], ['1_000', false, NaN], ['0x10', false, NaN],
      ['Infinity', false, NaN], ['', false, NaN], ['.', false, NaN], ['+', false, NaN], ['1e', false, NaN], ['e5', false, NaN], ['1.2.3', false, NaN],
      ['00000000000000000000001.5', false, 1.5], ['0.0000000000000000000000012', false, 1.2e-24], ['4.35e+2', false, 435],
    ];
    for (const [s, comma, want] of cases) {
      const b = enc.encode(s);
      expect(Object.is(readDecimal(b, 0, b.length, comma), want), `${JSON.stringify(s)} (comma ${comma}): got ${readDecimal(b, 0, b.length, comma)}, Number() gives ${want}`).toBe(true);
      expect(Object.is(want, expected(s, comma)), `the case table itself for ${s}`).toBe(true);
    }
  });

  it('the same reading inlined in the file scanner: 200,000 random cells through readRecordFile give Number()\'s doubles', async () => {
    const r = xoshiro128ss(7);
    const buf = new Uint8Array(128);
    const cells: string[] = [];
    while (cells.length < 200_000) {
      const s = randomDecimal(r, buf, false);
      const v = expected(s, false);
      // Cells the located reader accepts (finite numbers) and that keep the strain column below 500 %.
      if (Number.isFinite(v)) cells.push(s);
    }
    const dir = mkdtempSync(join(tmpdir(), 'sl-decimal-'));
    try {
      const file = join(dir, 'cells.csv');
      writeFileSync(file, 'Strain [-],Stress [MPa]\n' + cells.map((c, i) => `${(i + 1) * 1e-6},${c}`).join('\n') + '\n');
      const rec = await readRecordFile(file);
      expect(rec.rows).toBe(cells.length);
      let misses = 0;
      const first: string[] = [];
      cells.forEach((c, i) => { if (!Object.is(rec.stress[i], Number(c))) { misses++; if (first.length < 5) first.push(`${c} → ${rec.stress[i]}`); } });
      expect(first, `${misses} cells`).toEqual([]);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
