import { recordError } from './errors.js';
import { CLOCK, detectLayout, headLines, isNumberToken, type Layout } from './layout.js';

/** A line of numbers (at least two), with clock times or time stamps among them, separated by runs of spaces: its fields, else null. */
function numberFields(t: string): string[] | null {
  // A time stamp's date and time are one field ("2026-03-01 10:15:02", "01.03.2026 10:15:02").
  const f = t.replace(/(\d{4}-\d{2}-\d{2}|\d{1,2}[./]\d{1,2}[./]\d{2,4}) (?=\d{1,3}:\d{2})/g, '$1\u0000').replace(/(\d) (AM|PM)\b/gi, '$1\u0000$2').split(/[ \t]+/).map((x) => x.replace(/\u0000/g, ' '));
  if (f.length < 2) return null;
  for (const dc of [false, true]) {
    let nums = 0;
    if (f.every((x) => (isNumberToken(x, dc) ? ++nums : CLOCK.test(x))) && nums >= 2) return f;
  }
  return null;
}

/**
 * Columns aligned by runs of spaces (a fixed-width text export, `   0.0125     205.31`, as older testing machines and
 * data loggers write them; common practice): the number of columns when at least three lines of the head are two or
 * more numbers separated by spaces, all with the same count, else 0. Asked only after no comma, semicolon or tab
 * layout was found.
 * @example spaceAligned(['Strain(%)  Stress(MPa)', ' 0.00  0.0', ' 0.05  10.3', ' 0.10  20.5']) // 2
 */
export function spaceAligned(lines: readonly string[]): number {
  let k = 0, seen = 0;
  for (const line of lines) {
    const t = line.trim();
    if (t === '') continue;
    const f = numberFields(t);
    if (!f) continue;
    if (k && f.length !== k) return 0;
    k = f.length;
    if (++seen >= 3) return k;
  }
  return 0;
}

/**
 * The text of a space-aligned export ({@link spaceAligned}, `k` columns) with its columns separated by tabs, line
 * for line (line numbers stay those of the file): a line of numbers (with clock times or time stamps among them, a
 * stamp's date and time kept together) is split at every run of spaces; a header or
 * units line at runs of two or more spaces (names such as `Stress (MPa)` hold one), or at every run where that gives
 * exactly `k` fields (`Strain Stress`); a line with ":" or "=" (a metadata line, `Gauge length: 50 mm`) is kept.
 * @example spacesToTabs('Strain  Stress\n 0.1   20.5\n', 2) // 'Strain\tStress\n0.1\t20.5\n'
 */
export function spacesToTabs(text: string, k: number): string {
  return text.replace(/[^\r\n]+/g, (line) => {
    const t = line.trim();
    if (t === '') return t;
    const nf = numberFields(t);
    if (nf) return nf.join('\t');
    if (/[:=]/.test(t)) return t;
    const f = t.split(/[ \t]+/);
    const wide = t.split(/ {2,}|\t/);
    if (wide.length > 1) return wide.join('\t');
    return f.length === k ? f.join('\t') : t;
  });
}

/**
 * The layout of a record's text ({@link detectLayout}) and the text it holds for: the text itself, or for columns
 * aligned by spaces (no comma, semicolon or tab layout, {@link spaceAligned}) the text with tabs between its columns.
 * An explicit `delimiter` option is never second-guessed.
 * @throws PlanError as detectLayout (the error for the text as it is, when it is not space-aligned either).
 * @example layoutOf('Strain  Stress\n 0 0\n 0.1 20\n 0.2 40\n', 'a.txt').layout.delimiter // '\t'
 */
export function layoutOf(text: string, file: string, opts: { delimiter?: Layout['delimiter'] | ' ' | undefined; decimal?: '.' | ',' | undefined } = {}): { layout: Layout; text: string } {
  const head = headLines(text);
  // Asked for columns aligned by spaces (`--delimiter space`): read as such, or say why not.
  if (opts.delimiter === ' ') {
    const k = spaceAligned(head);
    if (!k) throw recordError(file, 1, 1, 'delimiter', 'columns aligned by spaces were asked for, but no three lines of the first ones hold the same number (two or more) of numbers separated by spaces; check the file, or leave the separator to be detected');
    const tabbed = spacesToTabs(text, k);
    return { layout: detectLayout(headLines(tabbed), file, { ...opts, delimiter: '\t' }), text: tabbed };
  }
  const sep = opts.delimiter;
  try {
    return { layout: detectLayout(head, file, { ...opts, delimiter: sep }), text };
  } catch (e) {
    const k = sep ? 0 : spaceAligned(head);
    if (!k) throw e;
    const tabbed = spacesToTabs(text, k);
    return { layout: detectLayout(headLines(tabbed), file, { ...opts, delimiter: sep }), text: tabbed };
  }
}
