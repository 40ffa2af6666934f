import type { RecordBuilder } from './builder.js';

/**
 * Fast reader of the data rows of a record, for the common case: plain cells or cells each wrapped in one
 * pair of quotes (`"0.125","205.3"`, as some exports quote every field; a quoted note may hold the delimiter),
 * LF or CRLF line ends, text without control characters. It finds only the two cells the record uses in each line
 * (`indexOf` of the delimiter), converts them with the engine's number parser and passes them to
 * the builder with their line number, so a record of millions of rows makes no per-row arrays and
 * no strings for unused columns.
 *
 * It never words an error itself: whenever a line is not plainly valid (a quote inside a cell or not
 * closed on its line, a lone CR, a control character, a missing or non-numeric cell) it reports `false`, and the caller reads the
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

  private readonly a2: number;

  constructor(private readonly builder: RecordBuilder) {
    const c = builder.cells;
    this.a = c.a;
    this.a2 = c.a2;
    this.b = c.b;
    this.last = Math.max(c.a, c.b, c.a2);
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
    CONTROL.lastIndex = pos;
    if (CONTROL.test(text)) return -1;
    if (text.indexOf('\r', pos) !== -1) {
      LONE_CR.lastIndex = pos;
      if (LONE_CR.test(text)) return -1;
    }
    // The next quote, found once and again only after passing it (a search from every line to the end of a text
    // without quotes made the scan quadratic).
    let quote = text.indexOf('"', pos);
    while (pos < n) {
      let end = text.indexOf('\n', pos);
      if (end === -1) {
        if (!final) return pos;
        end = n;
      }
      const next = end + 1;
      if (end > pos && text.charCodeAt(end - 1) === 13) end--;
      if (quote !== -1 && quote < end) {
        if (!this.quotedRow(text, pos, end, d, this.line++)) return -1;
        quote = text.indexOf('"', next);
      } else if (!this.row(text, pos, end, d, this.line++)) return -1;
      pos = next;
    }
    return n;
  }

  /** One line [from, to): pushes its two numbers, skips a blank line; false when the line needs the located reader. */
  private row(text: string, from: number, to: number, d: string, line: number): boolean {
    let x = NaN, y = NaN, x2 = NaN;
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
      if (col === this.a || col === this.b || col === this.a2) {
        let v: number | null = decimal(text, start, stop, this.comma ? 44 : 46);
        if (v !== v) v = this.number(text.slice(start, stop)); // NaN: not the plain form, ask the general reader
        if (v === null) return false;
        if (col === this.a) x = v;
        if (col === this.b) y = v;
        if (col === this.a2) x2 = v;
      }
      start = stop + 1;
    }
    // Two channels averaged (RecordBuilder.push: the same arithmetic, so the same numbers as the located reader).
    if (this.a2 >= 0) { this.builder.channels(x, x2); x = 0.5 * (x + x2); }
    this.builder.pushValues(x, y, line);
    return true;
  }

  /**
   * A line with quotes: each cell either plain or one pair of quotes around the whole cell (spaces allowed outside
   * it, as csv-parse's trim takes them), which may hold delimiters; anything else (`""` inside, a quote within a
   * plain cell, a quote not closed on the line) is for the located reader. The used cells are read as plain ones.
   */
  private quotedRow(text: string, from: number, to: number, d: string, line: number): boolean {
    let x = NaN, y = NaN, x2 = NaN;
    let i = from;
    for (let col = 0; ; col++) {
      while (i < to && (text.charCodeAt(i) === 32 || text.charCodeAt(i) === 9) && text[i] !== d) i++;
      let s: number, e: number;
      if (text.charCodeAt(i) === 34) {
        s = i + 1;
        e = text.indexOf('"', s);
        if (e === -1 || e >= to) return false;
        i = e + 1;
        while (i < to && (text.charCodeAt(i) === 32 || text.charCodeAt(i) === 9) && text[i] !== d) i++;
        if (i < to && text[i] !== d) return false;
      } else {
        s = i;
        e = text.indexOf(d, i);
        if (e === -1 || e > to) e = to;
        const qq = text.indexOf('"', s);
        if (qq !== -1 && qq < e) return false;
        i = e;
      }
      if (col === this.a || col === this.b || col === this.a2) {
        let v: number | null = decimal(text, s, e, this.comma ? 44 : 46);
        if (v !== v) v = this.number(text.slice(s, e));
        if (v === null) return false;
        if (col === this.a) x = v; else if (col === this.b) y = v; else x2 = v;
      }
      if (i >= to) {
        if (col < this.last) return false; // fewer fields than needed (a blank line has no quote)
        break;
      }
      i++; // past the delimiter
    }
    if (this.a2 >= 0) { this.builder.channels(x, x2); x = 0.5 * (x + x2); }
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
/** A control character or a replacement character (one character class: fast). */
const CONTROL = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFD]/g;

