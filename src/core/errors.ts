/**
 * Errors raised by the core. One written rule for degenerate input, applied everywhere:
 * - a value outside its allowed range is an {@link InputError} naming the field path, the value and
 *   the allowed range (the plan layer adds the file, line and column);
 * - a number that cannot be computed is a {@link ComputationError}; no NaN or Infinity leaves the core.
 */
export class InputError extends Error {
  override readonly name = 'InputError';
  /** Dotted field path inside the input, e.g. `steps[2].thickness`. */
  readonly path: string;
  /** The offending value, as given. */
  readonly value: unknown;
  /** What is allowed, in words, e.g. `a number in (0, 1]`. */
  readonly allowed: string;
  constructor(path: string, value: unknown, allowed: string, detail?: string) {
    super(`${path}: ${detail ? detail + '; ' : ''}got ${formatValue(value)}, allowed ${allowed}`);
    this.path = path;
    this.value = value;
    this.allowed = allowed;
  }
}

/** A result that could not be computed (non-finite, solver failure). Never a silent NaN. */
export class ComputationError extends Error {
  override readonly name = 'ComputationError';
  readonly path: string;
  constructor(path: string, message: string) {
    super(`${path}: ${message}`);
    this.path = path;
  }
}

export function formatValue(value: unknown): string {
  if (typeof value === 'string') return JSON.stringify(value.length > 60 ? value.slice(0, 57) + '...' : value);
  if (typeof value === 'number') return Number.isNaN(value) ? 'NaN' : String(value);
  if (value === undefined) return 'nothing';
  try {
    const s = JSON.stringify(value);
    return s === undefined ? String(value) : s.length > 60 ? s.slice(0, 57) + '...' : s;
  } catch {
    return String(value);
  }
}

/** Throws a {@link ComputationError} unless `x` is finite; returns `x`. */
export function finite(x: number, path: string): number {
  if (!Number.isFinite(x)) throw new ComputationError(path, `result is not a finite number (${x})`);
  return x;
}

/** Checks a parameter: finite and inside [lo, hi] (open ends when the flags say so). */
export function checkRange(
  path: string,
  value: unknown,
  lo: number,
  hi: number,
  opts: { loOpen?: boolean; hiOpen?: boolean } = {},
): number {
  const loOpen = opts.loOpen ?? false;
  const hiOpen = opts.hiOpen ?? false;
  if (typeof value === 'number' && (loOpen ? value > lo : value >= lo) && (hiOpen ? value < hi : value <= hi)) return value;
  // NaN fails every comparison above, so it lands here too. The message is built only on failure.
  const allowed = `a number in ${loOpen ? '(' : '['}${fmtBound(lo)}, ${fmtBound(hi)}${hiOpen ? ')' : ']'}`;
  throw new InputError(path, value, allowed);
}

function fmtBound(x: number): string {
  if (x === Infinity) return '∞';
  if (x === -Infinity) return '-∞';
  return String(x);
}
