/**
 * Worker-thread entry for scatter sampling (started by src/cli/scatter-workers.ts). Receives the
 * plain ScatterProblem as workerData, then block indices; answers each with the sampled block
 * (typed arrays transferred, not copied) or with the error that stopped it.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { InputError } from '../core/errors.js';
import { prepareScatter, type ScatterProblem } from '../core/scatter/problem.js';
import { sampleScatterBlock } from '../core/scatter/sample.js';

const port = parentPort!;
const prep = prepareScatter(workerData as ScatterProblem);
port.on('message', (index: number) => {
  try {
    const b = sampleScatterBlock(prep, index);
    port.postMessage({ block: b }, [b.inputs.buffer, b.reloadYield.buffer, b.tensileStrength.buffer, b.remainingElongationPct.buffer, b.metMask.buffer] as ArrayBuffer[]);
  } catch (e) {
    const err = e as Error;
    port.postMessage({ error: err instanceof InputError
      ? { kind: 'input', path: err.path, value: err.value, allowed: err.allowed, message: err.message }
      : { kind: 'other', message: err.message } });
  }
});
