// Where each sample of a record is in its file (TensileRecord.lineRuns, sampleLine), so that an analysis error about a
// sample (a run of zero stress, a block of dropped rows) names the file line. Checked against the file's own text:
// the line sampleLine names must hold that sample's numbers, on files with blank lines and rows of empty cells placed
// at random, through every reader (the byte scanner, the decoded-text scanner for non-ASCII text, csv-parse for
// quoted cells, and the browser's parseRecordText). INVENTED records.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { MAX_LINE_RUNS, parseRecordText, sampleLine, type TensileRecord } from '../../src/records/index.js';
import { readRecordFile } from '../../src/records/node.js';

const dir = mkdtempSync(join(tmpdir(), 'sl-lines-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** A file of `n` rows (strain %, stress MPa, a note column) with a blank line or a row of empty cells before the rows in `gaps` (from row 10: the layout is read from the first rows). */
function fileText(n: number, gaps: number[], gapKind: 'blank' | 'empty', cell: (i: number) => string): string {
  const out = ['Specimen: invented', 'Strain [%],Stress [MPa],Note'];
  for (let i = 0; i < n; i++) {
    for (const g of gaps) if (g === i) out.push(gapKind === 'blank' ? '' : ',,');
    out.push(`${(i * 0.05).toFixed(2)},${(i < 20 ? i * 10 : 200 + i).toFixed(1)},${cell(i)}`);
  }
  return out.join('\n') + '\n';
}

/** Every sample's line holds its numbers (strain % / 100, stress). */
function expectLinesHold(rec: TensileRecord, text: string, what: string): void {
  const lines = text.split('\n');
  for (let i = 0; i < rec.strain.length; i++) {
    const L = sampleLine(rec, i);
    expect(L, `${what}: sample ${i}`).toBeDefined();
    const cells = lines[L! - 1]!.split(',');
    expect(Number(cells[0]) / 100, `${what}: sample ${i} on line ${L}`).toBeCloseTo(rec.strain[i]!, 12);
    expect(Number(cells[1]), `${what}: sample ${i} on line ${L}`).toBe(rec.stress[i]);
  }
  expect(sampleLine(rec, rec.strain.length + 5)).toBeUndefined();
  expect(sampleLine(rec, -1)).toBeUndefined();
}

describe('sampleLine: the file line of each sample, through every reader', () => {
  it('blank lines and rows of empty cells at random places: each sample\'s line holds its numbers', async () => {
    let k = 0;
    await fc.assert(fc.asyncProperty(
      fc.integer({ min: 40, max: 120 }), fc.uniqueArray(fc.integer({ min: 10, max: 119 }), { maxLength: 6 }), fc.constantFrom('blank' as const, 'empty' as const),
      async (n, gapsAll, kind) => {
        const gaps = gapsAll.filter((g) => g < n).sort((a, b) => a - b);
        const variants: [string, (i: number) => string][] = [
          ['bytes', () => 'ok'],
          ['decoded text (non-ASCII note)', (i) => (i === 3 ? 'é' : 'ok')],
          ['csv-parse (a quoted note)', (i) => (i === 5 ? '"a,b"' : 'ok')],
        ];
        for (const [what, cell] of variants) {
          const text = fileText(n, gaps, kind, cell);
          const file = join(dir, `r${k++}.csv`);
          writeFileSync(file, text);
          expectLinesHold(await readRecordFile(file), text, `${what}, gaps ${kind} before ${gaps.join(' ')}`);
          expectLinesHold(parseRecordText(text, { file: 'x.csv' }), text, `parseRecordText, ${what}`);
        }
      }), { numRuns: 25, seed: 12 });
  });

  it('a double-spaced export (a blank line after every row): the first MAX_LINE_RUNS samples placed, then none (bounded memory)', async () => {
    const n = 25_000;
    const text = 'Strain [%],Stress [MPa]\n' + Array.from({ length: n }, (_, i) => `${(i * 0.001).toFixed(3)},${(i < 50 ? i * 4 : 200 + i * 0.01).toFixed(2)}\n`).join('\n');
    const file = join(dir, 'double.csv');
    writeFileSync(file, text);
    for (const rec of [await readRecordFile(file), parseRecordText(text, { file: 'double.csv' })]) {
      expect(rec.rows).toBe(n);
      expect(rec.lineRuns!.length).toBe(MAX_LINE_RUNS + 1);
      // Row i is on line 2 + 2i.
      for (const i of [0, 1, 777, MAX_LINE_RUNS - 1]) expect(sampleLine(rec, i)).toBe(2 + 2 * i);
      expect(sampleLine(rec, MAX_LINE_RUNS)).toBeUndefined();
      expect(sampleLine(rec, n - 1)).toBeUndefined();
    }
  });

  it('a test of several in one file counts from its own first sample; no runs, no line', () => {
    const rec = { lineRuns: [{ sample: 0, line: 3 }, { sample: 50, line: 60 }], test: { index: 2, of: 2, fromSample: 40, toSample: 99 } };
    expect(sampleLine(rec, 0)).toBe(43);
    expect(sampleLine(rec, 10)).toBe(60);
    expect(sampleLine(rec, 59)).toBe(109);
    expect(sampleLine(rec, 60)).toBeUndefined();
    expect(sampleLine({ lineRuns: [] }, 0)).toBeUndefined();
    expect(sampleLine({}, 0)).toBeUndefined();
  });
});
