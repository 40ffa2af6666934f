import { ComputationError, InputError } from '../core/errors.js';
import { PlanError } from '../plan/problems.js';

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
