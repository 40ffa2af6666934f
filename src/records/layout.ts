import { recordError } from './errors.js';
import { describeColumn, roleScore, ROLES } from './columns.js';
import { unitFactor } from './units.js';

export type Delimiter = ',' | ';' | '\t';
export const DELIMITERS: readonly Delimiter[] = ['\t', ';', ','];

/** The shape of a record file found from its first lines. */
export interface Layout {
  delimiter: Delimiter;
  decimalComma: boolean;
  /** 1-based line of the header, of the units row (or null), and of the first data row. */
  headerLine: number;
  unitsLine: number | null;
  dataLine: number;
  header: string[];
  units: string[] | null;
  /** Metadata key/value lines before the header (keys lower-cased, trailing ':' removed). */
  metadata: Map<string, { key: string; value: string; unit: string; line: number }>;
}

/** Lines examined to find the header: metadata blocks longer than this are not supported. */
export const MAX_HEAD_LINES = 400;

/** First `k` lines of a text (CRLF, LF or CR). */
export function headLines(text: string, k = MAX_HEAD_LINES): string[] {
  const out: string[] = [];
  let i = 0;
  while (out.length < k && i <= text.length) {
    let j = i;
    while (j < text.length && text[j] !== '\n' && text[j] !== '\r') j++;
    out.push(text.slice(i, j));
    if (j >= text.length) break;
    i = text[j] === '\r' && text[j + 1] === '\n' ? j + 2 : j + 1;
  }
  return out;
}

/** Splits one line on `d`, honouring double quotes (RFC 4180 quoting). */
export function splitLine(line: string, d: string): string[] {
  const out: string[] = [];
  let cur = '';
  let q = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i]!;
    if (q) {
      if (ch === '"') {
        if (line[i + 1] === '"') { cur += '"'; i++; } else q = false;
      } else cur += ch;
    } else if (ch === '"' && cur.trim() === '') { q = true; cur = ''; }
    else if (ch === d) { out.push(cur.trim()); cur = ''; }
    else cur += ch;
  }
  out.push(cur.trim());
  return out;
}