/** Significant digits below which a decimal's digits form an exact integer (10¹⁵ < 2⁵³). */
const EXACT_DIGITS = 15;

/**
 * Reads the decimal number in bytes[from, to) (ASCII, no surrounding spaces) as ECMAScript's
 * `Number()` reads the same text (after a decimal comma is turned into a point), without making a
 * string: the pattern `[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?`, with `,` also accepted as the one
 * decimal mark when `comma` is true. Returns NaN when the bytes do not match that pattern, else the
 * same double as `Number(text)` (±Infinity for an overflowing exponent, which the caller refuses).
 *
 * Method: the significant digits (leading zeros skipped) form an integer m; with at most 15 of them
 * m < 10¹⁵ < 2⁵³ is exact, and for a decimal exponent |q| ≤ 22 the power 10^|q| is an exact double,
 * so the one IEEE multiplication m·10^q or division m/10^−q is correctly rounded: the double
 * `Number()` returns (W. D. Clinger, "How to read floating point numbers accurately", PLDI 1990,
 * the fast path; from memory). Longer mantissas and larger exponents fall back to `Number()` of the
 * cell's text. Checked against `Number()` on millions of random decimal strings in
 * test/records/decimal.test.ts. Units: none. Example: bytes of "-12.5e-1" → −1.25.
 */
export function readDecimal(bytes: Uint8Array, from: number, to: number, comma: boolean): number {
  // The common cell ([+-]digits[.digits], ≤ 15 significant digits) in a loop small enough for the
  // engine to inline into the row loop (a call that is not inlined boxes its double result: measured
  // 50 ns a cell); anything else goes to generalDecimal.
  let i = from;
  let neg = false;
  if (i < to) {
    const c = bytes[i]!;
    if (c === 45 || c === 43) { neg = c === 45; i++; }
  }
  let m = 0, sig = 0, scale = 0, digits = 0, point = false;
  for (; i < to; i++) {
    const c = bytes[i]!;
    if (c >= 48 && c <= 57) {
      digits++;
      if (point) scale--;
      if (m !== 0 || c !== 48) {
        if (sig === EXACT_DIGITS) return generalDecimal(bytes, from, to, comma);
        m = m * 10 + (c - 48);
        sig++;
      }
    } else if ((c === 46 || (comma && c === 44)) && !point) point = true;
    else return generalDecimal(bytes, from, to, comma);
  }
  if (digits === 0) return NaN;
  if (scale < -22) return generalDecimal(bytes, from, to, comma);
  const v = scale === 0 ? m : m / POW10[-scale]!;
  return neg ? -v : v;
}

/** {@link readDecimal} for every form of the pattern: exponents, long mantissas; NaN when it does not match. */
function generalDecimal(bytes: Uint8Array, from: number, to: number, comma: boolean): number {
  let i = from;
  let c = i < to ? bytes[i]! : 0;
  let neg = false;
  if (c === 45 || c === 43) { neg = c === 45; i++; }
  let m = 0, sig = 0, scale = 0, digits = 0, long = false, point = false;
  for (; i < to; i++) {
    c = bytes[i]!;
    const d = c - 48;
    if (d >= 0 && d <= 9) {
      digits++;
      if (point) scale--;
      if (m === 0 && d === 0) continue; // a leading zero: not significant
      if (sig < EXACT_DIGITS) { m = m * 10 + d; sig++; }
      else { long = true; if (!point) scale++; } // digits beyond 15: Number() reads them
    } else if ((c === 46 || (comma && c === 44)) && !point) point = true;
    else break;
  }
  if (digits === 0) return NaN; // "", "+", ".", "-.", "e5"
  let exp = 0;
  if (i < to) {
    if ((c | 32) !== 101) return NaN; // only an exponent may follow the digits
    i++;
    let eneg = false;
    c = i < to ? bytes[i]! : 0;
    if (c === 45 || c === 43) { eneg = c === 45; i++; }
    const e0 = i;
    for (; i < to; i++) {
      const d = bytes[i]! - 48;
      if (d < 0 || d > 9) return NaN;
      exp = exp * 10 + d;
      if (exp > 1e6) long = true; // an absurd exponent: Number() reads it (overflow, underflow)
    }
    if (i === e0) return NaN; // "1e", "1e+"
    if (eneg) exp = -exp;
  }
  if (!long && m === 0) return neg ? -0 : 0;
  const q = scale + exp;
  if (!long && q >= -22 && q <= 22) {
    const v = q >= 0 ? m * POW10[q]! : m / POW10[-q]!;
    return neg ? -v : v;
  }
  // Long mantissa or large exponent: the engine's own correctly rounded reader of the same text.
  let s = '';
  for (let k = from; k < to; k++) { const b = bytes[k]!; s += String.fromCharCode(b === 44 ? 46 : b); }
  return Number(s);
}

