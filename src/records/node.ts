import { createReadStream, openSync, readSync, readFileSync, closeSync, fstatSync } from 'node:fs';
import { Writable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { parse } from 'csv-parse';
import { RecordBuilder, type RecordOptions, type TensileRecord } from './builder.js';
import { recordError } from './errors.js';
import { detectLayout, type Layout } from './layout.js';
import { ByteRowScanner, RowScanner } from './scan.js';
import { checkText, csvProblem, headLines, parseRecordText } from './parse.js';
import { spaceAligned } from './aligned.js';
import { isUtf8 } from 'node:buffer';
import { decodeRecord, ENCODING_NOTE, refuseWorkbook, utf16Mark } from './decode.js';

/** Bytes read to find the layout (metadata, header, units row). */
export const HEAD_BYTES = 256 * 1024;

/**
 * Reads a tensile record file as a stream, in bounded memory (Node only; the browser uses
 * {@link parseRecordText}). The first HEAD_BYTES give the layout; the rest streams through
 * csv-parse, each row converted at once into typed arrays (16 bytes a row), so a file of millions
 * of rows needs little more than its numbers. Errors as {@link parseRecordText}.
 * @throws PlanError naming file, line, column and what was expected (file not found included).
 */
export async function readRecordFile(path: string, opts: RecordOptions = {}): Promise<TensileRecord> {
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
  // Read whole and decoded by decodeRecord: a spreadsheet's UTF-16 text export (with its mark; such files come from a
  // spreadsheet, so they are of a spreadsheet's size), and a file that is not valid UTF-8 (a Windows code page).
  const whole = (): TensileRecord => {
    const { text, encoding } = decodeRecord(readFileSync(path), file);
    const rec = parseRecordText(text, { ...opts, file });
    if (encoding === 'windows-1252') rec.warnings.unshift(ENCODING_NOTE);
    return rec;
  };
  refuseWorkbook(head, file);
  if (utf16Mark(head)) return whole();
  if (!head.includes(0) && !isUtf8(got === HEAD_BYTES ? head.subarray(0, head.lastIndexOf(0x0a) + 1) : head)) return whole();
  if (head.includes(0)) {
    const at = head.indexOf(0);
    const pre = head.subarray(0, at).toString('latin1');
    throw recordError(file, pre.split('\n').length, at - pre.lastIndexOf('\n'), '', 'binary content (NUL byte); expected a text export (CSV or tab-separated) in UTF-8, or in UTF-16 with its byte-order mark');
  }
  let text = new TextDecoder('utf-8', { fatal: false }).decode(head);
  if (got === HEAD_BYTES) text = text.slice(0, Math.max(text.lastIndexOf('\n'), 0)); // whole lines only
  const bom = text.charCodeAt(0) === 0xfeff;
  if (bom) text = text.slice(1);
  if (text.trim() === '' && got < HEAD_BYTES) throw recordError(file, 1, 1, '', 'empty file; expected a header line of column names and rows of numbers below it');
  checkText(text, file);
  // Columns aligned by spaces, asked for: read whole as tab-separated (aligned.ts).
  if (opts.delimiter === ' ') return whole();
  const delimiter = opts.delimiter;
  let layout: Layout;
  try {
    layout = detectLayout(headLines(text), file, { ...opts, delimiter });
  } catch (e) {
    // Columns aligned by spaces: parseRecordText reads the whole text as tab-separated (aligned.ts).
    if (!opts.delimiter && spaceAligned(headLines(text))) return whole();
    throw e;
  }
  const name = path.replace(/^.*[\\/]/, '').replace(/\.[^.]*$/, '');
  // Fast paths: the file's bytes, else (non-ASCII text after the header) its decoded text; any doubt,
  // and any error from finish, goes to the located reader below, which words every message.
  const fast = scanBytes(path, layout, { ...opts, file }) ?? await scanFile(path, layout, { ...opts, file });
  if (fast) {
    try {
      return fast.finish(name);
    } catch { /* the located reader below words it */ }
  }
  const b = new RecordBuilder(layout, { ...opts, file });
  // Rows go straight from csv-parse's on_record into the builder (nothing is queued in the stream).
  const BIN = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFD]/;
  // Bytes that are not UTF-8 past the first HEAD_BYTES (a footer in a code page): the whole file is read again by decodeRecord.
  const NOT_UTF8 = Symbol('not UTF-8');
  const parser = parse({
    bom: true, delimiter: layout.delimiter, from_line: layout.dataLine, relax_column_count: true, skip_empty_lines: true, trim: true, info: true,
    on_record: (rec: { record: string[]; info: { lines: number } }) => {
      for (const cell of rec.record) {
        if (!BIN.test(cell)) continue;
        if (!/[\u0000-\u0008\u000B\u000C\u000E-\u001F]/.test(cell)) throw NOT_UTF8;
        throw recordError(file, rec.info.lines, undefined, '', 'binary content; expected a text export (CSV or tab-separated) in UTF-8');
      }
      b.push(rec.record, rec.info.lines);
      return null;
    },
  } as unknown as Parameters<typeof parse>[0]);
  const sink = new Writable({ objectMode: true, write: (_c, _e, cb) => cb() });
  try {
    await pipeline(createReadStream(path), parser, sink);
  } catch (e) {
    if (e === NOT_UTF8) return whole();
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
