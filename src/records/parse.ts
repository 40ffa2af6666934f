import { parse } from 'csv-parse/browser/esm/sync';
import { RecordBuilder, type RecordOptions, type TensileRecord } from './builder.js';
import { recordError } from './errors.js';
import { layoutOf } from './aligned.js';
import { RowScanner } from './scan.js';

/**
 * Rejects what is not text: NUL bytes, other control characters (except tab, CR, LF), or U+FFFD
 * replacement characters from invalid UTF-8. Names the line and column of the first such character.
 */
export function checkText(text: string, file: string): void {
  const m = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFD]/.exec(text);
  if (!m) return;
  const before = text.slice(0, m.index);
  const line = before.split(/\r\n|\n|\r/).length;
  const col = m.index - Math.max(before.lastIndexOf('\n'), before.lastIndexOf('\r'));
  const code = m[0].charCodeAt(0).toString(16).toUpperCase().padStart(4, '0');
  throw recordError(file, line, col, '', `binary content (character U+${code}); expected a text export (CSV or tab-separated) in UTF-8`);
}

export { headLines } from './layout.js';

/** Maps a csv-parse error to a located record error. */
export function csvProblem(e: unknown, file: string): Error {
  const err = e as { code?: string; lines?: number; message?: string; column?: number };
  if (typeof err?.code === 'string' && err.code.startsWith('CSV_')) {
    const what = err.code === 'CSV_QUOTE_NOT_CLOSED' ? 'a quoted field is not closed; expected a closing double quote'
      : err.code === 'CSV_INVALID_CLOSING_QUOTE' ? 'a quote inside a field is not followed by a delimiter; expected "" for a literal quote'
        : (err.message ?? err.code);
    return recordError(file, err.lines, undefined, '', `broken CSV: ${what}`);
  }
  return e as Error;
}

/**
 * Reads a tensile record from the text of a lab export, in the browser or in Node (pure: no I/O).
 * Handles comma, semicolon or tab separators; decimal point or comma; UTF-8 with or without BOM;
 * CRLF or LF; key/value metadata lines before the header; an optional units row; columns found by
 * name (`Stress [MPa]`, `stress_MPa`, `Strain (%)`, force, extension, ...) or mapped explicitly;
 * units MPa, N/mm², MN/m², GPa, kPa, Pa, kN/cm², ksi, psi (lbf/in²), kgf/mm²; N, kN, lbf, kip, kgf; mm, in; strain fraction, % or µε. CSV cells are split by
 * a fast scanner ({@link RowScanner}) when the rows are plain, else by csv-parse (RFC 4180 quoting)
 * with line information; cells are converted as they are read, so memory is 16 bytes a row.
 * @throws PlanError naming the file, line, column and what was expected for any malformed input.
 * @example parseRecordText('strain,stress [MPa]\n0,0\n...', { file: 'a.csv' }).stress
 */
export function parseRecordText(text: string, opts: RecordOptions = {}): TensileRecord {
  const file = opts.file ?? 'record';
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  if (text.trim() === '') throw recordError(file, 1, 1, '', 'empty file; expected a header line of column names and rows of numbers below it');
  checkText(text, file);
  // No comma, semicolon or tab layout: columns aligned by spaces are read as tab-separated (line numbers kept).
  const found = layoutOf(text, file, opts);
  const layout = found.layout;
  text = found.text;
  const name = file.replace(/^.*[\\/]/, '').replace(/\.[^.]*$/, '');
  // Fast path (RowScanner); any doubt, including an error from finish, goes to the located reader below.
  const fast = new RecordBuilder(layout, { ...opts, file });
  if (new RowScanner(fast).scan(text, true) === text.length) {
    try {
      return fast.finish(name);
    } catch { /* the located reader words it */ }
  }
  const b = new RecordBuilder(layout, { ...opts, file });
  try {
    parse(text, {
      delimiter: layout.delimiter,
      from_line: layout.dataLine,
      relax_column_count: true,
      skip_empty_lines: true,
      trim: true,
      info: true,
      on_record: (rec: { record: string[]; info: { lines: number } }) => {
        b.push(rec.record, rec.info.lines);
        return null;
      },
    } as unknown as Parameters<typeof parse<string[]>>[1]);
  } catch (e) {
    throw csvProblem(e, file);
  }
  return b.finish(name);
}
