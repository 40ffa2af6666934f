// Ledger evaluations per second: a 10-step route (rolls, an anneal, more rolls) on one core.
// Run: npm run build && node bench/ledger.mjs
import { evaluateRoute, hollomon, voce } from '../dist/core/index.js';

const steps = [
  { kind: 'roll', reductionPct: 15 }, { kind: 'roll', reductionPct: 15 }, { kind: 'roll', reductionPct: 15 },
  { kind: 'roll', reductionPct: 15 }, { kind: 'anneal' }, { kind: 'roll', reductionPct: 20 },
  { kind: 'roll', reductionPct: 20 }, { kind: 'roll', thickness: 0.9 }, { kind: 'stretch', strain: 0.02 }, { kind: 'roll', reductionPct: 5 },
];
const targets = { minYield: 300, maxYield: 600, minRemainingElongationPct: 1 };

function bench(name, material) {
  const input = { material, start: { thickness: 3, width: 50 }, steps, targets };
  for (let i = 0; i < 20000; i++) evaluateRoute(input); // warm-up
  let routes = 0;
  const t0 = performance.now();
  let t = t0;
  while (t - t0 < 2000) {
    for (let i = 0; i < 5000; i++) evaluateRoute(input);
    routes += 5000;
    t = performance.now();
  }
  const perSec = (routes * steps.length) / ((t - t0) / 1000);
  console.log(`${name.padEnd(10)} ${(perSec / 1e6).toFixed(2)} million step evaluations/s (${routes} routes of ${steps.length} steps in ${((t - t0) / 1000).toFixed(2)} s)`);
  return perSec;
}

const E = 115000;
bench('hollomon', { name: 'cu', elasticModulus: E, poissonRatio: 0.3, law: hollomon({ K: 530, n: 0.44 }) });
bench('voce', { name: 'v', elasticModulus: E, poissonRatio: 0.3, law: voce({ sigma0: 200, Q: 180, b: 9 }) });
