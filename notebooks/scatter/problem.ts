// The scatter notebook's route: the plan's scatter problem with its last forming pass replaced by a
// pass of the chosen equivalent strain (the "prestrain" slider). Pure, so the browser test can build
// the same problem in Node and compare the page with the core.
import type { ScatterProblem, Step } from '../../src/core/index.js';

/** Index of the last forming step (not an anneal), or −1. */
export function lastFormingStep(steps: readonly Step[]): number {
  for (let i = steps.length - 1; i >= 0; i--) if (steps[i]!.kind !== 'anneal') return i;
  return -1;
}

/**
 * The problem with the final forming step replaced by `{ kind: 'strain', strain }` (von Mises
 * equivalent strain of that pass); when the route ends with an anneal or has no forming step, the
 * pass is added at the end.
 */
export function withFinalPass(problem: ScatterProblem, strain: number): ScatterProblem {
  const steps = [...problem.steps];
  const i = lastFormingStep(steps);
  const pass: Step = { kind: 'strain', strain };
  if (i >= 0 && i === steps.length - 1) steps[i] = pass;
  else steps.push(pass);
  return { ...problem, steps };
}
