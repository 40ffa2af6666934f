import { createReadStream, openSync, readSync, closeSync, fstatSync } from 'node:fs';
import { Writable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { parse } from 'csv-parse';
import { RecordBuilder, type RecordOptions, type TensileRecord } from './builder.js';
import { recordError } from './errors.js';
import { detectLayout, type Layout } from './layout.js';
import { MAX_ROWS } from './builder.js';
import { ByteRowScanner, pieceEnd, RowScanner, scanPiece, type PieceAnswer, type PieceJob, type PieceRows } from './scan.js';
import { checkText, csvProblem, headLines } from './parse.js';

/** Bytes read to find the layout (metadata, header, units row). */
export const HEAD_BYTES = 256 * 1024;

/**
 * Reads a tensile record file as a stream, in bounded memory (Node only; the browser uses
 * {@link parseRecordText}). The first HEAD_BYTES give the layout; the rest streams through
 * csv-parse, each row converted at once into typed arrays (16 bytes a row), so a file of millions
 * of rows needs little more than its numbers. Errors as {@link parseRecordText}.
 * @throws PlanError naming file, line, column and what was expected (file not found included).
 */
export async function readRecordFile(path: string, opts: RecordOptions = {}, helper?: PieceHelper): Promise<TensileRecord> {
  const file = opts.file ?? path;
  let fd: number;
  try {
    fd = openSync(path, 'r');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    throw recordError(file, undefined, undefined, '', code === 'ENOENT' ? 'file not found' : code === 'EISDIR' ? 'is a folder, not a record file' : `cannot read (${code})`);
  }
  const buf = Buffer.alloc(HEAD_BYTES);
  let got: number;
  try {
    got = readSync(fd, buf, 0, HEAD_BYTES, 0);
  } finally {
    closeSync(fd);
  }
  let head = buf.subarray(0, got);
  if (head.includes(0)) {
    const at = head.indexOf(0);
    const pre = head.subarray(0, at).toString('latin1');
    throw recordError(file, pre.split('\n').length, at - pre.lastIndexOf('\n'), '', 'binary content (NUL byte); expected a text export (CSV or tab-separated) in UTF-8');
  }
  let text = new TextDecoder('utf-8', { fatal: false }).decode(head);
  if (got === HEAD_BYTES) text = text.slice(0, Math.max(text.lastIndexOf('\n'), 0)); // whole lines only
  const bom = text.charCodeAt(0) === 0xfeff;
  if (bom) text = text.slice(1);
  if (text.trim() === '' && got < HEAD_BYTES) throw recordError(file, 1, 1, '', 'empty file; expected a header line of column names and rows of numbers below it');
  checkText(text, file);
  const layout = detectLayout(headLines(text), file, opts);
  const name = path.replace(/^.*[\\/]/, '').replace(/\.[^.]*$/, '');
  // Fast paths: the file's bytes, else (non-ASCII text after the header) its decoded text; any doubt,
  // and any error from finish, goes to the located reader below, which words every message.
  // With a helper thread, files of PIECES_FROM bytes or more are scanned in pieces by both threads
  // (undefined: not done that way; null: a doubt, which the one-thread byte reader would share).
  const shared = helper ? scanPieces(path, layout, { ...opts, file }, helper) : undefined;
  const fast = shared === undefined ? scanBytes(path, layout, { ...opts, file }) ?? await scanFile(path, layout, { ...opts, file })
    : shared ?? await scanFile(path, layout, { ...opts, file });
  if (fast) {
    try {
      return fast.finish(name);
    } catch { /* the located reader below words it */ }
  }
  const b = new RecordBuilder(layout, { ...opts, file });
  // Rows go straight from csv-parse's on_record into the builder (nothing is queued in the stream).
  const BIN = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFD]/;
  const parser = parse({
    bom: true, delimiter: layout.delimiter, from_line: layout.dataLine, relax_column_count: true, skip_empty_lines: true, trim: true, info: true,
    on_record: (rec: { record: string[]; info: { lines: number } }) => {
      for (const cell of rec.record) if (BIN.test(cell)) throw recordError(file, rec.info.lines, undefined, '', 'binary content; expected a text export (CSV or tab-separated) in UTF-8');
      b.push(rec.record, rec.info.lines);
      return null;
    },
  } as unknown as Parameters<typeof parse>[0]);
  const sink = new Writable({ objectMode: true, write: (_c, _e, cb) => cb() });
  try {
    await pipeline(createReadStream(path), parser, sink);
  } catch (e) {
    throw csvProblem(e, file);
  }
  return b.finish(name);
}

