import { expect } from 'vitest';

/** |actual − expected| ≤ relTol·|expected|, with a message naming both numbers. */
export function expectRelClose(actual: number, expected: number, relTol: number, what = ''): void {
  const err = Math.abs(actual - expected);
  const bound = relTol * Math.abs(expected);
  expect(Number.isFinite(actual), `${what} is finite`).toBe(true);
  expect(err <= bound, `${what}: ${actual} vs ${expected}, relative error ${(err / Math.abs(expected)).toExponential(2)} > ${relTol}`).toBe(true);
}

/** |actual − expected| ≤ absTol. */
export function expectAbsClose(actual: number, expected: number, absTol: number, what = ''): void {
  const err = Math.abs(actual - expected);
  expect(Number.isFinite(actual), `${what} is finite`).toBe(true);
  expect(err <= absTol, `${what}: ${actual} vs ${expected}, error ${err.toExponential(2)} > ${absTol}`).toBe(true);
}

/** Central-difference derivative, for checking slopes and works against stresses. */
export function derivative(f: (x: number) => number, x: number, h = 1e-6): number {
  return (f(x + h) - f(x - h)) / (2 * h);
}

/** A field path into parsed JSON: keys and list indices. */
export type Path = (string | number)[];

/** Every path in a JSON-like value, the root ([]) first, depth first. */
export function paths(x: unknown, at: Path = [], out: Path[] = []): Path[] {
  out.push(at);
  if (Array.isArray(x)) x.forEach((v, i) => paths(v, [...at, i], out));
  else if (x !== null && typeof x === 'object') for (const [k, v] of Object.entries(x)) paths(v, [...at, k], out);
  return out;
}

/** Every point of an SVG path's d attribute (Plot writes M/L/H/V with absolute coordinates). */
export function pathPoints(d: string): [number, number][] {
  const pts: [number, number][] = [];
  let x = 0, y = 0;
  for (const m of d.matchAll(/([MLHV])([^MLHVZ]*)/g)) {
    const n = m[2]!.split(/[ ,]+/).filter(Boolean).map(Number);
    if (m[1] === 'H') x = n[0]!;
    else if (m[1] === 'V') y = n[0]!;
    else { x = n[0]!; y = n[1]!; }
    pts.push([x, y]);
  }
  return pts;
}
