import { ComputationError, InputError } from '../core/errors.js';
import { PlanError } from '../plan/problems.js';
import { sampleLine, strainUnitHint, type TensileRecord } from '../records/builder.js';

/**
 * Runs `fn`, turning the core's InputError/ComputationError about a record into a PlanError naming the file (exit 2).
 * Given the record itself, an error about one sample (`strain[i]`, `stress[i]`: a run of zero stress, a block of
 * dropped rows) also names the file line and column of that sample ({@link sampleLine}).
 */
export function withRecordLocation<T>(record: string | TensileRecord, fn: () => T): T {
  try {
    return fn();
  } catch (e) {
    if (e instanceof InputError || e instanceof ComputationError) {
      const msg = e.message.startsWith(e.path + ': ') ? e.message.slice(e.path.length + 2) : e.message;
      const file = typeof record === 'string' ? record : record.file;
      const at = typeof record === 'string' ? null : /^(strain|stress)\[(\d+)\]$/.exec(e.path);
      const line = at ? sampleLine(record as TensileRecord, Number(at[2])) : undefined;
      if (at && line !== undefined) {
        const c = (record as TensileRecord).columns;
        const col = at[1] === 'strain' ? (c.strain ?? c.extension) : (c.stress ?? c.force);
        throw new PlanError([{ file, line, ...(col ? { column: col.column } : {}), path: e.path, message: msg }]);
      }
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
