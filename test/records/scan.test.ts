// The fast row scanner (src/records/scan.ts) against an independent CSV parser from the registry
// (udsv 0.7.3, npm), and against the located reader for what it must refuse.
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { parse as parseCsv } from 'csv-parse/sync';
import { initParser } from 'udsv';
import { describe, expect, it } from 'vitest';
import { PlanError } from '../../src/plan/problems.js';
import { parseRecordText } from '../../src/records/index.js';
import { readRecordFile } from '../../src/records/node.js';

/** Reference: udsv splits the rows; Number() reads the cells (decimal comma replaced). */
function reference(text: string, delimiter: string, skip: number, decimalComma: boolean, cols: [number, number], width: number): [number[], number[]] {
  const body = text.split('\n').slice(skip).join('\n');
  // udsv needs the column list (with none it does not return).
  const schema = { col: delimiter, row: '\n', encl: '', esc: '', trim: true, cols: Array.from({ length: width }, (_, i) => ({ name: `c${i}`, type: 's' as const, repl: { empty: '', null: undefined, NaN: undefined } })) };
  const rows = initParser(schema).stringArrs(body);
  const xs: number[] = [], ys: number[] = [];
  for (const r of rows) {
    if (r.length === 1 && r[0]!.trim() === '') continue;
    const v = (s: string) => Number(decimalComma ? s.trim().replace(',', '.') : s.trim());
    xs.push(v(r[cols[0]]!));
    ys.push(v(r[cols[1]]!));
  }
  return [xs, ys];
}

const cell = fc.oneof(
  fc.double({ min: -1e6, max: 1e6, noNaN: true }).map((v) => String(v)),
  fc.integer({ min: -100000, max: 100000 }).map(String),
  fc.tuple(fc.integer({ min: 0, max: 999 }), fc.integer({ min: 0, max: 99999 })).map(([a, b]) => `${a}.${String(b).padStart(5, '0')}`),
  fc.tuple(fc.integer({ min: 1, max: 9 }), fc.integer({ min: -12, max: 12 })).map(([a, e]) => `${a}.5e${e}`),
  fc.integer({ min: 0, max: 999 }).map((a) => `+${a}.`),
  fc.integer({ min: 0, max: 999 }).map((a) => `-.${a}`),
);

// Strains in % below the 500 % the reader accepts, in the same written forms.
const strainCell = fc.oneof(
  fc.double({ min: -1, max: 300, noNaN: true }).map((v) => String(v)),
  fc.tuple(fc.integer({ min: 0, max: 299 }), fc.integer({ min: 0, max: 99999 })).map(([a, b]) => `${a}.${String(b).padStart(5, '0')}`),
  fc.tuple(fc.integer({ min: 1, max: 9 }), fc.integer({ min: -12, max: 1 })).map(([a, e]) => `${a}.5E${e}`),
  fc.integer({ min: 0, max: 99 }).map((a) => `+${a}.`),
  fc.integer({ min: 0, max: 999 }).map((a) => `-.${a}`),
);

