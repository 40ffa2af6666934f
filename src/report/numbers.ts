import { LAW_PARAMETERS } from '../core/flow/params.js';
import type { LawName, ParamInfo } from '../core/flow/types.js';
import { sig4 } from '../core/numeric/sig4.js';

/**
 * Numbers as an engineer writes them (issue 14): one table of displayed precision per kind of
 * quantity, one place that knows each target's unit, and law parameters that read as values
 * ("0 (at bound)", not 1.821e-18). Every human-readable format (table, Markdown, HTML, JUnit, the
 * batch summary, the sweep) and every notebook formats through here; CSV and JSON keep full precision.
 */

/** Kinds of quantity a report or notebook shows. */
export type QuantityKind = 'stress' | 'percent' | 'degrees' | 'strain' | 'ratio' | 'size' | 'recoveryPct' | 'hardness';

/**
 * Digits after the decimal point per kind, chosen for the resolution a test or gauge gives
 * (common practice): stresses to 0.1 MPa (0.01 ksi, about 0.07 MPa), elongations and %CW to 0.1 %,
 * angles to 0.01°, strains to 0.0001, ratios to 0.001, sizes to 0.001 mm or in, elastic recovery to
 * 0.001 % strain, Vickers hardness to 0.1 HV.
 */
export const DISPLAY_DIGITS = {
  stress: { MPa: 1, ksi: 2 },
  percent: 1,
  degrees: 2,
  strain: 4,
  ratio: 3,
  size: 3,
  recoveryPct: 3,
  hardness: 1,
} as const;

/** Decimals for a kind; stresses depend on the stress unit (MPa or ksi). */
export function digitsOf(kind: QuantityKind, stressUnit: string = 'MPa'): number {
  if (kind === 'stress') return stressUnit === 'ksi' ? DISPLAY_DIGITS.stress.ksi : DISPLAY_DIGITS.stress.MPa;
  return DISPLAY_DIGITS[kind];
}

/**
 * Fixed decimals given by the caller, `—` for a missing value. For a quantity of a known kind use
 * {@link formatNumber}, whose digits come from {@link DISPLAY_DIGITS}.
 * @example fixed(2.345, 1) // "2.3"
 */
export function fixed(x: number | null | undefined, digits: number): string {
  if (x === null || x === undefined) return '—';
  return x.toFixed(digits);
}

/** Fixed decimals for a kind, `—` for a missing value; `-0.0` is written `0.0`. */
export function formatNumber(x: number | null | undefined, kind: QuantityKind, stressUnit: string = 'MPa'): string {
  if (x === null || x === undefined) return '—';
  const s = x.toFixed(digitsOf(kind, stressUnit));
  return /^-0\.?0*$/.test(s) ? s.slice(1) : s;
}

/** What each target limits is measured in: a stress, a percent (elongation, reduction), degrees, or Vickers hardness. */
export type TargetUnitKind = 'stress' | 'percent' | 'degrees' | 'hardness';

const TARGET_UNIT_KIND: Readonly<Record<string, TargetUnitKind>> = {
  minYield: 'stress',
  maxYield: 'stress',
  minTensile: 'stress',
  minRemainingElongationPct: 'percent',
  maxSpringbackDeg: 'degrees',
  minHardnessHV: 'hardness',
  maxHardnessHV: 'hardness',
};

/**
 * The kind of a target's limit, predicted value and margin. A target name not listed here is a
 * programming error (a new target must say its unit): it throws rather than guess the stress unit.
 */
export function targetUnitKind(name: string, temperBasis?: string): TargetUnitKind {
  // A temper target measures what its temper system is defined by (issue 15): Rm, HV or % thickness reduction.
  if (name === 'temper') return temperBasis === 'tensileStrength' ? 'stress' : temperBasis === 'hardnessHV' ? 'hardness' : 'percent';
  const k = TARGET_UNIT_KIND[name];
  if (k === undefined) throw new Error(`targetUnitKind: no unit known for target "${name}"; add it to TARGET_UNIT_KIND in src/report/numbers.ts`);
  return k;
}

/** A target's unit as written after a number: the stress unit, `%` (`% thickness reduction` for a temper by reduction), `°` or `HV`. */
export function targetUnit(name: string, stressUnit: string, temperBasis?: string): string {
  const k = targetUnitKind(name, temperBasis);
  if (k === 'percent' && name === 'temper') return '% thickness reduction';
  return k === 'stress' ? stressUnit : k === 'percent' ? '%' : k === 'hardness' ? 'HV' : '°';
}

/**
 * A target's value (limit, predicted or margin) with its unit, at the precision of its kind:
 * `4.1 MPa`, `0.37 ksi`, `2.5 %`, `0.41°`.
 */
