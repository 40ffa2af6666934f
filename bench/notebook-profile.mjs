// Where a notebook slider's time goes: Chromium's sampling CPU profiler (DevTools protocol) over
// many moves of one slider, self time summed by package (@observablehq/plot, d3, the runtime, our
// core, our charts, the notebook kit) and by function. Companion of bench/notebook-latency.mjs
// for a slider that misses its aim.
// Run: node bench/notebook-profile.mjs reversal prestrain-range [moves=200]
import { loadavg } from 'node:os';
import { openNotebook, startNotebooks } from './browser.mjs';

const [name = 'reversal', sliderId = 'prestrain-range', movesArg = '200'] = process.argv.slice(2);
const MOVES = Number(movesArg);
const nb = await startNotebooks();
try {
  const page = await openNotebook(nb, name);
  const cdp = await page.context().newCDPSession(page);
  await cdp.send('Profiler.enable');
  await cdp.send('Profiler.setSamplingInterval', { interval: 100 });
  await cdp.send('Profiler.start');
  const wall = await page.evaluate(async ({ n, id, moves }) => {
    const nb = window.strainledger[n];
    const range = document.getElementById(id);
    const min = Number(range.min), max = Number(range.max);
    const t0 = performance.now();
    for (let i = 0; i < moves; i++) {
      range.value = String(min + ((max - min) * ((i * 37) % moves)) / moves);
      range.dispatchEvent(new Event('input', { bubbles: true }));
      await nb.idle();
      await new Promise((r) => requestAnimationFrame(() => setTimeout(r, 0)));
    }
    return performance.now() - t0;
  }, { n: name, id: sliderId, moves: MOVES });
  const { profile } = await cdp.send('Profiler.stop');
  const dt = new Map();
  for (let i = 0; i < profile.samples.length; i++) dt.set(profile.samples[i], (dt.get(profile.samples[i]) ?? 0) + (profile.timeDeltas[i] ?? 0) / 1000);
  const byPackage = new Map();
  const byFunction = new Map();
  const pkg = (url) => {
    if (!url) return '(browser: layout, style, paint, GC, idle)';
    const m = url.match(/node_modules\/(?:\.vite\/deps\/)?(@?[^/]+(?:\/[^/_.]+)?)/);
    if (m) return m[1].replace(/_/g, '/').replace(/\.js.*$/, '');
    const s = url.match(/\/(src\/[^/]+|notebooks\/[^/]+)/);
    return s ? s[1] : url.replace(/^https?:\/\/[^/]+/, '');
  };
  for (const node of profile.nodes) {
    const t = dt.get(node.id) ?? 0;
    if (!t) continue;
    const f = node.callFrame;
    const key = f.functionName === '(idle)' || f.functionName === '(program)' || f.functionName === '(garbage collector)' ? `(${f.functionName.replace(/[()]/g, '')})` : pkg(f.url);
    byPackage.set(key, (byPackage.get(key) ?? 0) + t);
    const fk = `${f.functionName || '(anonymous)'} ${pkg(f.url)}`;
    byFunction.set(fk, (byFunction.get(fk) ?? 0) + t);
  }
  const busy = [...byPackage].filter(([k]) => k !== '(idle)').reduce((a, [, v]) => a + v, 0);
  console.log(`profile: ${name} / ${sliderId}, ${MOVES} moves, wall ${wall.toFixed(0)} ms, busy ${busy.toFixed(0)} ms (${(busy / MOVES).toFixed(2)} ms per move), load average ${loadavg()[0].toFixed(1)} (2 cores), ${new Date().toISOString()}`);
  console.log('\nself time per move by package (ms):');
  for (const [k, v] of [...byPackage].filter(([k]) => k !== '(idle)').sort((a, b) => b[1] - a[1]).slice(0, 12)) console.log(`  ${(v / MOVES).toFixed(2).padStart(6)}  ${k}`);
  console.log('\nself time per move by function (ms), top 15:');
  for (const [k, v] of [...byFunction].filter(([k]) => !k.startsWith('(idle)')).sort((a, b) => b[1] - a[1]).slice(0, 15)) console.log(`  ${(v / MOVES).toFixed(2).padStart(6)}  ${k}`);
} finally {
  await nb.close();
}