const NUM_DOT = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const NUM_COMMA = /^[+-]?(\d+,?\d*|,\d+)([eE][+-]?\d+)?$/;
const NONFINITE = /^[+-]?(nan|inf|infinity|-?1\.#ind|1\.#inf)$/i;

/** True for a number token (or a non-finite token such as `nan`, which the reader rejects later with its line), thousands separators allowed ({@link ungrouped}). */
export function isNumberToken(t: string, decimalComma: boolean): boolean {
  return (decimalComma ? NUM_COMMA : NUM_DOT).test(t) || NONFINITE.test(t) || ungrouped(t, decimalComma) !== null;
}

/**
 * A number written with thousands separators, as spreadsheets export a formatted column (quoted where the
 * separator is the delimiter): with a decimal point, groups of three digits after a comma ("12,345.6", the
 * fraction required: "1,205" alone could be a decimal comma); with a decimal comma, after a point ("12.345,6");
 * or after a space, no-break space or thin space with either mark, or none ("12 345,6", "12 345.6", "12 345";
 * the grouping of ISO 80000-1 §7.3.1, from memory). Null for anything else (the caller's error says what is wrong).
 * @example ungrouped('12,345.6', false) // 12345.6
 */
export function ungrouped(t: string, decimalComma: boolean): number | null {
  let m = /^([+-]?)(\d{1,3}(?:[ \u00A0\u2009\u202F]\d{3})+)(?:([.,])(\d+))?$/.exec(t);
  if (!m) m = decimalComma ? /^([+-]?)(\d{1,3}(?:\.\d{3})+)(,)(\d+)$/.exec(t) : /^([+-]?)(\d{1,3}(?:,\d{3})+)(\.)(\d+)$/.exec(t);
  if (!m) return null;
  // With a space grouping the decimal mark must be the layout's (a point in a decimal-comma file is a second grouping mark).
  if (m[3] !== undefined && /[ \u00A0\u2009\u202F]/.test(m[2]!) && m[3] !== (decimalComma ? ',' : '.')) return null;
  const v = Number(`${m[1]}${m[2]!.replace(/[^\d]/g, '')}${m[4] !== undefined ? `.${m[4]}` : ''}`);
  return Number.isFinite(v) ? v : null;
}


/** A cell of a units row: empty or a short unit such as `mm`, `kN`, `N/mm²`, `[MPa]`, `%`, `-`, `s-1`. */
function isUnitToken(t: string): boolean {
  return t.length <= 14 && !/strain|stress|force|load|time|extension|displacement|elongation/i.test(t) && /^[[(]?[A-Za-z%°µ/²³^0-9\-.·* ]*[\])]?$/.test(t);
}

/**
 * True when the three lines from nonEmpty[at] are data rows with text cells: each has the header's field count and
 * at least two numbers, the same columns hold numbers in all three, and every column holding text is one whose header
 * names no role (describeColumn/roleScore: no strain, stress, force, extension or time).
 */
function textRows(h: string[], nonEmpty: readonly { l: string }[], at: number, d: string, dc: boolean): boolean {
  let pattern = '';
  for (let r = at; r < at + 3; r++) {
    const line = nonEmpty[r];
    if (!line) return false;
    const f = splitLine(line.l, d);
    if (f.length !== h.length) return false;
    let p = '', nums = 0;
    for (let j = 0; j < f.length; j++) {
      const t = f[j]!;
      if (t === '') { p += '_'; continue; }
      if (isNumberToken(t, dc)) { p += 'n'; nums++; continue; }
      // A clock time or a time stamp (a time column as some exports write it) is never a strain or a stress.
      if (CLOCK.test(t)) { p += 't'; continue; }
      const c = describeColumn(h[j]!, j);
      if (ROLES.some((role) => roleScore(c, role, c.unit) > 0)) return false;
      p += 't';
    }
    if (nums < 2 || (pattern && p !== pattern)) return false;
    pattern = p;
  }
  return pattern.includes('t');
}

/**
 * A clock time ("00:01:23.5", "1:23,5", "10:15 AM") or a time stamp ("2026-03-01 10:15:02.125", "2026-03-01T10:15:02",
 * "01.03.2026 10:15:02", "3/1/2026 10:15:02"): exports write a time column so (common practice).
 * @example CLOCK.test('00:01:23.5') // true
 */
export const CLOCK = /^(\d{4}-\d{2}-\d{2}[ T]|\d{1,2}[./]\d{1,2}[./]\d{2,4} )?\d{1,3}:\d{2}(:\d{2})?([.,]\d+)?( ?[AP]M)?$/i;

/** True when a comma-separated line among the 50 from `from` holds a quoted cell that is a decimal-comma number and no thousands group ("0,5", "12,25", "1,2345"). */
function quotedDecimalComma(nonEmpty: readonly { l: string }[], from: number): boolean {
  for (const row of nonEmpty.slice(from, from + 50)) {
    if (!row.l.includes('"')) continue;
    if (splitLine(row.l, ',').some((t) => /^[+-]?\d*,\d+([eE][+-]?\d+)?$/.test(t) && (/^[+-]?0?,/.test(t) || !/^[+-]?\d{1,3},\d{3}$/.test(t)))) return true;
  }
  return false;
}

/**
 * The third pass of {@link detectLayout}: after the header at nonEmpty[k], exactly two rows of text only (no cell a
 * number, no wider than the header), then a row of numbers. The one made of bare units (`s;%;MPa`), else the first
 * made of unit-like tokens, is the units row; the other is passed over (channel names such as `Ch0;Ch1;Ch2`).
 */
function extraRows(h: string[], nonEmpty: readonly { l: string; i: number }[], k: number, d: string, dc: boolean): { units: string[] | null; unitsAt?: number; data: { l: string; i: number } } | null {
  let units: string[] | null = null, unitsAt: number | undefined, bare = false;
  for (let j = 1; j <= 2; j++) {
    const row = nonEmpty[k + j];
    if (!row) return null;
    const f = splitLine(row.l, d);
    if (f.length > h.length || f.every((t) => t === '') || f.some((t) => t !== '' && isNumberToken(t, dc))) return null;
    // A row of bare units (s;%;MPa) is the units row, before one that merely looks like units (Ch0;Ch1).
    const isBare = f.every((t) => t === '' || bareUnit(t));
    if (f.every(isUnitToken) && (!units || (isBare && !bare))) { units = f; unitsAt = row.i; bare = isBare; }
  }
  const data = nonEmpty[k + 3];
  if (!data) return null;
  const f = splitLine(data.l, d);
  return f.length === h.length && numericRow(f, dc) ? { units, ...(unitsAt !== undefined ? { unitsAt } : {}), data } : null;
}

/** True when a header row names a quantity in one of its columns (strain, stress, force, extension or time). */
function namesQuantity(h: readonly string[]): boolean {
  return h.some((t, j) => { const c = describeColumn(t, j); return ROLES.some((role) => roleScore(c, role, c.unit) > 0); });
}

/** A cell that is a unit alone (`MPa`, `%`, `[kN]`, `s`): a unit of stress, force, length or strain, or of time. */
function bareUnit(t: string): boolean {
  return (['stress', 'force', 'length', 'strain'] as const).some((q) => unitFactor(q, t) !== undefined && t.trim() !== '') || /^[[(]?(s|sec|ms|min|h)[\])]?$/i.test(t.trim());
}

function numericRow(f: string[], dc: boolean): boolean {
  let nums = 0;
  for (const t of f) {
    if (t === '') continue;
    if (!isNumberToken(t, dc)) return false;
    nums++;
  }
  return nums >= 2;
}

/**
 * One metadata line's key, value and unit, as lab exports write them: `Gauge length,50,mm`, `Gauge length: 50 mm`,
 * `Diameter = 5.64 mm`, `Width (mm),12.5`, `Gage Length [in]: 2.000`, `Gauge length,50 mm` (common practice of
 * testing-machine exports). A unit in brackets after the key is moved to the unit when no unit field follows the
 * value; a value and unit in one field are split. Null for a line with no key and value.
 */
export function metadataEntry(f: readonly string[]): { key: string; value: string; unit: string } | null {
  let key = (f[0] ?? '').replace(/:\s*$/, '').trim();
  let value: string, unit: string;
  if (key && f.length >= 2) { value = (f[1] ?? '').trim(); unit = (f[2] ?? '').trim(); }
  else {
    const sep = /^([^:=]*?)\s*[:=]\s*(.*)$/.exec(key);
    if (!sep || !sep[1]) return null;
    key = sep[1];
    const rest = sep[2]!.trim().split(/\s+/);
    value = rest[0] ?? '';
    unit = rest.slice(1).join(' ');
  }
  key = key.replace(/\s*[:=]\s*$/, '').trim();
  if (!unit) {
    const inValue = /^([+-]?(?:\d+[.,]?\d*|[.,]\d+)(?:[eE][+-]?\d+)?)\s*([^\d\s.,+-].*)$/.exec(value);
    if (inValue) { value = inValue[1]!; unit = inValue[2]!.trim(); }
  }
  const br = /^(.*?)\s*[[(]([^\])]*)[\])]$/.exec(key);
  if (br && br[1]) { key = br[1]; if (!unit) unit = br[2]!.trim(); }
  return key ? { key, value, unit } : null;
}

