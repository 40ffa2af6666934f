import { PlanError } from '../plan/problems.js';

/** One `--set PATH=VALUE`: a field path (`steps[-1]` counts from the end) and its new value. */
export interface Override {
  text: string;
  path: (string | number)[];
  value: unknown;
}

/** A `--sweep PATH=FROM:TO:STEP`: the path and the values it takes, FROM to TO inclusive. */
export interface Sweep {
  text: string;
  path: (string | number)[];
  from: number;
  to: number;
  step: number;
  values: number[];
}

/** Most values one sweep may take. */
export const MAX_SWEEP_VALUES = 10_001;

const cli = (flag: string, message: string) => new PlanError([{ file: '(command line)', path: flag, message }]);

/** `steps[-1].reductionPct` → `['steps', -1, 'reductionPct']`; rejects anything else. */
export function parseFieldPath(s: string, flag: string): (string | number)[] {
  if (!/^[A-Za-z_][\w]*(\.[A-Za-z_][\w]*|\[-?\d+\])*$/.test(s)) {
    throw cli(flag, `got path ${JSON.stringify(s)}, allowed a field path such as steps[4].reductionPct or targets.minYield (index -1 is the last item)`);
  }
  const out: (string | number)[] = [];
  for (const m of s.matchAll(/([A-Za-z_]\w*)|\[(-?\d+)\]/g)) out.push(m[2] !== undefined ? Number(m[2]) : m[1]!);
  return out;
}

/** `PATH=VALUE`; VALUE is read as JSON when it parses (30, true, "x", {...}), else as a plain string. */
export function parseSet(arg: string): Override {
  const eq = arg.indexOf('=');
  if (eq <= 0) throw cli('--set', `got ${JSON.stringify(arg)}, allowed PATH=VALUE, e.g. steps[4].reductionPct=30`);
  const raw = arg.slice(eq + 1);
  let value: unknown = raw;
  try {
    value = JSON.parse(raw);
  } catch {
    /* a plain string */
  }
  return { text: arg, path: parseFieldPath(arg.slice(0, eq), '--set'), value };
}

/** `PATH=FROM:TO:STEP` → the values FROM, FROM+STEP, … up to TO (inclusive within 1e-9 of a step). */
export function parseSweep(arg: string): Sweep {
  const eq = arg.indexOf('=');
  const m = eq > 0 ? /^([-+]?[\d.]+(?:e[-+]?\d+)?):([-+]?[\d.]+(?:e[-+]?\d+)?):([-+]?[\d.]+(?:e[-+]?\d+)?)$/i.exec(arg.slice(eq + 1)) : null;
  if (!m) throw cli('--sweep', `got ${JSON.stringify(arg)}, allowed PATH=FROM:TO:STEP with numbers, e.g. steps[-1].reductionPct=10:40:5`);
  const [from, to, step] = [Number(m[1]), Number(m[2]), Number(m[3])];
  if (![from, to, step].every(Number.isFinite)) throw cli('--sweep', `got ${JSON.stringify(arg)}, allowed finite numbers FROM:TO:STEP`);
  if (step <= 0) throw cli('--sweep', `got STEP ${step}, allowed a number > 0`);
  if (to < from) throw cli('--sweep', `got FROM ${from} > TO ${to}, allowed FROM ≤ TO`);
  const n = Math.floor((to - from) / step + 1e-9) + 1;
  if (n > MAX_SWEEP_VALUES) throw cli('--sweep', `got ${n} values, allowed at most ${MAX_SWEEP_VALUES}`);
  // Rounded to 12 significant digits so that 0.1 steps read 0.3, not 0.30000000000000004.
  const values = Array.from({ length: n }, (_, i) => +(from + i * step).toPrecision(12));
  return { text: arg, path: parseFieldPath(arg.slice(0, eq), '--sweep'), from, to, step, values };
}

/** Path with negative indexes resolved against the data, for messages and the report. */
export function showPath(path: readonly (string | number)[]): string {
  let out = '';
  for (const k of path) out += typeof k === 'number' ? `[${k}]` : out ? `.${k}` : k;
  return out;
}

/**
 * Sets one field in parsed plan data (in place). Missing objects on the way are created; an array
 * index must exist (negative counts from the end). The new value is validated with the rest of
 * the plan afterwards, so a wrong value is reported like any field of the file.
 * @returns the path with negative indexes resolved.
 * @throws PlanError naming the flag, the path and what exists there.
 */
export function applyOverride(data: unknown, path: readonly (string | number)[], value: unknown, flag: string, file: string): (string | number)[] {
  if (data === null || typeof data !== 'object' || Array.isArray(data)) throw new PlanError([{ file, path: '', message: `the plan is not an object, so ${flag} cannot be applied` }]);
  let node: unknown = data;
  const done: (string | number)[] = [];
  for (let i = 0; i < path.length; i++) {
    const key = path[i]!;
    const last = i === path.length - 1;
    if (typeof key === 'number') {
      if (!Array.isArray(node)) throw cli(flag, `${showPath(done)} is not a list in ${file}, so [${key}] does not apply`);
      const idx = key < 0 ? node.length + key : key;
      if (idx < 0 || idx >= node.length) throw cli(flag, `got index ${key} in ${showPath([...done, key])}, allowed ${node.length === 0 ? 'none (the list is empty)' : `0 to ${node.length - 1} (or -1 to -${node.length})`}`);
      done.push(idx);
      if (last) node[idx] = value;
      else node = node[idx];
    } else {
      if (node === null || typeof node !== 'object' || Array.isArray(node)) throw cli(flag, `${showPath(done) || 'the plan'} is not an object in ${file}, so .${key} does not apply`);
      const obj = node as Record<string, unknown>;
      done.push(key);
      if (last) obj[key] = value;
      else {
        if (obj[key] === undefined) obj[key] = typeof path[i + 1] === 'number' ? [] : {};
        node = obj[key];
      }
    }
  }
  return done;
}