/** Bytes per read of the fast path: the memory it holds besides the two columns. */
export const CHUNK_BYTES = 1 << 20;

/**
 * The first fast path of {@link readRecordFile}: reads the file in CHUNK_BYTES pieces into one
 * buffer and scans the bytes with {@link ByteRowScanner} (no UTF-8 decoding; a line cut by the end
 * of a piece is moved to the front of the buffer and completed by the next read). Returns the
 * filled builder, or null on doubt (then {@link scanFile} reads the decoded text). Synchronous
 * reads: one 1 MiB read at a time, the event loop is not needed between them. `chunkBytes` is for
 * tests (lines cut at every place).
 */
export function scanBytes(path: string, layout: Layout, opts: RecordOptions, chunkBytes = CHUNK_BYTES): RecordBuilder | null {
  const b = new RecordBuilder(layout, opts);
  const sc = new ByteRowScanner(b);
  const CHUNK = Math.max(1, Math.floor(chunkBytes));
  const buf = Buffer.allocUnsafe(CHUNK + 1); // one spare byte: the scanner's end mark
  const fd = openSync(path, 'r');
  try {
    const size = fstatSync(fd).size;
    let have = 0, consumed = 0, first = true;
    for (;;) {
      const got = readSync(fd, buf, have, CHUNK - have, null);
      const end = have + got;
      const final = got === 0;
      const used = sc.scan(buf, 0, end, final);
      if (used < 0) return null;
      consumed += used;
      if (first && !final && b.rowCount > 0) {
        // Rows expected from the first piece's bytes per row (+2 %): the columns are sized once.
        b.reserve((b.rowCount * size / consumed) * 1.02 + 1024);
        first = false;
      }
      if (final) return used === end ? b : null;
      if (used === 0 && end === CHUNK) return null; // one line longer than the buffer: the text reader takes it
      buf.copy(buf, 0, used, end);
      have = end - used;
    }
  } finally {
    closeSync(fd);
  }
}

/** Files of at least this many bytes are scanned in pieces when readRecordFile is given a helper thread. */
export const PIECES_FROM = 4 * 1024 * 1024;
/** ... and at most this many: the pieces need the whole file in memory (larger files stream in bounded memory). */
export const PIECES_UP_TO = 256 * 1024 * 1024;
/** Bytes per piece (whole lines): small enough that the two threads finish close together. */
export const PIECE_BYTES = 1 << 20;

/** The other thread (the runner's fit helper, cli/fitThreads.ts): takes pieces of a job while this thread does. */
export interface PieceHelper {
  /** Hands the job over (returns at once; a helper not started yet takes what is left when it is). */
  post(job: PieceJob): void;
  /** Waits until ctl[1 + k] is 3 or `until` (Date.now() ms) passes; then the answers posted so far. */
  collect(job: PieceJob, k: number, until: number): PieceAnswer[];
  /** For tests: other than PIECES_FROM, PIECE_BYTES and the 10 s scanPieces waits for an answer. */
  piecesFrom?: number;
  pieceBytes?: number;
  waitMs?: number;
}

let jobs = 0;

/**
 * The two-thread form of {@link scanBytes}: reads the whole file into shared memory, cuts it after
 * the head into pieces of about PIECE_BYTES at line ends, and scans them on this thread and on the
 * `helper` at once (each takes the next free piece; pieces the helper has not answered within
 * 10 s are scanned here again). The pieces' rows are appended in file order with their lines
 * counted on, so the builder holds what {@link scanBytes} would put in it (the same numbers: the same
 * scanner reads every line). Returns undefined for files under PIECES_FROM or over PIECES_UP_TO bytes (not read this way),
 * null on any doubt (the text readers take the record, as after scanBytes).
 */
