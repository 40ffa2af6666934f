import { ComputationError, InputError } from '../core/errors.js';
import { PlanError } from '../plan/problems.js';
import { strainUnitHint, type TensileRecord } from '../records/builder.js';

/** Runs `fn`, turning the core's InputError/ComputationError about a record into a PlanError naming the file (exit 2). */
export function withRecordLocation<T>(file: string, fn: () => T): T {
  try {
    return fn();
  } catch (e) {
    if (e instanceof InputError || e instanceof ComputationError) {
      const msg = e.message.startsWith(e.path + ': ') ? e.message.slice(e.path.length + 2) : e.message;
      throw new PlanError([{ file, path: e.path, message: msg }]);
    }
    throw e;
  }
}

/**
 * Runs `fn` (an analysis of `rec`); an impossible E (InputError on elasticModulus) from a record whose strain unit
 * was guessed gets the hint that the guess explains it ({@link strainUnitHint}).
 */
export function withStrainUnitHint<T>(rec: Pick<TensileRecord, 'strainUnitGuessed'>, fn: () => T): T {
  try {
    return fn();
  } catch (e) {
    if (e instanceof InputError && e.path === 'elasticModulus' && typeof e.value === 'number') {
      const hint = strainUnitHint(rec, e.value);
      if (hint) throw new InputError(e.path, e.value, `${e.allowed}; ${hint}`);
    }
    throw e;
  }
}
