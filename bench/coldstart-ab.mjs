// A/B runner cold start: another build of the runner (OLD_BIN, e.g. a checkout of an earlier commit
// built with `vite build -c vite.runner.config.ts`) against this tree's bin/strainledger.js, beside
// `node -e 0`, interleaved rounds in one run; median wall and CPU time (GNU time) per case.
// Run: npm run build && node bench/coldstart-ab.mjs OLD_BIN [rounds=21]
import { spawnSync } from 'node:child_process';
const ROOT = new URL('..', import.meta.url).pathname;
const OLD = process.argv[2];
if (!OLD) { console.error('usage: node bench/coldstart-ab.mjs OLD_BIN [rounds]'); process.exit(2); }
const ROUNDS = Number(process.argv[3] ?? 21);
const DEMO = `${ROOT}examples/contact-spring-strip.json`;
const cases = [
  { name: 'node -e 0', args: ['-e', '0'] },
  { name: 'OLD_BIN run json', args: [OLD, 'run', DEMO, '--format', 'json'] },
  { name: 'this tree run json', args: [`${ROOT}bin/strainledger.js`, 'run', DEMO, '--format', 'json'] },
  { name: 'this tree run --help', args: [`${ROOT}bin/strainledger.js`, 'run', '--help'] },
];
const wall = cases.map(() => []), cpu = cases.map(() => []);
for (let r = -2; r < ROUNDS; r++) for (let i = 0; i < cases.length; i++) {
  const t0 = process.hrtime.bigint();
  const p = spawnSync('/usr/bin/time', ['-f', 'cpu %U %S', process.execPath, ...cases[i].args], { encoding: 'utf8', env: { ...process.env, CI: 'true' } });
  const ms = Number(process.hrtime.bigint() - t0) / 1e6;
  const m = /cpu ([\d.]+) ([\d.]+)\s*$/.exec(p.stderr);
  if (r >= 0) { wall[i].push(ms); if (m) cpu[i].push((+m[1] + +m[2]) * 1000); }
}
const med = (a) => { const s = [...a].sort((x, y) => x - y); return s[s.length >> 1]; };
for (let i = 0; i < cases.length; i++) console.log(`${cases[i].name.padEnd(20)} wall ${med(wall[i]).toFixed(1)} ms (${(med(wall[i]) / med(wall[0])).toFixed(2)}×)  cpu ${med(cpu[i]).toFixed(0)} ms`);