/**
 * The row scanner of {@link RowScanner}, reading the file's bytes (UTF-8) directly: no decoding of
 * the whole file to a string, control characters, quotes (one pair around a whole cell is read, as
 * {@link RowScanner} reads it) and lone CRs checked in the same loop that finds the cells, numbers read by {@link readDecimal}. It accepts exactly the rows {@link RowScanner}
 * accepts and gives the same numbers (test/records/scan.test.ts compares the two readers on random
 * files), with one more reason for doubt: any byte ≥ 0x80 after the header (non-ASCII text, a
 * broken UTF-8 sequence) sends the whole record to the text readers, which decode it as before.
 *
 * Hand-written for speed (bench/import.mjs, bench/RESULTS.md issue 12 E): on a 1,000,000-row record
 * it reads in about half the time of the string scanner (56 against 114 ms, side by side), which
 * spent its time on UTF-8 decoding, a control-character RegExp over the text, and `indexOf` per cell.
 */
export class ByteRowScanner {
  private line = 1;
  /**
   * Rows read but not yet handed to the builder: values and line numbers in typed columns, flushed in
   * batches. Passing two doubles per row to the builder as arguments boxed them (two heap numbers a
   * row: a young-generation collection every few milliseconds on a 1,000,000-row record).
   */
  private readonly bx = new Float64Array(BATCH);
  private readonly by = new Float64Array(BATCH);
  private readonly bl = new Float64Array(BATCH);
  private k = 0;
  /** The batch's largest |raw strain| and its line, its largest |stored stress| (see RecordBuilder.pushStored). */
  private maxA = 0;
  private maxALine = 0;
  private maxS = 0;
  /** Factors the values are stored with (RecordBuilder.cells: the unit conversion, or 1). */
  private readonly fa: number;
  private readonly fb: number;
  private readonly a: number;
  private readonly b: number;
  private readonly last: number;
  private readonly delim: number;
  private readonly comma: boolean;
  private readonly dataLine: number;

  private readonly a2: number;

  constructor(private readonly builder: RecordBuilder) {
    const c = builder.cells;
    this.a = c.a;
    this.a2 = c.a2;
    this.b = c.b;
    this.last = Math.max(c.a, c.b);
    this.delim = c.delimiter.charCodeAt(0);
    this.comma = c.decimalComma;
    this.dataLine = c.dataLine;
    this.fa = c.fa;
    this.fb = c.fb;
  }

  /**
   * Reads the complete lines of bytes[from, to) (all of them when `final`). Returns the index just
   * past the last line read (the caller keeps the rest for the next piece), or -1 when the text
   * readers must take over.
   */
  scan(bytes: Uint8Array, from: number, to: number, final: boolean): number {
    if (this.a2 >= 0) return -1; // two channels averaged: RowScanner reads them (its hot loop here stays two cells)
    if (!(to < bytes.length)) throw new RangeError(`ByteRowScanner.scan: to ${to} must be below the buffer's length ${bytes.length} (one spare byte for the end mark)`);
    const kept = bytes[to]!;
    bytes[to] = 10; // the end mark: row() stops there without a bound check
    try {
      return this.lines(bytes, from, to, final);
    } finally {
      bytes[to] = kept;
      this.flush();
    }
  }

  /** Hands the batched rows to the builder (converted as stored, with their extremes: no copy loop there). */
  private flush(): void {
    const k = this.k;
    if (k > 0) this.builder.pushStored(this.bx, this.by, this.bl, k, this.maxA, this.maxALine, this.maxS, this.bl[k - 1]!);
    this.k = 0;
    this.maxA = 0;
    this.maxALine = 0;
    this.maxS = 0;
  }