describe('parseRecordText through the fast scanner gives what an independent parser reads', () => {
  it('random plain records (delimiters, decimal comma, spaces, CRLF, blank lines, extra columns): same numbers as udsv + Number()', () => {
    let runs = 0, refused = 0;
    fc.assert(fc.property(
      fc.constantFrom(',', ';', '\t'), fc.boolean(), fc.boolean(), fc.integer({ min: 0, max: 2 }),
      fc.array(fc.tuple(strainCell, cell, fc.constantFrom('', ' ', '  '), fc.boolean()), { minLength: 10, maxLength: 60 }),
      (d, comma, crlf, extra, rows) => {
        runs++;
        const dc = comma && d !== ',';
        const nl = crlf ? '\r\n' : '\n';
        const fmt = (s: string) => (dc ? s.replace('.', ',') : s);
        const header = ['Strain [%]', 'Stress [MPa]', ...Array.from({ length: extra }, (_, i) => `Note ${i}`)].join(d);
        // A row of positive values first, so the layout is found the same way every time.
        let text = header + nl + ['1', '2', ...Array.from({ length: extra }, () => '0')].join(d) + nl;
        for (const [a, b, pad, blank] of rows) {
          text += [pad + fmt(a) + pad, fmt(b) + pad, ...Array.from({ length: extra }, () => 'n/a')].join(d) + nl;
          if (blank) text += nl;
        }
        let got;
        try {
          got = parseRecordText(text, { file: 'p.csv', decimal: dc ? ',' : '.', strainUnit: 'percent' });
        } catch (e) {
          // Only the record-level checks may refuse (e.g. every stress 0, strains beyond 500 %); never a cell.
          expect(String((e as PlanError).message)).not.toMatch(/expected a number/);
          refused++;
          return;
        }
        const [xs, ys] = reference(text.replace(/\r\n/g, '\n'), d, 1, dc, [0, 1], 2 + extra);
        expect(got.rows).toBe(xs.length);
        for (let i = 0; i < xs.length; i++) {
          expect(got.strain[i]).toBe(xs[i]! * 0.01);
          expect(got.stress[i]).toBe(ys[i]!);
        }
      }), { numRuns: 200, seed: 12 });
    expect(refused, `${refused} of ${runs} random records refused as records`).toBeLessThan(runs / 10);
  });

  it('random records whose cells are quoted ("1.5", spaces around the quotes, a quoted note holding the delimiter): the same numbers as csv-parse (npm, RFC 4180) + Number(), through the text and the file reader', async () => {
    let runs = 0, quotedRows = 0;
    const dir = mkdtempSync(join(tmpdir(), 'sl-quoted-'));
    await fc.assert(fc.asyncProperty(
      fc.constantFrom(',', ';', '\t'), fc.boolean(), fc.boolean(),
      fc.array(fc.tuple(strainCell, cell, fc.constantFrom(0, 1, 2, 3), fc.constantFrom('', ' ')), { minLength: 10, maxLength: 60 }),
      async (d, comma, crlf, rows) => {
        runs++;
        const dc = comma && d !== ',';
        const nl = crlf ? '\r\n' : '\n';
        const fmt = (s: string) => (dc ? s.replace('.', ',') : s);
        // quote: 0 none, 1 the strain, 2 both, 3 both and the note (which holds the delimiter).
        let text = `"Strain [%]"${d}"Stress [MPa]"${d}"Note"${nl}1${d}2${d}0${nl}`;
        for (const [a, b, quote, pad] of rows) {
          const qa = quote >= 1 ? `${pad}"${fmt(a)}"${pad}` : fmt(a), qb = quote >= 2 ? `${pad}"${fmt(b)}"` : fmt(b);
          const note = quote === 3 ? `"a${d}b"` : 'n';
          if (quote > 0) quotedRows++;
          text += [qa, qb, note].join(d) + nl;
        }
        const opts = { file: 'q.csv', decimal: dc ? ',' as const : '.' as const, strainUnit: 'percent' as const };
        const ref = parseCsv(text, { delimiter: d, trim: true, relax_column_count: true, skip_empty_lines: true, from_line: 2 }) as string[][];
        const num = (s: string) => Number(dc ? s.trim().replace(',', '.') : s.trim());
        const got = parseRecordText(text, opts);
        const file = join(dir, `q${runs}.csv`);
        writeFileSync(file, text);
        const viaFile = await readRecordFile(file, opts);
        expect(got.rows).toBe(ref.length);
        expect(viaFile.rows).toBe(ref.length);
        ref.forEach((r, i) => {
          expect(got.strain[i]).toBe(num(r[0]!) * 0.01);
          expect(got.stress[i]).toBe(num(r[1]!));
          expect(viaFile.strain[i]).toBe(got.strain[i]);
          expect(viaFile.stress[i]).toBe(got.stress[i]);
        });
      }), { numRuns: 150, seed: 21 });
    expect(quotedRows).toBeGreaterThan(runs * 10);
  });

  it('plain decimals of 1 to 17 digits with the point anywhere read to the same double as Number() (the reference: the engine\'s own ECMAScript StringToNumber)', () => {
    const rnd = fc.sample(fc.tuple(fc.integer({ min: 1, max: 17 }), fc.integer({ min: 0, max: 17 }), fc.boolean(), fc.array(fc.integer({ min: 0, max: 9 }), { minLength: 17, maxLength: 17 })), { numRuns: 20_000, seed: 3 });
    const cells = rnd.map(([len, at, neg, ds]) => {
      const digits = ds.slice(0, len).join('');
      const p = Math.min(at, len);
      return `${neg ? '-' : ''}${digits.slice(0, p)}.${digits.slice(p)}`.replace(/\.$/, '');
    });
    const text = 'strain [-],stress [MPa]\n' + cells.map((c, i) => `${(i + 1) * 1e-5},${c}`).join('\n') + '\n';
    const r = parseRecordText(text, { file: 'd.csv' });
    expect(r.rows).toBe(cells.length);
    cells.forEach((c, i) => { if (r.stress[i] !== Number(c)) expect(r.stress[i], c).toBe(Number(c)); });
  });

  it('refuses what the located reader refuses, with the same located message (0x10, Infinity, a short row); an empty stress cell is a lost sample', () => {
    const base = 'strain,stress [MPa]\n' + Array.from({ length: 12 }, (_, i) => `${i * 0.001},${i * 10}`).join('\n') + '\n';
    for (const [bad, re] of [['0x10', /^b\.csv:14:2: .*got "0x10", expected a number$/], ['Infinity', /^b\.csv:14:2: .*expected a finite number$/], [null, /^b\.csv:14:2: .*the row has 1 field; expected 2/]] as const) {
      // A row of numbers follows the bad one, so it is an error (a bad row only at the end is a footer: below).
      const text = base + (bad === null ? '0.02\n' : `0.02,${bad}\n`) + '0.03,130\n';
      let msg = '';
      try { parseRecordText(text, { file: 'b.csv', strainUnit: 'fraction' }); } catch (e) { msg = (e as Error).message; }
      expect(msg, String(bad)).toMatch(re);
    }
    // The stress cell empty beside a strain (no reading, not a bad one): left out as a lost sample, and said.
    const lost = parseRecordText(base + '0.02,\n0.03,130\n', { file: 'b.csv', strainUnit: 'fraction' });
    expect(lost.rows).toBe(13);
    expect(lost.warnings.join('\n')).toMatch(/line 14 holds no reading in "stress \[MPa\]" \(empty or NaN\) beside a reading in the other column: left out as lost samples/);
  });

  it('rows after the data that are not numbers are a footer (a warning naming the lines), unless numbers follow them', () => {
    const base = 'strain,stress [MPa]\n' + Array.from({ length: 12 }, (_, i) => `${i * 0.001},${i * 10}`).join('\n') + '\n';
    const r = parseRecordText(base + '\nMaximum,110\nEnd of test,\n', { file: 'f.csv', strainUnit: 'fraction' });
    expect(r.rows).toBe(12);
    expect(r.warnings.join('\n')).toMatch(/lines 15–16 after the data are not rows of numbers \(first: got "Maximum", expected a number\): read as a footer and left out; the record ends at line 13/);
    // Extensometer taken off: the strain cells are empty to the end while the stress goes on.
    // The rows are kept with the strain's last value held (the force still counts for Rm; the analysis finds where
    // the strain stopped, test/core/tensile/record-ends-and-glitches.test.ts).
    const off = parseRecordText(base + ',130\n,140\n,135\n', { file: 'x.csv', strainUnit: 'fraction' });
    expect(off.rows).toBe(15);
    expect(Array.from(off.strain.subarray(11))).toEqual([0.011, 0.011, 0.011, 0.011]);
    expect(Array.from(off.stress.subarray(11))).toEqual([110, 130, 140, 135]);
    expect(off.warnings.join('\n')).toMatch(/strain column "strain" is empty from line 14 to the end \(3 rows; extensometer taken off\?\): its last value is held there/);
    // A strain again after empty strain cells: those rows were lost strain samples, left out and said.
    const again = parseRecordText(base + ',130\n0.02,140\n', { file: 'y.csv', strainUnit: 'fraction' });
    expect(again.rows).toBe(13);
    expect(Array.from(again.stress.subarray(11))).toEqual([110, 140]);
    expect(again.warnings.join('\n')).toMatch(/line 14 holds no reading in "strain" \(empty or NaN\) beside a reading in the other column: left out as lost samples/);
    // A footer after the held rows is still a footer.
    const offEnd = parseRecordText(base + ',130\n,140\nEnd of test,\n', { file: 'z.csv', strainUnit: 'fraction' });
    expect(offEnd.rows).toBe(14);
    expect(offEnd.warnings.join('\n')).toMatch(/line 16 after the data is not a row of numbers/);
    // A results table the machine appends (a line of column names, a few rows of numbers) is footer too.
    const res = parseRecordText(base + '\nResults\nRp0.2 [MPa],Rm [MPa]\n108.5,110.0\n', { file: 'r.csv', strainUnit: 'fraction' });
    expect(res.rows).toBe(12);
    expect(res.warnings.join('\n')).toMatch(/lines 15–17 after the data hold a results table \(from "Results"\): read as a footer and left out; the record ends at line 13/);
    // …but not the rest of a curve after a line of words: more than a results table's rows is the error it was.
    const rest = Array.from({ length: 25 }, (_, i) => `${0.02 + i * 0.001},${120 + i}`).join('\n');
    expect(() => parseRecordText(base + 'note,here\n' + rest + '\n', { file: 'n.csv', strainUnit: 'fraction' })).toThrow(/^n\.csv:14:1: strain: got "note", expected a number$/);
    // Numbers after a non-number row: the first bad row is the error, located.
    expect(() => parseRecordText(base + 'Maximum,110\n0.5,120\n', { file: 'g.csv', strainUnit: 'fraction' })).toThrow(/^g\.csv:14:1: strain: got "Maximum", expected a number$/);
    // A bad row among the first ten is an error, never a footer.
    expect(() => parseRecordText('strain,stress [MPa]\n0,0\n0.001,abc\n', { file: 'h.csv', strainUnit: 'fraction' })).toThrow(/h\.csv:3:2: .*got "abc"/);
    // Rows of empty cells (spreadsheet blank rows) are skipped like empty lines.
    expect(parseRecordText(base.replace('\n0.005', '\n,\n0.005'), { file: 'e.csv', strainUnit: 'fraction' }).rows).toBe(12);
  });

  it('readRecordFile streams across chunk boundaries (3 MB file) and gives the same arrays as parseRecordText', async () => {
    let text = 'Record:\tINVENTED\nStrain\tStress\n%\tMPa\n';
    for (let i = 0; i < 150_000; i++) text += `${(i * 1e-4).toFixed(6)}\t${(200 + 400 * (1 - Math.exp(-i / 4e4))).toFixed(4)}\r\n`;
    const dir = mkdtempSync(join(tmpdir(), 'sl-scan-'));
    const file = join(dir, 'big.tsv');
    writeFileSync(file, text);
    const a = await readRecordFile(file);
    const b = parseRecordText(text, { file: 'big.tsv' });
    expect(a.rows).toBe(150_000);
    expect(Array.from(a.strain)).toEqual(Array.from(b.strain));
    expect(Array.from(a.stress)).toEqual(Array.from(b.stress));
    expect(a.stress[149_999]).toBe(Number((200 + 400 * (1 - Math.exp(-149_999 / 4e4))).toFixed(4)));
  });
});