/**
 * Finds delimiter, decimal mark, header, optional units row, data start and metadata from the first
 * lines of a record. The header is the first line of ≥ 2 fields, not all numbers, followed (after an
 * optional units row of the same width) by a row of numbers; failing that, by three rows with text only in
 * columns that name no role ({@link textRows}). Tab, then semicolon, then comma are tried; decimal comma is
 * recognised with tab or semicolon.
 * @throws PlanError naming the file and line (header only, no header, one column).
 */
export function detectLayout(lines: readonly string[], file: string, opts: { delimiter?: Delimiter | undefined; decimal?: '.' | ',' | undefined } = {}): Layout {
  const head = lines.slice(0, MAX_HEAD_LINES);
  const nonEmpty = head.map((l, i) => ({ l, i })).filter((x) => x.l.trim() !== '');
  if (nonEmpty.length === 0) throw recordError(file, 1, 1, '', 'empty file; expected a header line of column names and rows of numbers below it');
  const cands = opts.delimiter ? [opts.delimiter] : DELIMITERS;
  // Two passes: data rows of numbers only; then, when none is found, rows whose text cells (a status or phase column,
  // `0.1,205.3,OK`) sit only in columns that are no strain, stress, force, extension or time, with three rows alike
  // (textRows), so that a metadata line is not taken for data.
  // A third pass, only where neither found a layout: a header that names a quantity, then two text rows (a units
  // row and a row of channel names or descriptions, either order) before the numbers (extraRows).
  for (const pass of ['strict', 'relaxed', 'extra'] as const) for (const d of cands) {
    const relaxed = pass === 'relaxed';
    for (let k = 0; k < nonEmpty.length; k++) {
      const h = splitLine(nonEmpty[k]!.l, d);
      // A header names columns: at least 2 fields, none of them a number.
      if (h.length < 2 || h.some((t) => t !== '' && isNumberToken(t, d !== ',')) || h.every((t) => t === '')) continue;
      const next = nonEmpty[k + 1];
      if (!next) continue;
      if (pass === 'extra' && !namesQuantity(h)) continue;
      // A row of bare units (s;%;MPa) under a header of the same width that names a quantity is that header's units
      // row, not a header: such a file is read by the third pass (a channel row below the units threw the first off).
      // So is a row naming no quantity (channel names Ch0;Ch1;Ch2) one or two rows under such a header.
      if (pass !== 'extra' && k > 0 && (h.every((t) => t === '' || bareUnit(t)) || !namesQuantity(h))) {
        const under = [1, 2].some((up) => {
          if (k - up < 0) return false;
          const above = splitLine(nonEmpty[k - up]!.l, d);
          return above.length === h.length && namesQuantity(above) && !above.some((t) => t !== '' && isNumberToken(t, d !== ','));
        });
        if (under) continue;
      }
      const dataRow = (f: string[], dc: boolean, at: number) => (relaxed ? textRows(h, nonEmpty, at, d, dc) : numericRow(f, dc));
      const tryDc = (dc: boolean) => {
        if (pass === 'extra') return extraRows(h, nonEmpty, k, d, dc);
        const f1 = splitLine(next.l, d);
        if (f1.length === h.length && dataRow(f1, dc, k + 1)) return { units: null as string[] | null, data: next };
        const after = nonEmpty[k + 2];
        if (f1.length <= h.length && after) {
          const f2 = splitLine(after.l, d);
          if (f2.length === h.length && dataRow(f2, dc, k + 2) && f1.every(isUnitToken)) return { units: f1, data: after };
        }
        return null;
      };
      // With commas between the fields a decimal comma can only stand inside quotes ("0,1234","205,3", as a
      // spreadsheet in a decimal-comma locale may write it): tried only where such a cell cannot be a thousands
      // group (a leading 0, or not three digits after the comma).
      const decimalOrder: boolean[] = opts.decimal ? [opts.decimal === ','] : d === ',' ? (quotedDecimalComma(nonEmpty, k + 1) ? [true, false] : [false]) : [false, true];
      for (const dc of decimalOrder) {
        const r = tryDc(dc);
        if (!r) continue;
        // Prefer decimal comma when the data use it and the delimiter allows it.
        let decimalComma = dc;
        if (!opts.decimal && d !== ',' && !dc) {
          // Look at up to 50 data rows: the first rows are often whole numbers (0;0).
          const start = nonEmpty.indexOf(r.data);
          for (const row of nonEmpty.slice(start, start + 50)) {
            if (splitLine(row.l, d).some((t) => /^[+-]?\d*,\d+([eE][+-]?\d+)?$/.test(t))) { decimalComma = true; break; }
          }
        }
        const metadata = new Map<string, { key: string; value: string; unit: string; line: number }>();
        for (let m = 0; m < k; m++) {
          const { l, i } = nonEmpty[m]!;
          const entry = metadataEntry(splitLine(l, l.includes('\t') ? '\t' : d));
          if (entry) metadata.set(entry.key.toLowerCase(), { ...entry, line: i + 1 });
        }
        return {
          delimiter: d, decimalComma,
          headerLine: nonEmpty[k]!.i + 1,
          unitsLine: r.units ? ('unitsAt' in r && r.unitsAt !== undefined ? r.unitsAt : nonEmpty[k + 1]!.i) + 1 : null,
          dataLine: r.data.i + 1,
          header: h,
          units: r.units ? h.map((_, j) => r.units![j] ?? '') : null,
          metadata,
        };
      }
    }
  }
  // Diagnose why no layout was found.
  const first = nonEmpty[0]!;
  const numericLines = nonEmpty.filter((x) => DELIMITERS.some((d) => numericRow(splitLine(x.l, d), d !== ',')));
  const textLines = nonEmpty.filter((x) => !numericLines.includes(x));
  if (numericLines.length === 0) {
    // A row whose every cell is a number with a decimal point or with a decimal comma, both kinds present
    // (0.1;204,5): the columns disagree on the decimal separator, so no convention reads the row.
    for (const x of nonEmpty) {
      for (const d of ['\t', ';'] as const) {
        const f = splitLine(x.l, d).filter((t) => t !== '');
        if (f.length < 2 || !f.every((t) => isNumberToken(t, false) || isNumberToken(t, true))) continue;
        if (f.some((t) => /^[+-]?\d*\.\d/.test(t)) && f.some((t) => /^[+-]?\d*,\d/.test(t))) {
          throw recordError(file, x.i + 1, 1, '', `mixed decimal separators in ${JSON.stringify(x.l.slice(0, 40))}: some columns use a decimal point, others a decimal comma; expected one decimal separator in every column (a decimal comma only with semicolon or tab delimiters)`);
        }
      }
    }
    const last = textLines[textLines.length - 1]!;
    const widest = Math.max(...DELIMITERS.map((d) => splitLine(last.l, d).length));
    if (widest < 2) throw recordError(file, last.i + 1, 1, '', `only one column found (${JSON.stringify(last.l.slice(0, 40))}); expected columns separated by comma, semicolon or tab`);
    // Whole numbers with thousands separators ("1,205"): a thousands separator or a decimal comma cannot be told apart.
    const grouped = textLines.find((x) => x !== last && x.i > 0 && DELIMITERS.some((d) => splitLine(x.l, d).some((t) => /^[+-]?\d{1,3}(,\d{3})+$/.test(t))));
    if (grouped) throw recordError(file, grouped.i + 1, 1, '', `${JSON.stringify(grouped.l.slice(0, 40))} holds whole numbers with a comma ("1,205"): a thousands separator or a decimal comma? expected rows of numbers; export the columns without thousands separators, or with decimals ("1,205.0")`);
    throw recordError(file, last.i + 1, 1, '', `header only: no rows of numbers after the header at line ${last.i + 1}; expected data rows such as 0.001,205.3`);
  }
  if (numericLines[0] === first) throw recordError(file, first.i + 1, 1, '', 'no header line: the file starts with numbers; expected a line of column names (e.g. strain,stress) above the data');
  const firstNum = numericLines[0]!;
  throw recordError(file, firstNum.i + 1, 1, '', 'the header and the first data row do not have the same number of columns (or a units row is malformed); expected a header line, an optional units row, then rows of numbers, all with the same number of fields');
}