  private lines(bytes: Uint8Array, from: number, to: number, final: boolean): number {
    let pos = from;
    // Lines before the data (metadata, header, units row) were read by detectLayout: only counted here.
    while (this.line < this.dataLine) {
      let end = bytes.indexOf(10, pos);
      if (end === -1 || end >= to) {
        if (!final) return pos;
        end = to;
      }
      for (let k = pos; k < end; k++) if (bytes[k] === 13 && k + 1 < end) return -1; // a lone CR: CR line ends
      this.line++;
      pos = end + 1;
      if (pos > to) return -1; // the record ends in its head
    }
    while (pos < to) {
      const end = this.row(bytes, pos, to, final, this.line);
      // A doubt about a line cut by the end of the piece is decided when the line is whole.
      if (end === DOUBT) return !final && bytes.indexOf(10, pos) === to ? pos : -1;
      if (end === INCOMPLETE) return pos;
      this.line++;
      pos = end + 1;
    }
    return to;
  }

  /**
   * One line from `from`: pushes its two numbers (a blank line is skipped) and returns the index of
   * its LF (`to` for a last line without one), DOUBT, or INCOMPLETE when the piece ends inside the
   * line and more is to come. Each byte is looked at once (no `indexOf` per line or cell: a call
   * into the engine per line cost more than the loop): a used cell is read as a number while it is
   * scanned (the common form inline, anything else by generalDecimal), an unused cell is only
   * checked for control characters, quotes and non-ASCII bytes. bytes[to] is an LF (set by scan),
   * so the loop needs no bound check.
   */
  private row(bytes: Uint8Array, from: number, to: number, final: boolean, line: number): number {
    const d = this.delim, last = this.last, a = this.a, b = this.b, comma = this.comma;
    let i = from, col = 0, x = 0, y = 0;
    let c = bytes[i]!;
    for (;;) {
      if (col === a || col === b) {
        while ((c === 32 || c === 9) && c !== d) c = bytes[++i]!; // String.prototype.trim
        // A quoted cell ("1.5": some exports quote every field) is the same number: csv-parse's trim takes the
        // spaces around the quotes, the cell's own trim those inside. Anything else in quotes is a doubt.
        const quoted = c === 34;
        if (quoted) {
          c = bytes[++i]!;
          while ((c === 32 || c === 9) && c !== d) c = bytes[++i]!;
        }
        const s = i;
        let neg = false;
        if (c === 45 || c === 43) { neg = c === 45; c = bytes[++i]!; }
        let m = 0, sig = 0, scale = 0, digits = 0;
        // Integer digits, then the fraction's (leading zeros are not significant: m stays 0 and they are not
        // counted; past 15 significant digits m is no longer exact and generalDecimal reads the cell). Two
        // loops: no "after the point?" test per digit; the digit and fraction counts from positions, not per digit.
        const i0 = i;
        while (c >= 48 && c <= 57) {
          m = m * 10 + (c - 48);
          if (m !== 0) sig++;
          c = bytes[++i]!;
        }
        digits = i - i0;
        if (c === 46 || (comma && c === 44)) {
          c = bytes[++i]!;
          const f0 = i;
          while (c >= 48 && c <= 57) {
            m = m * 10 + (c - 48);
            if (m !== 0) sig++;
            c = bytes[++i]!;
          }
          scale = f0 - i;
          digits += i - f0;
        }
        const general = sig > EXACT_DIGITS;
        let v: number, bad: boolean;
        if (general || scale < -22 || (c !== d && c !== 32 && c !== 9 && c !== 10 && c !== 13 && !(quoted && c === 34))) {
          // An exponent, a long mantissa or something else: read the whole trimmed cell (to its closing quote).
          let e = i;
          if (quoted) {
            while (e < to && bytes[e] !== 34 && bytes[e] !== 10 && bytes[e] !== 13) e++;
            if (bytes[e] !== 34) return DOUBT; // no closing quote on this line
          } else while (e < to && bytes[e] !== d && bytes[e] !== 10 && bytes[e] !== 13) e++;
          let t = e;
          while (t > s && (bytes[t - 1] === 32 || bytes[t - 1] === 9)) t--;
          v = generalDecimal(bytes, s, t, comma);
          bad = !(v - v === 0);
          i = e;
          c = bytes[i]!;
        } else {
          // No digit is no number (bad), never NaN here: a NaN constant merged with the computed value made
          // the engine box every cell's number (two heap numbers a row, 31 young-generation collections per
          // 1,000,000 rows; measured, issue 12 G). A bad cell's value is never pushed.
          v = digits === 0 ? 0 : scale === 0 ? m : m / POW10[-scale]!;
          bad = digits === 0;
          if (neg) v = -v;
          while ((c === 32 || c === 9) && c !== d) c = bytes[++i]!;
        }
        if (quoted) {
          if (c !== 34) return DOUBT;
          c = bytes[++i]!;
          while ((c === 32 || c === 9) && c !== d) c = bytes[++i]!;
          if (c !== d && c !== 10 && c !== 13) return DOUBT; // "1"" or "1"x: csv-parse's own message
          if (bad) return DOUBT; // "" or "abc": the text readers word it
        }
        // An empty cell at the end of a short line may be a blank line: decided at the line's end.
        if (bad && !(digits === 0 && s === i && (c === 10 || c === 13) && col < last)) return DOUBT;
        if (col === a) x = v; else y = v;
      } else {
        i = skipCell(bytes, i, d);
        if (i < 0) return DOUBT;
        c = bytes[i]!;
      }
      if (c === d) {
        c = bytes[++i]!;
        if (++col > last) {
          // Cells the record does not use: only checked, as the text readers check the whole text.
          for (;;) {
            i = skipCell(bytes, i, d);
            if (i < 0) return DOUBT;
            c = bytes[i]!;
            if (c !== d) break;
            c = bytes[++i]!;
          }
        } else continue;
      }
      break;
    }
    // The line's end: LF, CRLF, a CR ending the file, or the end of the piece.
    let lf: number, content = i;
    if (i >= to) {
      if (!final) return INCOMPLETE;
      lf = to;
    } else if (c === 13) {
      if (i + 1 < to) {
        if (bytes[i + 1] !== 10) return DOUBT; // a lone CR: CR line ends, the text readers count lines
        lf = i + 1;
      } else if (!final) return INCOMPLETE;
      else lf = to;
    } else lf = i;
    if (col < last) return col === 0 && blankLine(bytes, from, content) ? lf : DOUBT; // fewer fields than needed
    const k = this.k;
    // Stored as the builder stores a row (×fa, ×fb), with the batch's extremes: the first largest |x| keeps its line.
    const sy = y * this.fb, ax = Math.abs(x);
    this.bx[k] = x * this.fa; this.by[k] = sy; this.bl[k] = line;
    if (k === 0 || ax > this.maxA) { this.maxA = ax; this.maxALine = line; }
    this.maxS = Math.max(this.maxS, Math.abs(sy));
    if ((this.k = k + 1) === BATCH) this.flush();
    return lf;
  }
}

