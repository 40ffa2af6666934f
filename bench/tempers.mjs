// Cost of naming tempers on every ledger row and of the temper target, side by side with the same
// route without a temper system (the peer), in one run. Also the route designer with the default
// grain-growth guard against the guard moved out of reach.
// Run: npm run build && node bench/tempers.mjs
import { designRoute, evaluateRoute, hollomon } from '../dist/core/index.js';

const steps = [
  { kind: 'roll', reductionPct: 15 }, { kind: 'roll', reductionPct: 15 }, { kind: 'roll', reductionPct: 15 },
  { kind: 'roll', reductionPct: 15 }, { kind: 'anneal' }, { kind: 'roll', reductionPct: 20 },
  { kind: 'roll', reductionPct: 20 }, { kind: 'roll', thickness: 0.9 }, { kind: 'stretch', strain: 0.02 }, { kind: 'roll', reductionPct: 5 },
];
// Callister's annealed copper (K 530 MPa, n 0.44), E 115 GPa.
const base = { name: 'cu', elasticModulus: 115000, poissonRatio: 0.3, law: hollomon({ K: 530, n: 0.44 }) };

function rate(fn, ms = 1500) {
  for (let i = 0; i < 5000; i++) fn();
  let n = 0;
  const t0 = performance.now();
  let t = t0;
  while (t - t0 < ms) { for (let i = 0; i < 1000; i++) fn(); n += 1000; t = performance.now(); }
  return n / ((t - t0) / 1000);
}

const plain = { material: base, start: { thickness: 3, width: 50 }, steps, targets: { minYield: 300 } };
const copper = { material: { ...base, temperSystem: 'copperRolled' }, start: { thickness: 3, width: 50 }, steps, targets: { minYield: 300, temper: 'H04' } };
const steel = { material: { ...base, temperSystem: 'steelStrip' }, start: { thickness: 3, width: 50 }, steps, targets: { minYield: 300, temper: 'No. 2' } };
const r0 = rate(() => evaluateRoute(plain));
const r1 = rate(() => evaluateRoute(copper));
const r2 = rate(() => evaluateRoute(steel));
console.log(`ledger, no temper system          ${(r0 / 1e3).toFixed(1)} k routes/s`);
console.log(`ledger, copperRolled + H04 target ${(r1 / 1e3).toFixed(1)} k routes/s  (${(r1 / r0).toFixed(2)}× the plain ledger)`);
console.log(`ledger, steelStrip + No. 2 target ${(r2 / 1e3).toFixed(1)} k routes/s  (${(r2 / r0).toFixed(2)}× the plain ledger)`);

const spec = (range) => ({
  material: { ...base, grainGrowthStrain: range }, process: 'draw', startSize: 5, finalSize: 5 * Math.exp(-0.55 / 2), maxPassReductionPct: 30,
  maxStrainBeforeAnneal: 1.3, window: { minYield: 530 * 0.202 ** 0.44, maxYield: 530 * 0.502 ** 0.44 }, dieHalfAngleDeg: 6, friction: 0.05, maxRoutes: 20,
});
const d0 = rate(() => designRoute(spec([0.9, 1])), 1500);
const d1 = rate(() => designRoute(spec([0.02, 0.1])), 1500);
console.log(`designRoute, guard out of reach   ${d0.toFixed(0)} designs/s`);
console.log(`designRoute, default guard        ${d1.toFixed(0)} designs/s  (${(d1 / d0).toFixed(2)}×)`);