export function formatTargetValue(x: number, name: string, stressUnit: string, temperBasis?: string): string {
  const k = targetUnitKind(name, temperBasis);
  const u = targetUnit(name, stressUnit, temperBasis);
  return `${formatNumber(x, k, stressUnit)}${k === 'degrees' ? '' : ' '}${u}`;
}

/**
 * A law parameter as an engineer writes it: 4 significant figures without exponent noise, and a
 * value that sits on a bound of its allowed range (`LAW_PARAMETERS`) — a fit that collapsed a
 * parameter, e.g. a Swift eps0 of 1.8e-18 fitted to a Hollomon curve — as `0 (at bound)`.
 * "On a bound" means within 1e-9 of it (dimensionless) or 1e-6 of the stress unit (stresses).
 * @example formatLawParam(LAW_PARAMETERS.swift[1], 1.821e-18) // '0 (at bound)'
 */
export function formatLawParam(info: ParamInfo, value: number): string {
  const tol = info.kind === 'stress' ? 1e-6 : 1e-9;
  for (const bound of [info.lo, info.hi]) {
    if (value !== bound && Number.isFinite(bound) && Math.abs(value - bound) <= tol) return `${bound} (at bound)`;
  }
  if (value === 0) return '0';
  const a = Math.abs(value);
  // 4 significant figures; numbers from 1e-4 up to 1e6 without an exponent.
  if (a >= 1e-4 && a < 1e6) return sig4(value);
  return value.toExponential(3).replace('e+', 'e');
}

/**
 * A law in one line, `swift: K 612.3 MPa, eps0 0 (at bound), n 0.2100`, each parameter through
 * {@link formatLawParam}, stresses followed by the stress unit.
 */
export function formatLaw(law: LawName, params: Readonly<Record<string, number>>, stressUnit: string, sep = ' '): string {
  const parts = LAW_PARAMETERS[law]
    .filter((p) => params[p.name] !== undefined)
    .map((p) => `${p.name}${sep}${formatLawParam(p, params[p.name]!)}${p.kind === 'stress' ? ` ${stressUnit}` : ''}`);
  return `${law}: ${parts.join(', ')}`;
}

/**
 * A report's `material.flowCurve` object (`{ law, ...parameters }`, stresses in the report's unit) as
 * {@link formatLaw} writes it; keys that are not parameters of the law are appended as they are.
 */
export function flowCurveText(flowCurve: Readonly<Record<string, unknown>>, stressUnit: string, sep = ' '): string {
  const law = flowCurve.law;
  if (typeof law !== 'string' || !(law in LAW_PARAMETERS)) {
    return Object.entries(flowCurve).map(([k, v]) => `${k}${sep}${typeof v === 'number' ? +v.toPrecision(6) : String(v)}`).join(', ');
  }
  const known = new Set(LAW_PARAMETERS[law as LawName].map((p) => p.name));
  const params: Record<string, number> = {};
  const other: string[] = [];
  for (const [k, v] of Object.entries(flowCurve)) {
    if (k === 'law') continue;
    if (known.has(k) && typeof v === 'number') params[k] = v;
    else other.push(`${k}${sep}${typeof v === 'number' ? +v.toPrecision(6) : String(v)}`);
  }
  return [formatLaw(law as LawName, params, stressUnit, sep), ...other].join(', ');
}

/**
 * Unit of an extra numeric ledger field (beyond report v1's own) as a column header suffix, in the
 * report's unit system; `''` for a dimensionless field or one not listed here (a new field should be
 * added). Human-readable headers only: CSV headers stay the bare field names.
 */
export function extraFieldUnit(key: string, units: { system: string; stress: string; length: string }): string {
  const us = units.system === 'US';
  const table: Readonly<Record<string, string>> = {
    drawingStress: units.stress,
    reverseReloadYield: `${units.stress}, eng.`,
    kinematicReloadYield: `${units.stress}, eng.`,
    drawingForce: us ? 'lbf' : 'N',
    rollForce: us ? 'lbf' : 'N',
    rollTorque: us ? 'lbf·ft' : 'N·m',
    temperatureRise: 'K',
    maxAreaReductionPct: '%',
    springbackDeg: '°',
    finalAngleDeg: '°',
    finalRadius: units.length,
  };
  return table[key] ?? '';
}

/** A human-readable header for an extra field: `springbackDeg °`, `reverseReloadYield MPa, eng.`. */
export function extraFieldHeader(key: string, units: { system: string; stress: string; length: string }): string {
  const u = extraFieldUnit(key, units);
  return u ? `${key} (${u})` : key;
}
