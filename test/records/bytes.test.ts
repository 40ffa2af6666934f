// The byte scanner of readRecordFile (src/records/scan.ts `ByteRowScanner`, src/records/node.ts
// `scanBytes`) against the text readers (`parseRecordText`: the string row scanner, else csv-parse
// with line information): on random files, with doubtful content mixed in (quotes, control
// characters, lone CRs, non-ASCII text, empty cells, exponents, blank lines, missing final LF), both
// readers must give the same numbers or the same located message. Reference of the numbers:
// udsv + Number() in test/records/scan.test.ts for the text reader; here the two readers are held to
// each other, and at every piece size (lines cut anywhere).
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { detectLayout, parseRecordText } from '../../src/records/index.js';
import { readRecordFile, scanBytes } from '../../src/records/node.js';
import { headLines } from '../../src/records/parse.js';

const dir = mkdtempSync(join(tmpdir(), 'sl-bytes-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const plain = fc.oneof(
  fc.double({ min: -1e4, max: 1e4, noNaN: true }).map((v) => String(v)),
  fc.tuple(fc.integer({ min: 0, max: 299 }), fc.integer({ min: 0, max: 99999 })).map(([a, b]) => `${a}.${String(b).padStart(5, '0')}`),
  fc.tuple(fc.integer({ min: 1, max: 9 }), fc.integer({ min: -12, max: 1 })).map(([a, e]) => `${a}.5E${e}`),
  fc.integer({ min: 0, max: 99 }).map((a) => `+${a}.`),
  fc.integer({ min: 0, max: 999 }).map((a) => `-.${a}`),
  fc.constant('12345678901234567890'),
);
// Doubtful cells: each must send the record to the text readers (or be read the same way).
const odd = fc.constantFrom('', ' ', '"1.5"', ' "2,5" ', '"-3e2"', '""', '"a""b"', '"x;y,z"', '"1.5"x', '" 7 "', '"8', '9"', '1e400', 'Infinity', '0x10', 'abc', 'µm', 'é', '\u0001', '\u007f', '1 2', '\t3', '4\t', 'NaN', '1.2.3', '\uFEFF5');

// Strains in % below the 500 % the reader accepts.
const strain = fc.oneof(
  fc.double({ min: -1, max: 300, noNaN: true }).map((v) => String(v)),
  fc.tuple(fc.integer({ min: 0, max: 299 }), fc.integer({ min: 0, max: 99999 })).map(([a, b]) => `${a}.${String(b).padStart(5, '0')}`),
  fc.tuple(fc.integer({ min: 1, max: 9 }), fc.integer({ min: -12, max: 1 })).map(([a, e]) => `${a}.5e${e}`),
);

const line = (d: string, dc: boolean) => fc.tuple(strain, plain, fc.constantFrom('', ' '), fc.boolean(), fc.integer({ min: 0, max: 300 }), odd, fc.integer({ min: 0, max: 3 }))
  .map(([a, b, pad, blank, oddAt, o, extra]) => {
    const f = (s: string) => (dc ? s.replace('.', ',') : s);
    const cells = [pad + f(a) + pad, f(b) + pad, ...Array.from({ length: extra }, () => '0')];
    if (oddAt < cells.length) cells[oddAt] = o; // now and then a doubtful cell
    return cells.join(d) + (blank ? '\n' : '');
  });

function outcome(fn: () => { strain: Float64Array; stress: Float64Array; rows: number }): string | { strain: number[]; stress: number[] } {
  try {
    const r = fn();
    return { strain: Array.from(r.strain), stress: Array.from(r.stress) };
  } catch (e) {
    return (e as Error).message;
  }
}

describe('readRecordFile through the byte scanner reads what the text readers read', () => {
  it('random records with doubtful cells, CRLF or LF or lone CRs, blank lines, no final LF: same numbers, or the same located message', async () => {
    let files = 0, refusedBoth = 0, scannedBytes = 0;
    await fc.assert(fc.asyncProperty(
      fc.boolean(), fc.constantFrom('\n', '\n', '\r\n', '\r'), fc.boolean(), fc.integer({ min: 1, max: 3 }),
      fc.constantFrom(',', ';', '\t').chain((d) => fc.array(line(d, false), { minLength: 10, maxLength: 40 }).map((rows) => ({ d, rows }))),
      async (comma, nl, finalLf, seedChunk, { d, rows }) => {
        files++;
        const dc = comma && d !== ',';
        const body = rows.map((r) => (dc ? r.replace(/(\d)\.(\d)/g, '$1,$2') : r)).join(nl).replace(/\n\n/g, nl + nl);
        const text = `Strain [%]${d}Stress [MPa]${d}Note${nl}1${d}2${d}0${nl}` + body + (finalLf ? nl : '');
        const file = join(dir, `r${files}.csv`);
        writeFileSync(file, text);
        const opts = { file: 'r.csv', strainUnit: 'percent' as const, ...(dc ? { decimal: ',' as const } : {}) };
        const want = outcome(() => parseRecordText(text, opts));
        const viaFile = await readRecordFile(file, opts).then((r) => ({ strain: Array.from(r.strain), stress: Array.from(r.stress) }), (e: Error) => e.message);
        expect(viaFile).toEqual(want);
        if (typeof want === 'string') refusedBoth++;
        // The byte scanner alone, lines cut at random places: null (doubt) or the same numbers.
        let layout;
        try { layout = detectLayout(headLines(text), 'r.csv', opts); } catch { return; }
        for (const chunk of [64, 97 + seedChunk * 13, 1 << 20]) {
          let b;
          try { b = scanBytes(file, layout, opts, chunk); } catch { continue; } // the column choice itself refused (as the text reader does)
          if (b === null) continue;
          scannedBytes++;
          const r = outcome(() => b.finish('r'));
          if (typeof r !== 'string') expect(r).toEqual(want);
        }
      }), { numRuns: 300, seed: 2026 });
    // Both answers must be reached often, and the byte path must actually run.
    expect(refusedBoth).toBeGreaterThan(20);
    expect(files - refusedBoth).toBeGreaterThan(20);
    expect(scannedBytes).toBeGreaterThan(100);
  });

  it('cells at the 15-significant-digit edge (leading and trailing zeros, 15, 16 and 17 digits) read as Number() reads them', () => {
    // The byte path's exact form takes at most 15 significant digits (m < 10^15 < 2^53); a 16th sends the cell to
    // generalDecimal. Leading zeros are not significant, trailing ones are. Reference: Number() of the cell's text.
    const cells = ['0.000123456789012345', '000012.5', '12.50000000000000', '12.500000000000000', '1.50000000000000000',
      '123456789012345', '1234567789012345.5', '0.1234567890123456', '99999.9999999999', '0000000000000000001.25', '.000000000000000000000125',
      '7.1000000000000000000000001', '0.0', '000', '4503599627370497.5'];
    let text = 'Strain [%],Stress [MPa]\n';
    // Edge cells in the stress column (the strain column must stay below 500 %); strains plain.
    for (let i = 0; i < 40; i++) text += `${(i * 0.1).toFixed(1)},${cells[i % cells.length]}\n`;
    const file = join(dir, 'edge.csv');
    writeFileSync(file, text);
    const layout = detectLayout(headLines(text), 'e.csv', {});
    const b = scanBytes(file, layout, { file: 'e.csv' });
    expect(b).not.toBeNull();
    const r = b!.finish('e');
    for (let i = 0; i < 40; i++) {
      expect(Object.is(r.stress[i], Number(cells[i % cells.length])), `stress row ${i}: ${cells[i % cells.length]}`).toBe(true);
    }
  });

  it('a clean record is read by the byte path at every piece size from 40 bytes (lines cut at every place), the same arrays as the text reader', () => {
    let text = 'Strain [%],Stress [MPa]\r\n';
    for (let i = 0; i < 300; i++) text += `${(i * 0.0137).toFixed(5)},${(200 + i * 1.25).toFixed(3)}${i % 7 === 0 ? 'e0' : ''}\r\n`;
    const file = join(dir, 'clean.csv');
    writeFileSync(file, text);
    const want = parseRecordText(text, { file: 'c.csv' });
    const layout = detectLayout(headLines(text), 'c.csv', {});
    for (let chunk = 40; chunk < 200; chunk++) {
      const b = scanBytes(file, layout, { file: 'c.csv' }, chunk);
      expect(b, `piece of ${chunk} bytes`).not.toBeNull();
      const r = b!.finish('c');
      expect(Array.from(r.strain)).toEqual(Array.from(want.strain));
      expect(Array.from(r.stress)).toEqual(Array.from(want.stress));
    }
  });
});

describe('the byte scanner\'s batches (speed follow-up K: stored converted, extremes tracked per batch)', () => {
  // INVENTED 10,000-row records (the scanner hands rows over in batches of 4096): the largest |strain| reached
  // twice, in two batches, so the message must name the first of them, as the per-row text reader does.
  const rows = (n: number, at: number[], big: string, header: string) =>
    header + '\n' + Array.from({ length: n }, (_, i) => `${at.includes(i) ? big : (i * 0.004).toFixed(4)},${(300 + i * 0.01).toFixed(2)}`).join('\n') + '\n';
  it('a strain beyond 500 % in rows 4500 and 9000: the same located message, naming line 4502, from both readers', async () => {
    const text = rows(10_000, [4500, 9000], '-750.5', 'Strain [%],Stress [MPa]');
    const f = join(dir, 'twice.csv');
    writeFileSync(f, text);
    const viaBytes = await readRecordFile(f).then(() => 'no error', (e: Error) => e.message);
    const viaText = outcome(() => parseRecordText(text, { file: f }));
    expect(viaBytes).toMatch(/twice\.csv:4502:1: Strain \[%\]: reaches 750\.5 — not a strain/);
    expect(viaBytes).toBe(viaText);
  });
  it('a strain column without a unit: the same warning (largest value) and numbers from both readers, across batches', async () => {
    const text = rows(10_000, [5000], '37.25', 'Strain,Stress [MPa]');
    const f = join(dir, 'nounit.csv');
    writeFileSync(f, text);
    const a = await readRecordFile(f), b = parseRecordText(text, { file: f });
    expect(a.warnings.join('\n')).toMatch(/read as percent because its largest value is 39\.996/);
    expect(a.warnings).toEqual(b.warnings);
    expect(Array.from(a.strain)).toEqual(Array.from(b.strain));
    expect(Array.from(a.stress)).toEqual(Array.from(b.stress));
  });
});
