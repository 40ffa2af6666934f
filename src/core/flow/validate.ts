import { checkRange, InputError } from '../errors.js';
import { LAW_PARAMETERS } from './params.js';
import type { LawName } from './types.js';

/**
 * Checks every parameter of a law against {@link LAW_PARAMETERS}; errors name `path.param`, the
 * value and the allowed range. Returns a plain record of the checked numbers.
 */
export function validateParams(law: LawName, spec: Record<string, unknown>, path: string): Record<string, number> {
  const out: Record<string, number> = Object.create(null);
  for (const info of LAW_PARAMETERS[law]) {
    out[info.name] = checkRange(`${path}.${info.name}`, spec[info.name], info.lo, info.hi, { loOpen: info.loOpen, hiOpen: info.hiOpen });
  }
  return out;
}

export function requireBelow(path: string, value: number, limit: number, what: string): void {
  if (!(value < limit)) throw new InputError(path, value, `a number below ${what} (${limit})`);
}
