/**
 * A number to four significant figures as the shortest decimal that reads back to that rounding:
 * `String(Number(x.toPrecision(4)))` (ECMAScript Number.prototype.toPrecision, then the shortest
 * round-trip decimal of the rounded value). Trailing zeros go, so 1500 reads `1500`, 0.2100 reads
 * `0.21`; outside 1e-7…1e21 the result has an exponent (`1.235e+21`). −0 reads `0`. `—` for a
 * missing value (a blank cell in a human report).
 *
 * The one formatter of this kind: the core's messages, the report writers, the charts' labels and
 * the runner all use it (a quantity with a known display precision uses `formatNumber` in
 * `report/numbers.ts` instead). Units: whatever x is in; the unit is the caller's to write.
 * Valid for any finite number; a non-finite one is written as JavaScript writes it (`NaN`).
 * @example sig4(1234.56) // "1235"
 * @example sig4(0.000123456) // "0.0001235"
 * @example sig4(undefined) // "—"
 */
export function sig4(x: number | undefined): string {
  if (x === undefined) return '—';
  return String(+x.toPrecision(4));
}