const DOUBT = -1;
/** Rows per batch handed to the builder (see ByteRowScanner.bx). */
const BATCH = 4096;
const INCOMPLETE = -2;

/**
 * Passes over a cell the record does not use, from bytes[i]: returns the index of the delimiter or line end after
 * it, or −1 (a doubt) for a control character, DEL or non-ASCII byte, or a quote other than one pair around the
 * whole cell (spaces allowed outside it: csv-parse's trim). A quoted cell may hold delimiters; `""` inside it, a
 * line break or a cell cut by the end of the piece (its LF mark) is a doubt.
 */
function skipCell(bytes: Uint8Array, i: number, d: number): number {
  let c = bytes[i]!;
  let j = i;
  while ((c === 32 || c === 9) && c !== d) c = bytes[++j]!;
  if (c === 34) {
    c = bytes[++j]!;
    while (c !== 34) {
      if (c < 32 ? c !== 9 : c > 126) return -1;
      c = bytes[++j]!;
    }
    c = bytes[++j]!;
    while ((c === 32 || c === 9) && c !== d) c = bytes[++j]!;
    return c === d || c === 10 || c === 13 ? j : -1;
  }
  while (c !== d && c !== 10 && c !== 13) {
    if (c < 32 ? c !== 9 : c === 34 || c > 126) return -1; // control character, a quote inside, DEL, non-ASCII
    c = bytes[++j]!;
  }
  return j;
}

/** True when bytes[from, to) hold only spaces and tabs (a blank line, which the readers skip). */
function blankLine(bytes: Uint8Array, from: number, to: number): boolean {
  for (let i = from; i < to; i++) if (bytes[i] !== 32 && bytes[i] !== 9) return false;
  return true;
}
