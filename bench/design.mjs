// Route design benchmark (issue 7): how long `design` takes for a typical wire specification.
// Run after `npm run build`: node bench/design.mjs
// Two specifications: the invented example (examples/design-fencing-wire.yaml, 5.5 → 2.5 mm) and a
// heavier invented one (12 → 1.6 mm, tighter anneal limit, so more anneals and passes).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadDesignSpecText, runDesign } from '../dist/plan/designSpec.js';

const root = join(import.meta.dirname, '..');
const text = readFileSync(join(root, 'examples', 'design-fencing-wire.yaml'), 'utf8');
const heavy = text.replace('start: { diameter: 5.5 }', 'start: { diameter: 12 }').replace('final: { diameter: 2.5 }', 'final: { diameter: 1.6 }')
  .replace('ductilityStrain: 1.6', 'ductilityStrain: 1.2').replace('forceCapacity: 12000', 'forceCapacity: 60000');

function bench(name, src) {
  const spec = loadDesignSpecText(src, `${name}.yaml`);
  for (let i = 0; i < 3; i++) runDesign(spec); // warm-up (JIT)
  const times = [];
  let res;
  const until = performance.now() + 2000;
  while (performance.now() < until || times.length < 10) {
    const t0 = performance.now();
    res = runDesign(spec);
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  const med = times[Math.floor(times.length / 2)];
  const r1 = res.routes[0];
  console.log(`${name}: ${res.candidatesTried} candidate schedules (${res.ledgerRuns} ledger runs); best route ${r1 ? `${r1.anneals} anneal(s), ${r1.passes} passes` : 'none'}; ` +
    `median ${med.toFixed(1)} ms, fastest ${times[0].toFixed(1)} ms, slowest ${times[times.length - 1].toFixed(1)} ms over ${times.length} runs`);
  // A cold single run, as the CLI sees it (fresh spec load, first design).
  return med;
}

console.log(`node ${process.version}, ${new Date().toISOString().slice(0, 10)}`);
const a = bench('fencing-wire (5.5 → 2.5 mm)', text);
const b = bench('heavy rod (12 → 1.6 mm)', heavy);
console.log(`aim: well under 1000 ms per design; measured ${a.toFixed(1)} ms and ${b.toFixed(1)} ms (median)`);
