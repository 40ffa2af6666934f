// Web worker: runs the scatter Monte Carlo off the page's thread (the same core function the runner
// uses), so dragging the slider never freezes the page.
import { InputError, runScatter, type ScatterProblem } from '../../src/core/index.js';

self.onmessage = (e: MessageEvent<{ id: number; problem: ScatterProblem }>) => {
  const { id, problem } = e.data;
  try {
    const summary = runScatter(problem);
    (self as unknown as Worker).postMessage({ id, summary });
  } catch (err) {
    const x = err as Error;
    (self as unknown as Worker).postMessage({ id, error: x instanceof InputError ? { path: x.path, value: x.value, allowed: x.allowed, message: x.message } : { message: x.message } });
  }
};
