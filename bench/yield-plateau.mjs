// The cost of yieldPlateau (a yield plateau without a reported drop) on records it runs on: the INVENTED 1,000,000-row
// continuous record of bench/analyze.mjs (its cheap refusal) and an INVENTED 1,000,000-sample steel with a 2 % plateau
// and a drop under its noise (found). analyzeRecord once for E, toe, noise and fracture, then yieldPlateau timed 7×.
// Run: npm run build && node bench/yield-plateau.mjs
import { analyzeRecord, synthesizeLabRecord, xoshiro128ss, yieldPlateau } from '../dist/core/index.js';
import { inventedRecord } from './records-gen.mjs';

const continuous = inventedRecord(1_000_000);
const steel = synthesizeLabRecord({ law: { law: 'swift', K: 760, eps0: 0.012, n: 0.21 }, elasticModulus: 205000, points: 1_000_000, noise: 2.9, rng: xoshiro128ss(31), yieldDrop: { drop: 0.004, luedersStrain: 0.02 } });
for (const [name, r] of [['continuous', continuous], ['plateau', steel]]) {
  const a = analyzeRecord(r, { fit: false });
  const fi = a.fracture?.index ?? r.strain.length - 1;
  const t = [];
  let p = null;
  for (let j = 0; j < 7; j++) { const t0 = performance.now(); p = yieldPlateau(r.strain, r.stress, a.elasticModulus, a.toeStrain, a.elasticWindow.fromIndex, fi, a.noise); t.push(performance.now() - t0); }
  t.sort((x, y) => x - y);
  console.log(`${name}, ${r.strain.length} samples: yieldPlateau median ${t[3].toFixed(1)} ms (fastest ${t[0].toFixed(1)})`, p ? `plateau ${(p.lengthPct).toFixed(2)} % at ${p.level.toFixed(1)} MPa` : 'none');
}
