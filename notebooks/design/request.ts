// The route designer's search input: the specification with the two slider overrides. Shared by the
// page (synchronous path) and the worker, so both run exactly the same search.
import type { DesignResult } from '../../src/core/index.js';
import type { LoadedDesignSpec } from '../../src/plan/designSpec.js';

/** A search request posted to the worker: the specification text, not the parsed specification. */
export interface DesignRequest { id: number; text: string; file: string; pass: number; margin: number }
export type DesignAnswer = { id: number; result?: DesignResult; error?: { message: string } };

/** The core's design input: the file's specification with the pass limit and (if it has one) the ductility margin overridden. */
export function designInput(s: LoadedDesignSpec, pass: number, margin: number) {
  return { ...s.spec, maxPassReductionPct: pass, ...(s.spec.ductilityStrain !== undefined ? { ductilityMargin: margin } : {}) };
}