export function scanPieces(path: string, layout: Layout, opts: RecordOptions, helper: PieceHelper): RecordBuilder | null | undefined {
  const fd = openSync(path, 'r');
  let bytes: Uint8Array;
  let size: number;
  try {
    size = fstatSync(fd).size;
    if (size < (helper.piecesFrom ?? PIECES_FROM) || size > PIECES_UP_TO) return undefined;
    bytes = new Uint8Array(new SharedArrayBuffer(size + 1));
    let got = 0;
    while (got < size) {
      const r = readSync(fd, bytes, got, size - got, got);
      if (r === 0) break;
      got += r;
    }
    size = got;
  } finally {
    closeSync(fd);
  }
  const b = new RecordBuilder(layout, opts);
  const cells = b.cells;
  // The first data line's start; the head stays in piece 0 (its lines are checked as scanBytes checks them).
  let at = 0;
  for (let l = 1; l < cells.dataLine; l++) {
    const lf = bytes.indexOf(10, at);
    if (lf < 0 || lf >= size) return undefined;
    at = lf + 1;
  }
  const bounds: number[] = [0];
  const piece = Math.max(1, helper.pieceBytes ?? PIECE_BYTES);
  for (let cut = at + piece; cut < size; ) {
    const lf = bytes.indexOf(10, cut);
    if (lf < 0 || lf + 1 >= size) break;
    bounds.push(lf + 1);
    cut = lf + 1 + piece;
  }
  bounds.push(size);
  const K = bounds.length - 1;
  const job: PieceJob = { id: ++jobs, bytes, bounds: Float64Array.from(bounds), ctl: new Int32Array(new SharedArrayBuffer(4 * (K + 1))), cells };
  helper.post(job);
  const rows: (PieceRows | undefined)[] = new Array(K);
  for (;;) {
    const k = Atomics.add(job.ctl, 0, 1);
    if (k >= K) break;
    Atomics.store(job.ctl, 1 + k, 1);
    rows[k] = scanPiece(bytes, bounds[k]!, pieceEnd(job, k), cells, k === 0 ? cells.dataLine : 1);
  }
  // The helper's pieces: wait for each (a clock is fine here: this is the Node reader, not the core).
  const until = Date.now() + (helper.waitMs ?? 10_000);
  for (let k = 0; k < K; k++) {
    if (rows[k]) continue;
    for (const a of helper.collect(job, k, until)) if (a.id === job.id) rows[a.k] = a;
    rows[k] ??= scanPiece(bytes, bounds[k]!, pieceEnd(job, k), cells, k === 0 ? cells.dataLine : 1);
  }
  let total = 0;
  for (const r of rows) {
    if (!r!.ok) return null;
    total += r!.n;
  }
  if (total > MAX_ROWS) return null; // the located reader words it at its line
  b.reserve(total);
  let lineBase = 0; // lines before the piece
  for (const r of rows) {
    const p = r!;
    b.appendRows(p.xs, p.ys, p.n, p.maxA, lineBase + p.maxALine, lineBase + p.lastLine);
    lineBase += p.lines;
  }
  return b;
}

/**
 * The second fast path of {@link readRecordFile}: streams the file in CHUNK_BYTES pieces through
 * {@link RowScanner}. Returns the filled builder, or null when a line needs the located reader.
 */
async function scanFile(path: string, layout: Layout, opts: RecordOptions): Promise<RecordBuilder | null> {
  const b = new RecordBuilder(layout, opts);
  const sc = new RowScanner(b);
  const stream = createReadStream(path, { encoding: 'utf8', highWaterMark: CHUNK_BYTES });
  let carry = '';
  let first = true;
  try {
    for await (const chunk of stream as AsyncIterable<string>) {
      let t = carry + chunk;
      if (first && t.charCodeAt(0) === 0xfeff) t = t.slice(1);
      first = false;
      const used = sc.scan(t, false);
      if (used < 0) return null;
      carry = t.slice(used);
    }
  } finally {
    stream.destroy();
  }
  return sc.scan(carry, true) === carry.length ? b : null;
}
