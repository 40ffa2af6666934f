// Scatter Monte Carlo: one million samples through a 10-step route (rolls, a partial anneal, more
// rolls), law K and n correlated and the start thickness scattering; wall time on the calling
// thread, on one worker thread and on two worker threads, measured side by side in one run, and
// whether the three summaries are identical. Aim (issue 8): under 2 s with two threads on 2 cores.
// Run: npm run build && node bench/scatter.mjs [samples]
import { availableParallelism, loadavg } from 'node:os';
const LOAD = loadavg().map((x) => x.toFixed(2)).join(', ');
import { sampleScatterThreads } from '../dist/cli/scatter-workers.js';

const samples = Number(process.argv[2] ?? 1_000_000);
const steps = [
  { kind: 'roll', reductionPct: 12 }, { kind: 'roll', reductionPct: 12 }, { kind: 'roll', reductionPct: 12 },
  { kind: 'roll', reductionPct: 12 }, { kind: 'anneal', softeningFraction: 0.7 }, { kind: 'roll', reductionPct: 10 },
  { kind: 'roll', reductionPct: 10 }, { kind: 'roll', thickness: 1.3 }, { kind: 'roll', reductionPct: 5 }, { kind: 'roll', reductionPct: 5 },
];
// INVENTED demo numbers around Callister's annealed-copper law (K 530 MPa, n 0.44).
const problem = {
  material: { name: 'copper, annealed', elasticModulus: 115000, poissonRatio: 0.3, flowCurve: { law: 'hollomon', K: 530, n: 0.44 } },
  start: { thickness: 3.0, width: 50 }, steps, targets: { minYield: 385, maxYield: 430 },
  inputs: [{ name: 'K', mean: 530, sd: 21.2 }, { name: 'n', mean: 0.44, sd: 0.0264 }, { name: 'start.thickness', mean: 3.0, sd: 0.03 }],
  correlation: [[1, -0.5, 0], [-0.5, 1, 0], [0, 0, 1]],
  samples, seed: 1, coverage: 0.9, confidence: 0.95,
};

const strip = ({ sorted, ...rest }) => JSON.stringify(rest);
// Two cases: law parameters only (the step effects are computed once), and law plus start size
// (every sample carries its own size through the ten steps).
const lawOnly = { ...problem, inputs: problem.inputs.slice(0, 2), correlation: [[1, -0.5], [-0.5, 1]] };
let allSame = true;
for (const [name, prob] of [['K, n', lawOnly], ['K, n, start thickness', problem]]) {
  await sampleScatterThreads({ ...prob, samples: 50_000 }, 0); // warm-up of the calling thread's JIT
  console.log(`inputs ${name}: ${samples} samples, 10 steps`);
  const results = [];
  for (const threads of [0, 1, 2]) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    const s = await sampleScatterThreads(prob, threads);
    const ms = performance.now() - t0;
    const cpu = process.cpuUsage(c0);
    results.push({ threads, ms, s });
    // CPU time of all threads of this process: on a busy machine wall time overstates the cost.
    console.log(`  ${threads === 0 ? 'calling thread  ' : `${threads} worker thread${threads > 1 ? 's' : ' '}`}  wall ${(ms / 1000).toFixed(2)} s  cpu ${((cpu.user + cpu.system) / 1e6).toFixed(2)} s  P(all met) ${s.probabilityAllTargetsMet.toFixed(4)}`);
  }
  const same = results.every((r) => strip(r.s) === strip(results[0].s));
  allSame &&= same;
  console.log(`  summaries identical for 0, 1 and 2 threads: ${same}; wall ratio 1 thread / 2 threads: ${(results[1].ms / results[2].ms).toFixed(2)}`);
}
console.log(`load average before: ${LOAD}; cores available: ${availableParallelism()}; node ${process.version}; ${new Date().toISOString()}`);
if (!allSame) process.exit(1);
