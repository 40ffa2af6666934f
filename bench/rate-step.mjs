// The cost of the rate change's step (rateStep) on an INVENTED 100,000-sample record with a ×8 change at 1.2 % strain
// (every 8th sample kept past it, the stress there × 8^0.01), and analyzeRecord on it and on the record without it.
// Run: npm run build && node bench/rate-step.mjs
import { analyzeRecord, rateStep, synthesizeLabRecord, xoshiro128ss } from '../dist/core/index.js';
const lab = synthesizeLabRecord({ law: { law: 'swift', K: 600, eps0: 0.01, n: 0.22 }, elasticModulus: 205000, points: 100000, noise: 1.5, rng: xoshiro128ss(7) });
const at = 0.012;
const e = [], s = []; let k = 0;
for (let i = 0; i < lab.strain.length; i++) { const past = lab.strain[i] >= at; if (past && k++ % 8) continue; e.push(lab.strain[i]); s.push(past ? lab.stress[i] * 8 ** 0.01 : lab.stress[i]); }
const plain = { strain: Array.from(lab.strain), stress: Array.from(lab.stress) };
const changed = { strain: e, stress: s };
for (const [name, r] of [['plain', plain], ['changed', changed]]) {
  analyzeRecord(r, {}); // warm
  const t = []; for (let j = 0; j < 5; j++) { const t0 = performance.now(); analyzeRecord(r, {}); t.push(performance.now() - t0); }
  t.sort((a, b) => a - b);
  const a = analyzeRecord(r, {});
  console.log(name, r.strain.length, 'points: median', t[2].toFixed(0), 'ms', a.rateChange ? `step ${(a.rateChange.step / a.rateChange.stressBefore * 100).toFixed(2)} ± ${(a.rateChange.stepHalfWidth95 / a.rateChange.stressBefore * 100).toFixed(2)} %` : '');
}
{
  const a = analyzeRecord(changed, {});
  const fs = Float64Array.from(a.flowCurve.strain), fy = Float64Array.from(a.flowCurve.stress);
  const e0 = changed.strain[a.rateChange.index] - a.toeStrain, ep = Math.log1p(e0) - changed.stress[a.rateChange.index] * (1 + e0) / a.elasticModulus;
  rateStep(fs, fy, ep, a.noise);
  const t = []; for (let j = 0; j < 5; j++) { const t0 = performance.now(); rateStep(fs, fy, ep, a.noise); t.push(performance.now() - t0); }
  t.sort((x, y) => x - y);
  console.log('rateStep alone on', fs.length, 'flow points: median', t[2].toFixed(1), 'ms');
}
