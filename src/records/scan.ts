import type { RecordBuilder } from './builder.js';

/**
 * Fast reader of the data rows of a record, for the common case: unquoted cells, LF or CRLF line
 * ends, text without control characters. It finds only the two cells the record uses in each line
 * (`indexOf` of the delimiter), converts them with the engine's number parser and passes them to
 * the builder with their line number, so a record of millions of rows makes no per-row arrays and
 * no strings for unused columns.
 *
 * It never words an error itself: whenever a line is not plainly valid (a quote, a lone CR, a
 * control character, a missing or non-numeric cell) it reports `false`, and the caller reads the
 * record again with the located reader (csv-parse with line information), whose message names the
 * line and column exactly as before. Valid records give the same numbers either way: a cell is
 * accepted here only when it matches the located reader's number pattern
 * `^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$` (after trimming, decimal comma replaced), which for a
 * non-empty string without a 0x/0b/0o prefix is exactly when `Number(cell)` is finite.
 *
 * Hand-written rather than a library because it is measurably faster for this job: see
 * bench/import.mjs and bench/RESULTS.md (udsv 0.7.3, the fastest general CSV parser measured on
 * this machine class, beside this scanner on the same file in one run).
 */
export class RowScanner {
  private line = 1;
  private readonly a: number;
  private readonly b: number;
  private readonly last: number;
  private readonly delim: string;
  private readonly comma: boolean;
  private readonly dataLine: number;

  constructor(private readonly builder: RecordBuilder) {
    const c = builder.cells;
    this.a = c.a;
    this.b = c.b;
    this.last = Math.max(c.a, c.b);
    this.delim = c.delimiter;
    this.comma = c.decimalComma;
    this.dataLine = c.dataLine;
  }

  /**
   * Reads the complete lines of `text` (all of it when `final`). Returns the index just past the
   * last line read (the caller keeps the rest for the next chunk), or -1 when the located reader
   * must take over.
   */
  scan(text: string, final: boolean): number {
    const n = text.length;
    const d = this.delim;
    let pos = 0;
    // Lines before the data (metadata, header, units row) were read by detectLayout: only counted here.
    if (this.line < this.dataLine) {
      while (this.line < this.dataLine && pos < n) {
        const end = text.indexOf('\n', pos);
        if (end === -1) return final ? -1 : pos;
        this.line++;
        pos = end + 1;
      }
      LONE_CR.lastIndex = 0;
      const m = text.indexOf('\r') === -1 ? null : LONE_CR.exec(text);
      if (m && m.index < pos) return -1; // CR line ends: line numbers would differ
      if (this.line < this.dataLine) return final ? -1 : pos;
    }
    QUOTE_OR_CONTROL.lastIndex = pos;
    if (QUOTE_OR_CONTROL.test(text)) return -1;
    if (text.indexOf('\r', pos) !== -1) {
      LONE_CR.lastIndex = pos;
      if (LONE_CR.test(text)) return -1;
    }
    while (pos < n) {
      let end = text.indexOf('\n', pos);
      if (end === -1) {
        if (!final) return pos;
        end = n;
      }
      const next = end + 1;
      if (end > pos && text.charCodeAt(end - 1) === 13) end--;
      if (!this.row(text, pos, end, d, this.line++)) return -1;
      pos = next;
    }
    return n;
  }

  /** One line [from, to): pushes its two numbers, skips a blank line; false when the line needs the located reader. */
  private row(text: string, from: number, to: number, d: string, line: number): boolean {
    let x = NaN, y = NaN;
    let start = from;
    for (let col = 0; col <= this.last; col++) {
      let stop = text.indexOf(d, start);
      if (stop === -1 || stop > to) {
        stop = to;
        if (col < this.last) {
          // Fewer fields than needed: a blank line is skipped, anything else is for the located reader.
          return col === 0 && text.slice(from, to).trim() === '';
        }
      }
      if (col === this.a || col === this.b) {
        let v: number | null = decimal(text, start, stop, this.comma ? 44 : 46);
        if (v !== v) v = this.number(text.slice(start, stop)); // NaN: not the plain form, ask the general reader
        if (v === null) return false;
        if (col === this.a) x = v;
        if (col === this.b) y = v;
      }
      start = stop + 1;
    }
    this.builder.pushValues(x, y, line);
    return true;
  }

  private number(raw: string): number | null {
    let t = raw;
    const c0 = t.charCodeAt(0), c1 = t.charCodeAt(t.length - 1);
    if (c0 <= 32 || c1 <= 32 || c0 === 160 || c1 === 160 || c0 > 127 || c1 > 127) t = t.trim();
    if (this.comma) t = t.replace(',', '.');
    if (t === '') return null;
    if (t.charCodeAt(0) === 48 && t.length > 1) {
      const c = t.charCodeAt(1) | 32;
      if (c === 120 || c === 98 || c === 111) return null; // 0x, 0b, 0o: Number() reads them, the pattern does not
    }
    const v = +t;
    return v - v === 0 ? v : null; // finite
  }
}

/** Exact powers of ten 10⁰…10²² (every one is a double without rounding). */
const POW10 = Array.from({ length: 23 }, (_, k) => Number(`1e${k}`));

/**
 * Reads a plain decimal [+-]digits[.digits] (no exponent, no spaces, at most 15 digits) from
 * text[from, to) without making a string; NaN for anything else (the caller then uses Number()).
 * Exact: the digits form an integer m < 10¹⁵ < 2⁵³ and the fraction has k ≤ 22 digits, so m and
 * 10ᵏ are doubles without rounding and the one IEEE division m/10ᵏ is correctly rounded, the same
 * double Number() returns (W. D. Clinger, "How to read floating point numbers accurately",
 * PLDI 1990, the fast path; from memory). Checked against Number() in test/records/scan.test.ts.
 */
function decimal(text: string, from: number, to: number, point: number): number {
  let i = from;
  let neg = false;
  let c = text.charCodeAt(i);
  if (c === 45 || c === 43) { neg = c === 45; i++; }
  let m = 0, digits = 0, frac = -1;
  for (; i < to; i++) {
    c = text.charCodeAt(i);
    if (c >= 48 && c <= 57) { m = m * 10 + (c - 48); digits++; if (frac >= 0) frac++; }
    else if (c === point && frac < 0) frac = 0;
    else return NaN;
  }
  if (digits === 0 || digits > 15) return NaN;
  const v = frac > 0 ? m / POW10[frac]! : m;
  return neg ? -v : v;
}

const LONE_CR = /\r(?!\n|$)/g;
/** A quote (quoted cells may hold delimiters and line breaks) or a control character (one character class: fast). */
const QUOTE_OR_CONTROL = /["\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFD]/g;
