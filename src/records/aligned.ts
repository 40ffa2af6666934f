import { isNumberToken } from './layout.js';

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
    const f = t.split(/[ \t]+/);
    if (f.length < 2 || !(f.every((x) => isNumberToken(x, false)) || f.every((x) => isNumberToken(x, true)))) continue;
    if (k && f.length !== k) return 0;
    k = f.length;
    if (++seen >= 3) return k;
  }
  return 0;
}

/**
 * The text of a space-aligned export ({@link spaceAligned}, `k` columns) with its columns separated by tabs, line
 * for line (line numbers stay those of the file): a line of numbers is split at every run of spaces; a header or
 * units line at runs of two or more spaces (names such as `Stress (MPa)` hold one), or at every run where that gives
 * exactly `k` fields (`Strain Stress`); a line with ":" or "=" (a metadata line, `Gauge length: 50 mm`) is kept.
 * @example spacesToTabs('Strain  Stress\n 0.1   20.5\n', 2) // 'Strain\tStress\n0.1\t20.5\n'
 */
export function spacesToTabs(text: string, k: number): string {
  return text.replace(/[^\r\n]+/g, (line) => {
    const t = line.trim();
    if (t === '') return t;
    const f = t.split(/[ \t]+/);
    if (f.length >= 2 && (f.every((x) => isNumberToken(x, false)) || f.every((x) => isNumberToken(x, true)))) return f.join('\t');
    if (/[:=]/.test(t)) return t;
    const wide = t.split(/ {2,}|\t/);
    if (wide.length > 1) return wide.join('\t');
    return f.length === k ? f.join('\t') : t;
  });
}
