// Side-by-side cost of the engineering reload yield (issue 14): the same 10-step route through the
// ledger of this build and of a baseline build, alternating, in one process.
// Run: npm run build && node bench/reload-yield.mjs [BASELINE_DIST_CORE_INDEX]
// Without an argument both sides are this build (a noise check). The baseline used for
// bench/RESULTS.md was the commit before issue 14 built with `npx tsc -p tsconfig.build.json` in a
// separate git worktree.
import { pathToFileURL } from 'node:url';

const mine = await import('../dist/core/index.js');
const base = process.argv[2] ? await import(pathToFileURL(process.argv[2]).href) : mine;

const steps = [
  { kind: 'roll', reductionPct: 15 }, { kind: 'roll', reductionPct: 15 }, { kind: 'roll', reductionPct: 15 },
  { kind: 'roll', reductionPct: 15 }, { kind: 'anneal', softeningFraction: 0.8 }, { kind: 'roll', reductionPct: 20 },
  { kind: 'roll', reductionPct: 20 }, { kind: 'roll', thickness: 0.9 }, { kind: 'stretch', strain: 0.02 }, { kind: 'roll', reductionPct: 5 },
];
const targets = { minYield: 300, maxYield: 600, minTensile: 320, minRemainingElongationPct: 1 };
const specs = { hollomon: { law: 'hollomon', K: 530, n: 0.44 }, ludwik: { law: 'ludwik', sigma0: 80, K: 500, n: 0.5 }, hockettSherby: { law: 'hockettSherby', sigma0: 100, sigmaSat: 600, a: 3, p: 0.8 } };

function rate(lib, spec, ms) {
  const input = { material: { name: 'm', elasticModulus: 115000, poissonRatio: 0.3, law: lib.makeLaw(spec) }, start: { thickness: 3, width: 50 }, steps, targets };
  let routes = 0;
  const t0 = performance.now();
  let t = t0;
  while (t - t0 < ms) {
    for (let i = 0; i < 1000; i++) lib.evaluateRoute(input);
    routes += 1000;
    t = performance.now();
  }
  return (routes * steps.length) / ((t - t0) / 1000);
}

for (const [name, spec] of Object.entries(specs)) {
  rate(mine, spec, 300); rate(base, spec, 300); // warm-up
  const a = [], b = [];
  for (let r = 0; r < 5; r++) { a.push(rate(base, spec, 400)); b.push(rate(mine, spec, 400)); }
  const med = (x) => x.sort((p, q) => p - q)[2];
  console.log(`${name.padEnd(14)} baseline ${(med(a) / 1e6).toFixed(3)} M steps/s, this build ${(med(b) / 1e6).toFixed(3)} M steps/s, ratio ${(med(b) / med(a)).toFixed(3)} (medians of 5 alternating 0.4 s runs)`);
}
