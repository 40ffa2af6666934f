// The two-thread reader of readRecordFile (src/records/node.ts `scanPieces`, src/records/scan.ts
// `scanPiece`, `scanJobPieces`): a record read in pieces, some by a helper, must give what the
// one-thread reader gives — the same numbers, warnings and located messages (line numbers counted on
// across pieces). The helper here is deterministic: it takes the first `take` pieces in `post` (the
// runner's worker, cli/fitThreads.ts, is checked end to end in test/cli/analyze.test.ts). Records
// are INVENTED, made by a seeded generator.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { xoshiro128ss } from '../../src/core/index.js';
import { readRecordFile, type PieceHelper } from '../../src/records/node.js';
import { pieceEnd, scanJobPieces, scanPiece, type PieceAnswer, type PieceJob } from '../../src/records/scan.js';

const dir = mkdtempSync(join(tmpdir(), 'sl-pieces-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** A helper that takes the first `take` pieces at once when the job is posted, and answers all but `lose`. */
function fakeHelper(take: number, pieceBytes: number, lose = -1): PieceHelper & { taken: number } {
  const answers: PieceAnswer[] = [];
  const h = {
    taken: 0, piecesFrom: 0, pieceBytes, waitMs: 50,
    post(job: PieceJob) {
      const K = job.bounds.length - 1;
      for (let t = 0; t < take; t++) {
        const k = Atomics.add(job.ctl, 0, 1);
        if (k >= K) return;
        Atomics.store(job.ctl, 1 + k, 2);
        h.taken++;
        if (k === lose) continue; // taken and never answered: the reader must scan it itself after waitMs
        answers.push({ ...scanPiece(job.bytes, job.bounds[k]!, pieceEnd(job, k), job.cells, k === 0 ? job.cells.dataLine : 1), id: job.id, k });
        Atomics.store(job.ctl, 1 + k, 3);
      }
    },
    collect: () => answers.splice(0),
  };
  return h;
}

/** What a reader gives: numbers, warnings and columns, or the message it throws. */
async function outcome(read: () => Promise<{ strain: Float64Array; stress: Float64Array; warnings: string[] }>) {
  try {
    const r = await read();
    return { strain: Array.from(r.strain), stress: Array.from(r.stress), warnings: r.warnings };
  } catch (e) {
    return (e as Error).message;
  }
}

/** An INVENTED record: metadata, header, units row, `rows` rows; `eol` LF or CRLF; `odd` puts a cell at row `odd.at`. */
function record(seed: number, rows: number, eol: string, odd?: { at: number; cell: string }) {
  const rng = xoshiro128ss(seed);
  const lines = ['Specimen;invented-7', 'Strain;Stress', '%;MPa'];
  for (let i = 0; i < rows; i++) {
    const e = (i * 0.013).toFixed(4), s = (200 + 300 * rng.nextFloat()).toFixed(3);
    lines.push(odd && odd.at === i ? `${odd.cell};${s}` : `${e};${s}`);
  }
  return lines.join(eol) + (rng.nextFloat() < 0.5 ? eol : '');
}

describe('readRecordFile(path, opts, helper) reads in pieces what the one-thread reader reads', () => {
  const cases: [string, { at: number; cell: string } | undefined][] = [
    ['clean', undefined],
    ['a doubtful cell in a later piece (text readers take the record)', { at: 171, cell: '"1.5"' }],
    ['a cell that is no number in a later piece (located message)', { at: 133, cell: 'abc' }],
    ['the largest strain in a later piece, beyond what a tensile test reaches (located message of its line)', { at: 150, cell: '900' }],
    ['an exponent in a later piece (read by the general path)', { at: 77, cell: '1.5e0' }],
  ];
  for (const [what, odd] of cases) {
    for (const eol of ['\n', '\r\n']) {
      it(`${what}, ${eol === '\n' ? 'LF' : 'CRLF'}: same outcome for every piece size and every share the helper takes`, async () => {
        const file = join(dir, `r-${cases.findIndex((c) => c[0] === what)}-${eol.length}.csv`);
        writeFileSync(file, record(3, 200, eol, odd));
        const ref = await outcome(() => readRecordFile(file));
        if (odd === undefined || odd.cell === '1.5e0') expect(typeof ref, 'the one-thread reader reads it').toBe('object');
        if (odd?.cell === 'abc' || odd?.cell === '900') expect(String(ref)).toMatch(new RegExp(`:${odd.at + 4}:1: `));
        for (const pieceBytes of [1, 37, 200, 1000, 4000]) {
          for (const take of [0, 1, 2, 5, 1000]) {
            const h = fakeHelper(take, pieceBytes);
            expect(await outcome(() => readRecordFile(file, {}, h)), `pieces of ${pieceBytes} bytes, helper takes ${take}`).toEqual(ref);
          }
        }
      });
    }
  }

  it('a piece the helper took and never answered is read by the calling thread after the wait', async () => {
    const file = join(dir, 'lost.csv');
    writeFileSync(file, record(9, 300, '\n'));
    const ref = await outcome(() => readRecordFile(file));
    const h = fakeHelper(3, 500, 1);
    expect(await outcome(() => readRecordFile(file, {}, h))).toEqual(ref);
    expect(h.taken).toBe(3);
  });

  it('scanJobPieces takes every piece left and answers each once', () => {
    const text = 'a,b\n' + Array.from({ length: 100 }, (_, i) => `${i},${2 * i}`).join('\n') + '\n';
    const bytes = new Uint8Array(new SharedArrayBuffer(text.length + 1));
    bytes.set(new TextEncoder().encode(text));
    const bounds = [0];
    for (let at = text.indexOf('\n', 100) + 1; at > 0 && at < text.length; at = text.indexOf('\n', at + 100) + 1) bounds.push(at);
    bounds.push(text.length);
    const job: PieceJob = { id: 1, bytes, bounds: Float64Array.from(bounds), ctl: new Int32Array(new SharedArrayBuffer(4 * bounds.length)), cells: { a: 0, b: 1, width: 2, decimalComma: false, delimiter: ',', dataLine: 2 } };
    const got: PieceAnswer[] = [];
    expect(scanJobPieces(job, (a) => got.push(a))).toBe(bounds.length - 1);
    const xs = got.flatMap((a) => Array.from(a.xs.subarray(0, a.n)));
    expect(xs).toEqual(Array.from({ length: 100 }, (_, i) => i));
    expect(got.reduce((s, a) => s + a.lines, 0)).toBe(101);
  });
});
