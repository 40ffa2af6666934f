// Web worker of the record bench: reads the dropped record and analyses it (properties, every law
// fit) off the page's thread, with the same parser and core functions as the runner, so a record
// of 100,000 points never freezes the page.
import { analyzeRecord, ComputationError, InputError, testStarts } from '../../src/core/index.js';
import type { TensileAnalysis } from '../../src/core/index.js';
import { PlanError } from '../../src/plan/problems.js';
import { parseRecordText, sampleLine, strainUnitHint, travelOptions } from '../../src/records/index.js';
import type { RecordOptions, TensileRecord } from '../../src/records/index.js';

/** An error as plain data (classes do not cross to the page); `recordError` in main.ts rebuilds it. */
export type WorkerError =
  | { kind: 'plan'; problems: PlanError['problems'] }
  | { kind: 'input'; path: string; value: unknown; allowed: string; message: string }
  | { kind: 'other'; message: string };

/** `test`: which test of a file that holds several (1-based; testStarts in the core), default the first. */
/** `modulus`: the specimen's Young's modulus given on the page (MPa), used instead of the measured one. */
export interface WorkerRequest { id: number; name: string; text: string; options: RecordOptions; test?: number; modulus?: number }
/** `tests`: how many tests the file holds and which one `record` and `analysis` are (1-based). */
export type WorkerReply =
  | { id: number; ok: true; record: TensileRecord; analysis: TensileAnalysis | null; analysisError: WorkerError | null; tests: { count: number; shown: number } }
  | { id: number; ok: false; error: WorkerError };

/**
 * Test `k` (1-based) of a record whose further tests start at `starts`: its samples as a record of their own, named
 * `NAME (test k of n)`, with its sample range in `test` (as the command line splits such a file).
 */
function testOf(record: TensileRecord, starts: readonly number[], k: number): TensileRecord {
  const bounds = [0, ...starts, record.strain.length];
  const from = bounds[k - 1]!, to = bounds[k]!;
  return {
    ...record, name: `${record.name} (test ${k} of ${bounds.length - 1})`, strain: record.strain.subarray(from, to), stress: record.stress.subarray(from, to),
    rows: to - from, test: { index: k, of: bounds.length - 1, fromSample: from, toSample: to - 1 },
  };
}

function plain(e: unknown): WorkerError {
  if (e instanceof PlanError) return { kind: 'plan', problems: e.problems };
  if (e instanceof InputError) return { kind: 'input', path: e.path, value: typeof e.value === 'number' || typeof e.value === 'string' ? e.value : String(e.value), allowed: e.allowed, message: e.message };
  if (e instanceof ComputationError || e instanceof Error) return { kind: 'other', message: e.message };
  return { kind: 'other', message: String(e) };
}

/**
 * Every ArrayBuffer under `x` (the typed arrays of the record and the analysis), once each: posted as transferables
 * they move to the page without a copy. Copied, a 1,000,000-row record's 70 MB of columns, flow curve and residuals
 * took 190 ms of the page's thread to receive (a frozen page; bench/notebook-records.mjs with ROWS=1000000).
 */
export function buffersOf(x: unknown, out: Set<ArrayBuffer> = new Set(), seen: Set<object> = new Set()): Set<ArrayBuffer> {
  if (x === null || typeof x !== 'object' || seen.has(x)) return out;
  seen.add(x);
  if (ArrayBuffer.isView(x)) {
    if (x.buffer instanceof ArrayBuffer) out.add(x.buffer);
    return out;
  }
  if (x instanceof Map) for (const [k, v] of x) { buffersOf(k, out, seen); buffersOf(v, out, seen); }
  else for (const v of Object.values(x)) buffersOf(v, out, seen);
  return out;
}

self.onmessage = (e: MessageEvent<WorkerRequest>) => {
  const { id, name, text, options, test, modulus } = e.data;
  const post = (r: WorkerReply) => (self as unknown as Worker).postMessage(r, [...buffersOf(r)]);
  let record: TensileRecord;
  try {
    record = parseRecordText(text, { ...options, file: name });
  } catch (err) {
    post({ id, ok: false, error: plain(err) });
    return;
  }
  let tests = { count: 1, shown: 1 };
  try {
    // A file of several tests: analyzeRecord analyses the first (furtherTests says where the others start); another one
    // asked for is cut out first (testStarts, one pass) and analysed as a record of its own.
    if ((test ?? 1) > 1) {
      const starts = testStarts(record.strain, record.stress);
      if (starts.length) {
        const k = Math.min(Math.round(test!), starts.length + 1);
        tests = { count: starts.length + 1, shown: k };
        record = testOf(record, starts, k);
      }
    }
    // The page's field is in GPa: a value that is no modulus is said in its words (the core would say elasticModulus, MPa).
    if (modulus !== undefined && !(modulus > 0 && Number.isFinite(modulus))) throw new InputError('specimen\'s modulus E', Number.isNaN(modulus) ? 'not a number' : modulus / 1000, 'a modulus in GPa above 0 (metals: 40–450 GPa), or the field left empty to measure E from the record');
    // A given modulus replaces the measured one; with the machine's travel as the strain it also takes the machine's
    // compliance out (analyzeRecord's machineTravel), as the command line does.
    const analysis = analyzeRecord(record, { ...(modulus !== undefined ? { elasticModulus: modulus } : {}), ...travelOptions(record) });
    if (analysis.furtherTests.length) tests = { count: analysis.furtherTests.length + 1, shown: 1 };
    // Residuals travel as Float64Arrays (a typed array is copied in one block; a plain array of
    // 100,000 numbers element by element).
    if (analysis.fits) for (const f of analysis.fits.fits) (f as { residuals: unknown }).residuals = Float64Array.from(f.residuals);
    // So do the true and flow curves' columns (the page only indexes them): as plain arrays they were 5 × 766,000
    // numbers cloned one by one for a 1,000,000-row record, 160 ms of the page's thread.
    for (const curve of [analysis.trueCurve, analysis.flowCurve] as unknown as Record<string, unknown>[]) {
      for (const [k, v] of Object.entries(curve)) if (Array.isArray(v)) curve[k] = Float64Array.from(v as number[]);
    }
    post({ id, ok: true, record, analysis, analysisError: null, tests });
  } catch (err) {
    // An impossible E from a record whose strain unit was guessed: say that the guess explains it (strainUnitHint).
    const e = err as { path?: unknown; value?: unknown; message?: unknown };
    const hint = e?.path === 'elasticModulus' && typeof e.value === 'number' ? strainUnitHint(record, e.value) : null;
    let p = plain(err);
    if (hint && p.kind === 'input') p = { ...p, allowed: `${p.allowed}; ${hint}`, message: `${p.message}; ${hint}` };
    // An error about one sample (a block of dropped rows, a run of zero stress): its line in the file, as the command line says it.
    const at = p.kind === 'input' ? /^(strain|stress)\[(\d+)\]$/.exec(p.path) : null;
    const line = at ? sampleLine(record, Number(at[2])) : undefined;
    if (p.kind === 'input' && line !== undefined) p = { ...p, message: `${p.message} (line ${line} of ${name})` };
    post({ id, ok: true, record, analysis: null, analysisError: p, tests });
  }
};
