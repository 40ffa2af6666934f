// Writes the INVENTED demo reversal record examples/reversal/hinge-tab-reversal.csv (seeded, so the
// same file every time): the hinge-tab demo material driven through 0 → 3 % → −1 % → 2 % by the
// path integrator, 1 MPa of seeded noise, written as engineering values. Run: npm run build && node scripts/gen-reversal-demo.mjs
import { integratePath, hollomon, xoshiro128ss, normalSampler } from '../dist/core/index.js';
import { writeFileSync } from 'node:fs';
const m = { elasticModulus: 207000, law: hollomon({ K: 600, n: 0.21 }), modulusDecay: { Ea: 180000, xi: 25 }, kinematic: { backstresses: [{ C: 15000, gamma: 150 }] } };
const r = integratePath(m, [0.03, -0.01, 0.02], { maxIncrement: 2e-4 });
const rng = xoshiro128ss(2026);
const z = normalSampler(rng);
const lines = [
  'Record:,INVENTED demo record - not a measurement',
  'Scenario:,Invented press shop (Orchard Row) - hinge-tab strip coupon pulled to 3 %, pushed back to -1 % (anti-buckling guide) and pulled again',
  'Generated from:,Hollomon K 600 MPa n 0.21 (Callister low-carbon steel) with an INVENTED Armstrong-Frederick backstress C 15000 MPa gamma 150; E 207 GPa; chord modulus to 180 GPa (xi 25); seeded noise 1 MPa (strainledger integratePath; xoshiro128** seed 2026)',
  'Gauge length:,25,mm',
  '',
  'Time [s],Strain [%],Stress [MPa]',
];
let t = 0;
for (const p of r.points) {
  const s = p.stress + (p.strain === 0 ? 0 : z());
  const e = Math.expm1(p.strain);
  lines.push(`${t.toFixed(1)},${(e * 100).toFixed(5)},${(s / (1 + e)).toFixed(3)}`);
  t += 0.2;
}
writeFileSync(new URL('../examples/reversal/hinge-tab-reversal.csv', import.meta.url), lines.join('\n') + '\n');
console.log(`wrote ${r.points.length} points (converged: ${r.converged})`);
